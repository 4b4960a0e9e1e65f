package org.winnow.scorer.model;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.KryoException;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.serializers.DefaultArraySerializers;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.Arrays;
import java.util.HexFormat;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.reference.ReferenceSet;

/**
 * The {@code .wnm} container: {@link #MAGIC} (8 bytes), the format version (4 bytes, big-endian), the
 * payload length (8 bytes), the SHA-256 of the payload (32 bytes), then the payload, which is Kryo with
 * registration required and explicit class IDs, so a reader never instantiates a class it did not
 * list. Every check that fails names the file and one reason.
 */
final class ModelFile {
    static final byte[] MAGIC = "WNMODEL\u0000".getBytes(StandardCharsets.US_ASCII);
    /**
     * 4 since the anchor is the Hodge tuple with the basis of every value ({@link org.winnow.scorer.network.Anchor}): a version-3
     * file's reference embeddings and corrections were made with the h11-only anchor, so such a file is
     * refused with the command that retrains it, rather than read with votes that no longer mean what
     * they meant.
     */
    static final int VERSION = 4;
    static final int HEADER = MAGIC.length + 4 + 8 + 32;

    private ModelFile() {}

    /** The record that is written as the payload. */
    record Payload(Architecture architecture, double[] parameters, Normalisation normalisation,
            ReferenceSet reference, Calibration calibration, TrainingMetadata metadata) {}

    static Kryo kryo() {
        Kryo kryo = new Kryo();
        kryo.setRegistrationRequired(true);
        kryo.setReferences(false);
        // Array lengths are checked against the bytes left before anything is allocated: a damaged or
        // hostile length must be refused as such, not become a multi-gigabyte allocation. One byte an
        // element is a floor every element form meets, so an array is never larger than 8x the payload.
        kryo.register(int[].class, new BoundedArray<>(new DefaultArraySerializers.IntArraySerializer(), 1), 100);
        kryo.register(int[][].class, new BoundedArray<>(new DefaultArraySerializers.ObjectArraySerializer(kryo,
                int[][].class), 1), 101);
        kryo.register(double[].class, new BoundedArray<>(new DefaultArraySerializers.DoubleArraySerializer(), 1), 102);
        kryo.register(double[][].class, new BoundedArray<>(new DefaultArraySerializers.ObjectArraySerializer(kryo,
                double[][].class), 1), 103);
        kryo.register(long[].class, new BoundedArray<>(new DefaultArraySerializers.LongArraySerializer(), 1), 104);
        kryo.register(String[].class, new BoundedArray<>(new DefaultArraySerializers.StringArraySerializer(), 1), 105);
        kryo.register(Payload.class, 110);
        kryo.register(Architecture.class, 111);
        kryo.register(Normalisation.class, 112);
        kryo.register(ReferenceSet.class, 113);
        kryo.register(Calibration.class, 114);
        kryo.register(TrainingMetadata.class, 115);
        return kryo;
    }

    /** Delegates, after checking that the array's declared length can fit in the bytes that are left. */
    private static final class BoundedArray<T> extends Serializer<T> {
        private final Serializer<T> inner;
        private final int minBytesEach;

        BoundedArray(Serializer<T> inner, int minBytesEach) {
            this.inner = inner;
            this.minBytesEach = minBytesEach;
            // The array serializers write null themselves (as length 0); so must this one, or Kryo would
            // add a null marker of its own and the bytes would differ from the format.
            setAcceptsNull(inner.getAcceptsNull());
        }

        @Override
        public void write(Kryo kryo, Output output, T object) {
            inner.write(kryo, output, object);
        }

        @Override
        public T read(Kryo kryo, Input input, Class<? extends T> type) {
            int start = input.position();
            int length = input.readVarInt(true);
            if (length > 0) {
                long left = input.limit() - input.position();
                if ((long) (length - 1) * minBytesEach > left) {
                    throw new KryoException("an array declares " + (length - 1) + " elements but only " + left
                            + " payload bytes are left");
                }
            }
            input.setPosition(start);
            return inner.read(kryo, input, type);
        }
    }

