package org.winnow.sink;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/** Digests of part files and the check of a file against its {@link SealedPart} record. */
final class PartCheck {
    private PartCheck() {}

    static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            // Every Java platform must provide SHA-256 (MessageDigest's documented requirement).
            throw new IllegalStateException(e);
        }
    }

    static String hex(byte[] digest) {
        return HexFormat.of().formatHex(digest);
    }

    /**
     * Feeds the first {@code length} bytes of {@code file} into {@code digest}.
     *
     * @throws ScanDamagedException when the file is not a regular file or shorter than {@code length}
     */
    static void digestPrefix(Path file, long length, MessageDigest digest, String recordedBy) throws IOException {
        requireRegularFile(file, recordedBy);
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            long size = ch.size();
            if (size < length) {
                throw new ScanDamagedException(file + ": " + size + " bytes, shorter than the " + length + " that "
                        + recordedBy + " records");
            }
            ByteBuffer buf = ByteBuffer.allocate(1 << 16);
            long left = length;
            while (left > 0) {
                buf.clear();
                if (left < buf.capacity()) {
                    buf.limit((int) left);
                }
                int n = ch.read(buf);
                if (n < 0) {
                    throw new ScanDamagedException(file + ": ended after " + (length - left) + " of " + length
                            + " bytes while being read");
                }
                buf.flip();
                digest.update(buf);
                left -= n;
            }
        }
    }

    /**
     * Checks that {@code file} is the part {@code part} recorded: a regular file of the recorded length
     * and SHA-256. Reads the whole file.
     *
     * @param recordedBy names the record in the message, e.g. "the checkpoint"
     */
    static void verify(Path file, SealedPart part, String recordedBy) throws IOException {
        requireRegularFile(file, recordedBy);
        long size = Files.size(file);
        if (size != part.bytes()) {
            throw new ScanDamagedException(file + ": " + size + " bytes, but " + recordedBy + " records "
                    + part.bytes() + " for this sealed part; it was cut, extended or replaced");
        }
        MessageDigest d = sha256();
        digestPrefix(file, size, d, recordedBy);
        String found = hex(d.digest());
        if (!found.equals(part.sha256())) {
            throw new ScanDamagedException(file + ": content differs from the SHA-256 " + recordedBy
                    + " records for this sealed part (same length, other bytes)");
        }
    }

    private static void requireRegularFile(Path file, String recordedBy) throws ScanDamagedException {
        if (!Files.exists(file, LinkOption.NOFOLLOW_LINKS)) {
            throw new ScanDamagedException(file + ": missing, but " + recordedBy + " records it");
        }
        if (!Files.isRegularFile(file)) {
            throw new ScanDamagedException(file + ": not a regular file (a directory or other), but " + recordedBy
                    + " records it as a part");
        }
    }
}
