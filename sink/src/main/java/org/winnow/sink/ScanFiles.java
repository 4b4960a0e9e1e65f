package org.winnow.sink;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.Locale;

/** Names of the files in a scan directory, the JSON mapper, and the atomic-replace primitive. */
public final class ScanFiles {
    /** Version of the survivors, rejects, checkpoint and manifest formats. */
    public static final int FORMAT_VERSION = 1;
    /** The manifest's file name. */
    public static final String MANIFEST = "manifest.json";
    /** The checkpoint's file name. */
    public static final String CHECKPOINT = "checkpoint.json";
    /** Prefix of survivor files: {@code survivors-00001.tsv}. */
    public static final String SURVIVORS = "survivors";
    /** Prefix of reject files: {@code rejects-00001.tsv}. */
    public static final String REJECTS = "rejects";

    static final ObjectMapper JSON = new ObjectMapper().findAndRegisterModules()
            .disable(SerializationFeature.WRITE_DATES_AS_TIMESTAMPS)
            .enable(SerializationFeature.INDENT_OUTPUT);

    private ScanFiles() {}

    /** The final name of part {@code part} of a series. */
    public static String committedName(String prefix, int part) {
        return String.format(Locale.ROOT, "%s-%05d.tsv", prefix, part);
    }

    /** The hidden name of a part being written; never matches a committed name. */
    static String partialName(String prefix, int part) {
        return "." + committedName(prefix, part) + ".partial";
    }

    /** Writes {@code bytes} to {@code target} so that a reader sees either the old or the new file, whole. */
    static void replaceAtomically(Path target, byte[] bytes) throws IOException {
        Path tmp = target.resolveSibling("." + target.getFileName() + ".tmp");
        try (FileChannel ch = FileChannel.open(tmp, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                StandardOpenOption.TRUNCATE_EXISTING)) {
            java.nio.ByteBuffer buf = java.nio.ByteBuffer.wrap(bytes);
            while (buf.hasRemaining()) {
                ch.write(buf);
            }
            ch.force(true);
        }
        move(tmp, target);
        syncDirectory(target.getParent());
    }

    /** Renames atomically (falling back to a plain replace only where the file system cannot). */
    static void move(Path from, Path to) throws IOException {
        try {
            Files.move(from, to, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(from, to, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    /** Makes renames in {@code dir} durable; a no-op where the platform cannot open directories. */
    static void syncDirectory(Path dir) {
        try (FileChannel ch = FileChannel.open(dir, StandardOpenOption.READ)) {
            ch.force(true);
        } catch (IOException | UnsupportedOperationException e) {
            // Some platforms refuse to open a directory; the rename is then as durable as they make it.
        }
    }
}
