package org.winnow.sink;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.security.MessageDigest;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.AccessDeniedException;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryNotEmptyException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.FileSystemException;
import java.nio.file.NoSuchFileException;
import java.nio.file.NotDirectoryException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.Locale;

/** Names of the files in a scan directory, the JSON mapper, and the atomic-replace primitive. */
public final class ScanFiles {
    /** Version of the survivors, rejects, checkpoint and manifest formats. */
    public static final int FORMAT_VERSION = 2;
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
            .enable(SerializationFeature.INDENT_OUTPUT)
            .enable(DeserializationFeature.FAIL_ON_NULL_FOR_PRIMITIVES)
            .enable(DeserializationFeature.FAIL_ON_MISSING_CREATOR_PROPERTIES);

    /** The field of {@code checkpoint.json} and {@code manifest.json} that holds their own digest. */
    public static final String CHECKSUM_FIELD = "checksum";

    private static final ObjectMapper COMPACT = JSON.copy().disable(SerializationFeature.INDENT_OUTPUT);

    /** Hidden lock file that marks a directory in use by one process; see {@link DirectoryLock}. */
    public static final String LOCK = ".winnow.lock";

    private ScanFiles() {}

    /**
     * Reads a JSON file written by the sink, turning every failure into one line that names the file:
     * no such file, not a regular file, not JSON, {@code null}, a field missing or of the wrong type.
     *
     * @param what what the file should be, for the message ("checkpoint", "manifest")
     */
    static <T> T readJson(Path file, Class<T> type, String what) throws IOException {
        requireRegularFile(file, what);
        return parseJson(Files.readAllBytes(file), file, type, what);
    }

    static void requireRegularFile(Path file, String what) throws ScanDamagedException {
        if (!Files.isRegularFile(file)) {
            throw new ScanDamagedException(file + ": " + (Files.exists(file) ? "not a regular file" : "missing")
                    + ", expected the scan's " + what);
        }
    }

    /** {@link #readJson} on bytes already read; {@code file} names them in messages. */
    static <T> T parseJson(byte[] bytes, Path file, Class<T> type, String what) throws ScanDamagedException {
        T value;
        try {
            JsonNode tree = JSON.readTree(bytes);
            if (tree == null || !tree.isObject()) {
                throw new ScanDamagedException(file + ": unreadable " + what + ": not a JSON object");
            }
            ObjectNode object = (ObjectNode) tree;
            JsonNode version = object.get("formatVersion");
            if (version != null && version.isInt() && version.intValue() != FORMAT_VERSION) {
                throw new ScanDamagedException(file + ": " + what + " of scan format " + version.intValue()
                        + ", this version reads " + FORMAT_VERSION + "; scan into a fresh directory");
            }
            JsonNode recorded = object.remove(CHECKSUM_FIELD);
            if (recorded == null || !recorded.isTextual()) {
                throw new ScanDamagedException(file + ": unreadable " + what + ": no " + CHECKSUM_FIELD + " field");
            }
            if (!recorded.asText().equals(selfChecksum(object))) {
                throw new ScanDamagedException(file + ": its content differs from its own " + CHECKSUM_FIELD
                        + " (edited or damaged after it was written)");
            }
            value = JSON.treeToValue(object, type);
        } catch (JsonProcessingException e) {
            String where = e.getLocation() == null ? "" : " (line " + e.getLocation().getLineNr() + ")";
            throw new ScanDamagedException(file + ": unreadable " + what + where + ": "
                    + oneLine(e.getOriginalMessage()));
        } catch (IOException e) {
            // Reading from a byte array fails only as a parse does; kept apart for the compiler.
            throw new ScanDamagedException(file + ": unreadable " + what + ": " + describe(e));
        }
        if (value == null) {
            throw new ScanDamagedException(file + ": unreadable " + what + ": it holds null");
        }
        return value;
    }

    /**
     * {@code value} as indented JSON with a {@value #CHECKSUM_FIELD} field: the SHA-256 of the compact
     * form of every other field. A reader recomputes it, so an edit or a flipped byte that still parses
     * is refused rather than believed (counts and part records are what a rerun and a report trust).
     */
    static byte[] toSealedJson(Object value) throws IOException {
        ObjectNode tree = JSON.valueToTree(value);
        tree.remove(CHECKSUM_FIELD);
        tree.put(CHECKSUM_FIELD, selfChecksum(tree));
        return JSON.writeValueAsBytes(tree);
    }

    private static String selfChecksum(ObjectNode withoutChecksum) throws JsonProcessingException {
        MessageDigest d = PartCheck.sha256();
        return PartCheck.hex(d.digest(COMPACT.writeValueAsBytes(withoutChecksum)));
    }

    /**
     * What went wrong in one line, without repeating the path the exception names: the file-system
     * exceptions of {@code java.nio.file} carry only the path as their message, which says nothing.
     */
    public static String describe(IOException e) {
        if (e instanceof NoSuchFileException) {
            return "no such file or directory";
        }
        if (e instanceof AccessDeniedException) {
            return "permission denied";
        }
        if (e instanceof FileAlreadyExistsException) {
            return "exists already and is in the way";
        }
        if (e instanceof NotDirectoryException) {
            return "not a directory";
        }
        if (e instanceof DirectoryNotEmptyException) {
            return "directory not empty";
        }
        if (e instanceof FileSystemException f && f.getReason() != null) {
            return oneLine(f.getReason());
        }
        return oneLine(e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage());
    }

    /** The first line of {@code message}, at most 200 characters. */
    static String oneLine(String message) {
        String s = message == null ? "" : message.strip();
        int nl = s.indexOf('\n');
        if (nl >= 0) {
            s = s.substring(0, nl);
        }
        return s.length() > 200 ? s.substring(0, 200) + "..." : s;
    }

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