    static byte[] payloadBytes(Payload payload) {
        Output out = new Output(1 << 16, -1);
        kryo().writeObject(out, payload);
        return out.toBytes();
    }

    static byte[] sha256(byte[] bytes) {
        try {
            return MessageDigest.getInstance("SHA-256").digest(bytes);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }

    static String hex(byte[] bytes) {
        return HexFormat.of().formatHex(bytes);
    }

    /** Writes atomically: a temporary file beside the target, then a rename. */
    static void write(Path path, byte[] payload) throws IOException {
        ByteBuffer buf = ByteBuffer.allocate(HEADER + payload.length);
        buf.put(MAGIC).putInt(VERSION).putLong(payload.length).put(sha256(payload)).put(payload);
        Path dir = path.toAbsolutePath().getParent();
        Path tmp = Files.createTempFile(dir, path.getFileName().toString(), ".tmp");
        try {
            Files.write(tmp, buf.array());
            Files.move(tmp, path, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }

    static Payload read(Path path) throws IOException {
        if (Files.exists(path) && !Files.isRegularFile(path)) {
            // A device such as /dev/zero would be read until the heap is full, a directory fails obscurely.
            throw new ModelFileException(path + ": not a regular file (a directory, a pipe or a device); give a "
                    + ".wnm file written by winnow train");
        }
        byte[] all;
        try {
            all = Files.readAllBytes(path);
        } catch (IOException e) {
            throw new ModelFileException(path + ": cannot read the model file (" + e.getMessage() + ")");
        }
        int prefix = Math.min(all.length, MAGIC.length);
        if (!Arrays.equals(all, 0, prefix, MAGIC, 0, prefix)) {
            throw new ModelFileException(path + ": not a winnow model file (wrong magic header)");
        }
        if (all.length < HEADER) {
            throw new ModelFileException(path + ": truncated model file (" + all.length
                    + " bytes, shorter than the " + HEADER + "-byte header)");
        }
        ByteBuffer buf = ByteBuffer.wrap(all);
        buf.position(MAGIC.length);
        int version = buf.getInt();
        if (version == 3) {
            throw new ModelFileException(path + ": model format version 3 predates the tuple anchor (this build reads "
                    + "version " + VERSION + "); retrain it with 'winnow train --reference LABELLED.tsv --out MODEL.wnm'");
        }
        if (version != VERSION) {
            throw new ModelFileException(path + ": unsupported model format version " + version
                    + " (this build reads version " + VERSION + ")");
        }
        long length = buf.getLong();
        long actual = all.length - HEADER;
        if (length != actual) {
            throw new ModelFileException(path + (length > actual ? ": truncated model file" : ": padded model file")
                    + " (header declares " + length + " payload bytes, file holds " + actual + ")");
        }
        byte[] expected = new byte[32];
        buf.get(expected);
        byte[] payload = Arrays.copyOfRange(all, HEADER, all.length);
        if (!MessageDigest.isEqual(expected, sha256(payload))) {
            throw new ModelFileException(path + ": checksum mismatch (the payload is corrupt: SHA-256 is "
                    + hex(sha256(payload)) + ", header says " + hex(expected) + ")");
        }
        try (Input in = new Input(payload)) {
            Payload p = kryo().readObject(in, Payload.class);
            if (in.position() != payload.length) {
                throw new ModelFileException(path + ": payload has " + (payload.length - in.position())
                        + " trailing bytes");
            }
            return p;
        } catch (RuntimeException e) {
            throw new ModelFileException(path + ": payload does not decode (" + e.getClass().getSimpleName() + ": "
                    + firstLine(e.getMessage()) + ")");
        } catch (OutOfMemoryError e) {
            // A string whose declared length no payload of this size can hold; the failed allocation
            // was the only large one, so the heap is usable again.
            throw new ModelFileException(path + ": payload does not decode (a declared length is far larger "
                    + "than the " + payload.length + "-byte payload)");
        }
    }

    private static String firstLine(String s) {
        if (s == null) {
            return "no detail";
        }
        int nl = s.indexOf('\n');
        return nl < 0 ? s : s.substring(0, nl);
    }
}
