package org.winnow.pipeline.kafka;

import org.winnow.geometry.Configuration;

/**
 * The wire ids of every class that crosses a topic. An id, once shipped, is never reused for another
 * class: a reader of an older run must either decode a record correctly or refuse it.
 */
public final class WireTypes {
    public static final int INT_ARRAY = 100;
    public static final int INT_MATRIX = 101;
    public static final int DOUBLE_ARRAY = 102;
    public static final int LONG_ARRAY = 103;
    public static final int STRING_ARRAY = 104;
    public static final int CONFIGURATION = 110;

    private WireTypes() {
    }

    /** A builder holding the shared base types; stage records are registered on top. */
    public static KryoCodec.Builder base() {
        return KryoCodec.builder()
                .register(int[].class, INT_ARRAY)
                .register(int[][].class, INT_MATRIX)
                .register(double[].class, DOUBLE_ARRAY)
                .register(long[].class, LONG_ARRAY)
                .register(String[].class, STRING_ARRAY)
                .register(Configuration.class, CONFIGURATION, ConfigurationSerializer::new);
    }
}
