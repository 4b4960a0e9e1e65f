package org.winnow.kafkatestkit;

import java.lang.annotation.Documented;
import java.lang.annotation.ElementType;
import java.lang.annotation.Inherited;
import java.lang.annotation.Retention;
import java.lang.annotation.RetentionPolicy;
import java.lang.annotation.Target;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.extension.ExtendWith;

/**
 * Gives the annotated test class one real in-process broker, started before its first test and stopped
 * after its last. Tests receive it as an {@link EmbeddedKafkaBroker} parameter (constructor, lifecycle or
 * test method). The class is tagged {@code integration}.
 */
@Documented
@Inherited
@Retention(RetentionPolicy.RUNTIME)
@Target(ElementType.TYPE)
@Tag("integration")
@ExtendWith(KafkaBrokerExtension.class)
public @interface KafkaBroker {
}
