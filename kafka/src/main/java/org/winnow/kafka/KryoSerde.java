package org.winnow.kafka;

import java.util.Objects;
import org.apache.kafka.common.serialization.Deserializer;
import org.apache.kafka.common.serialization.Serde;
import org.apache.kafka.common.serialization.Serializer;

/** A Kafka serde for one registered record type, backed by a shared {@link KryoCodec}. */
public final class KryoSerde<T> implements Serde<T>, Serializer<T>, Deserializer<T> {
    private final KryoCodec codec;
    private final Class<T> type;

    private KryoSerde(KryoCodec codec, Class<T> type) {
        this.codec = Objects.requireNonNull(codec, "codec");
        this.type = Objects.requireNonNull(type, "type");
    }

    public static <T> KryoSerde<T> of(KryoCodec codec, Class<T> type) {
        return new KryoSerde<>(codec, type);
    }

    @Override
    public byte[] serialize(String topic, T value) {
        return value == null ? null : codec.encode(value);
    }

    @Override
    public T deserialize(String topic, byte[] data) {
        if (data == null) {
            return null;
        }
        try {
            return codec.decode(data, type);
        } catch (WireFormatException e) {
            throw new WireFormatException("topic " + topic + ": " + e.getMessage(), e);
        }
    }

    @Override
    public Serializer<T> serializer() {
        return this;
    }

    @Override
    public Deserializer<T> deserializer() {
        return this;
    }

    @Override
    public void configure(java.util.Map<String, ?> configs, boolean isKey) {
        // Everything is fixed by the codec; Kafka's configuration has nothing to add.
    }

    @Override
    public void close() {
        // The codec is shared and holds nothing to release.
    }
}
