package org.winnow.kafka;

import static org.winnow.geometry.Checks.requireArgument;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.KryoException;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import com.esotericsoftware.kryo.util.Pool;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.function.Supplier;

/**
 * Encodes and decodes wire records with Kryo, registration required and every class under an explicit
 * id, so a writer and a reader built from the same registrations agree byte for byte and an unknown class
 * is refused rather than written by name.
 *
 * <p>Kryo instances are not thread-safe; each call borrows one from a pool and returns it, so one codec
 * serves every thread of a process.
 */
public final class KryoCodec {
    /** The first id free for our classes; Kryo's defaults (primitives, String, ...) sit below it. */
    public static final int FIRST_ID = 100;

    private final List<Registration> registrations;
    private final Pool<Kryo> kryos;
    private final Pool<Output> outputs;

    private KryoCodec(List<Registration> registrations) {
        this.registrations = List.copyOf(registrations);
        this.kryos = new Pool<>(true, false, 64) {
            @Override
            protected Kryo create() {
                return newKryo();
            }
        };
        this.outputs = new Pool<>(true, false, 64) {
            @Override
            protected Output create() {
                return new Output(256, -1);
            }
        };
    }

    /** A builder with no registrations. */
    public static Builder builder() {
        return new Builder();
    }

    /** Encodes {@code value} (of a registered class) without a class tag: the reader names the class. */
    public byte[] encode(Object value) {
        Objects.requireNonNull(value, "value");
        Kryo kryo = kryos.obtain();
        Output out = outputs.obtain();
        try {
            out.reset();
            kryo.writeObject(out, value);
            return out.toBytes();
        } finally {
            outputs.free(out);
            kryos.free(kryo);
        }
    }

    /**
     * Decodes bytes written by {@link #encode} for {@code type}. Bytes that do not decode to exactly one
     * {@code type} (truncated, trailing data, unknown class id) are refused with a {@link WireFormatException}.
     */
    public <T> T decode(byte[] bytes, Class<T> type) {
        Objects.requireNonNull(bytes, "bytes");
        Kryo kryo = kryos.obtain();
        try {
            Input in = new Input(bytes);
            T value = kryo.readObject(in, type);
            if (in.position() != bytes.length) {
                throw new WireFormatException("a " + type.getSimpleName() + " took " + in.position() + " of "
                        + bytes.length + " bytes: not one record of this type");
            }
            return value;
        } catch (KryoException | IllegalArgumentException | IndexOutOfBoundsException e) {
            throw new WireFormatException("cannot decode a " + type.getSimpleName() + " from " + bytes.length
                    + " bytes: " + firstLine(e.getMessage()), e);
        } finally {
            kryos.free(kryo);
        }
    }

    /** The registrations, in id order of their declaration. */
    public List<Registration> registrations() {
        return registrations;
    }

    private Kryo newKryo() {
        Kryo kryo = new Kryo();
        kryo.setRegistrationRequired(true);
        kryo.setReferences(false);
        for (Registration r : registrations) {
            if (r.serializer() == null) {
                kryo.register(r.type(), r.id());
            } else {
                kryo.register(r.type(), r.serializer().get(), r.id());
            }
        }
        return kryo;
    }

    private static String firstLine(String message) {
        if (message == null) {
            return "malformed data";
        }
        int nl = message.indexOf('\n');
        return nl < 0 ? message : message.substring(0, nl);
    }

    /** One class on the wire under a fixed id, with its serializer or Kryo's default for its kind. */
    public record Registration(Class<?> type, int id, Supplier<? extends Serializer<?>> serializer) {
        public Registration {
            Objects.requireNonNull(type, "type");
            requireArgument(id >= FIRST_ID, "wire ids start at %s: %s for %s", FIRST_ID, id, type.getName());
        }
    }

    /** Collects registrations; ids and classes must each be unique. */
    public static final class Builder {
        private final List<Registration> registrations = new ArrayList<>();
        private final Map<Integer, Class<?>> byId = new HashMap<>();
        private final Set<Class<?>> types = new HashSet<>();

        private Builder() {
        }

        /** Registers {@code type} under {@code id} with Kryo's default serializer (records, arrays, enums). */
        public Builder register(Class<?> type, int id) {
            return add(new Registration(type, id, null));
        }

        /** Registers {@code type} under {@code id} with its own serializer, made fresh for each Kryo. */
        public <T> Builder register(Class<T> type, int id, Supplier<? extends Serializer<T>> serializer) {
            Objects.requireNonNull(serializer, "serializer");
            return add(new Registration(type, id, serializer));
        }

        public KryoCodec build() {
            return new KryoCodec(registrations);
        }

        private Builder add(Registration r) {
            Class<?> clash = byId.putIfAbsent(r.id(), r.type());
            requireArgument(clash == null, "wire id %s is taken by %s, cannot also name %s",
                    r.id(), clash == null ? "" : clash.getName(), r.type().getName());
            requireArgument(types.add(r.type()), "class %s is registered twice", r.type().getName());
            registrations.add(r);
            return this;
        }
    }
}
