package org.winnow.kafkatestkit;

import org.junit.jupiter.api.extension.BeforeAllCallback;
import org.junit.jupiter.api.extension.ExtensionContext;
import org.junit.jupiter.api.extension.ParameterContext;
import org.junit.jupiter.api.extension.ParameterResolver;

/**
 * Starts one {@link EmbeddedKafkaBroker} per test class and closes it when the class's extension store
 * closes, which JUnit does after the class's last test even when a test failed.
 */
public final class KafkaBrokerExtension implements BeforeAllCallback, ParameterResolver {
    private static final ExtensionContext.Namespace NAMESPACE =
            ExtensionContext.Namespace.create(KafkaBrokerExtension.class);

    @Override
    public void beforeAll(ExtensionContext context) {
        broker(context);
    }

    @Override
    public boolean supportsParameter(ParameterContext parameter, ExtensionContext context) {
        return parameter.getParameter().getType() == EmbeddedKafkaBroker.class;
    }

    @Override
    public Object resolveParameter(ParameterContext parameter, ExtensionContext context) {
        return broker(context);
    }

    private static EmbeddedKafkaBroker broker(ExtensionContext context) {
        ExtensionContext classContext = classContext(context);
        return classContext.getStore(NAMESPACE)
                .getOrComputeIfAbsent("broker", key -> new Holder(EmbeddedKafkaBroker.start()), Holder.class)
                .broker();
    }

    /** The outermost class context, so that nested test classes share their enclosing class's broker. */
    private static ExtensionContext classContext(ExtensionContext context) {
        ExtensionContext c = context;
        while (c.getParent().flatMap(ExtensionContext::getTestClass).isPresent()) {
            c = c.getParent().orElseThrow();
        }
        return c;
    }

    /**
     * Closed by JUnit when the store of the class context closes. CloseableResource is deprecated in
     * favour of AutoCloseable alone; it stays until every JUnit this kit meets closes AutoCloseable values.
     */
    @SuppressWarnings("deprecation")
    private record Holder(EmbeddedKafkaBroker broker) implements ExtensionContext.Store.CloseableResource, AutoCloseable {
        @Override
        public void close() {
            broker.close();
        }
    }
}
