package org.winnow.kafka;

import java.util.Map;
import java.util.Objects;
import org.apache.kafka.common.header.Header;
import org.apache.kafka.common.header.Headers;
import org.apache.kafka.common.serialization.Deserializer;
import org.apache.kafka.common.serialization.Serializer;
import org.winnow.pipeline.Scored;

/**
 * The values of a scored topic: a whole {@link Scored} record, or a {@link SlimReject}. Neither form is
 * tagged in its bytes (a whole record's bytes are those of every run before slim rejects existed); a slim
 * reject carries the header {@value #KIND} = {@code r} instead, set here when it is serialized.
 * Anything else is refused both ways.
 */
public final class ScoredTopicSerde implements Serializer<Object>, Deserializer<Object> {
    /** The header that marks a record's value as a slim reject. */
    public static final String KIND = "wk";
    private static final byte[] SLIM = {'r'};

    private final KryoCodec codec;

    private ScoredTopicSerde(KryoCodec codec) {
        this.codec = Objects.requireNonNull(codec, "codec");
    }

    /** A serde over {@code codec}, which must hold the stage records ({@link WireTypes#stages()}). */
    public static ScoredTopicSerde of(KryoCodec codec) {
        return new ScoredTopicSerde(codec);
    }

    /** The seq of a value this serde decoded. */
    public static long seq(Object value) {
        if (value instanceof Scored s) {
            return s.seq();
        }
        if (value instanceof SlimReject r) {
            return r.seq();
        }
        throw new IllegalArgumentException("not a scored topic value: " + value.getClass().getName());
    }

    @Override
    public byte[] serialize(String topic, Headers headers, Object value) {
        if (value == null) {
            return null;
        }
        if (value instanceof SlimReject) {
            headers.remove(KIND);
            headers.add(KIND, SLIM);
        } else if (!(value instanceof Scored)) {
            throw new IllegalArgumentException("topic " + topic + " carries scored records and slim rejects, not "
                    + value.getClass().getName());
        }
        return codec.encode(value);
    }

    @Override
    public byte[] serialize(String topic, Object value) {
        throw new UnsupportedOperationException("a scored topic value needs its record's headers");
    }

    @Override
    public Object deserialize(String topic, Headers headers, byte[] data) {
        if (data == null) {
            return null;
        }
        Header kind = headers.lastHeader(KIND);
        Class<?> type = Scored.class;
        if (kind != null) {
            if (!java.util.Arrays.equals(kind.value(), SLIM)) {
                throw new WireFormatException("topic " + topic + ": unknown record kind in header " + KIND);
            }
            type = SlimReject.class;
        }
        try {
            return codec.decode(data, type);
        } catch (WireFormatException e) {
            throw new WireFormatException("topic " + topic + ": " + e.getMessage(), e);
        }
    }

    @Override
    public Object deserialize(String topic, byte[] data) {
        throw new UnsupportedOperationException("a scored topic value needs its record's headers");
    }

    @Override
    public void configure(Map<String, ?> configs, boolean isKey) {
        // Everything is fixed by the codec.
    }

    @Override
    public void close() {
        // The codec is shared and holds nothing to release.
    }
}
