package org.winnow.sink;

import java.io.BufferedWriter;
import java.io.FilterOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntFunction;

/**
 * A series of TSV files that rolls over every N data lines: {@code prefix-00001.tsv}, ... Lines go to
 * a hidden partial file; a full part is sealed (flushed, fsynced, closed) and renamed to its final
 * name only after the checkpoint that records it, see {@link #publishSealed()}.
 *
 * <p>Every byte written passes through a SHA-256 digest, so a sealed part's record (length, lines,
 * digest) and the open part's prefix digest cost no second read. A rerun checks each sealed part and
 * the open part's prefix against the checkpoint before it continues: a part cut, edited or replaced
 * since is refused rather than counted.
 *
 * <p>Single-threaded (the sink thread).
 */
final class PartSeries implements AutoCloseable {
    private final Path dir;
    private final String prefix;
    private final int linesPerFile;
    private final IntFunction<String> header;
    private final CrashHook hook;
    private final List<Integer> toPublish = new ArrayList<>();
    private final List<String> published = new ArrayList<>();
    private final List<SealedPart> parts = new ArrayList<>();
    private int sealed;
    private long openLines;
    private long totalLines;
    private FileChannel channel;
    private DigestingStream digesting;
    private Writer writer;

    /**
     * Opens the series at the state of a checkpoint, repairing what a crash may have left: renames
     * sealed parts still under their partial name, cuts the open part back to its recorded length, and
     * removes partial files the checkpoint does not know. Checks every sealed part and the open part's
     * recorded prefix against their digests first.
     *
     * @param header the header lines of part p, ending in a newline
     * @throws ScanDamagedException when a file differs from its record
     */
    PartSeries(Path dir, String prefix, int linesPerFile, IntFunction<String> header, PartState state, CrashHook hook)
            throws IOException {
        this.dir = dir;
        this.prefix = prefix;
        this.linesPerFile = linesPerFile;
        this.header = header;
        this.hook = hook;
        this.sealed = state.sealed();
        this.openLines = state.openLines();
        this.totalLines = state.totalLines();
        this.parts.addAll(state.parts());
        for (int p = 1; p <= sealed; p++) {
            SealedPart record = parts.get(p - 1);
            Path done = dir.resolve(ScanFiles.committedName(prefix, p));
            Path partial = dir.resolve(ScanFiles.partialName(prefix, p));
            if (!Files.exists(done, LinkOption.NOFOLLOW_LINKS) && Files.exists(partial, LinkOption.NOFOLLOW_LINKS)) {
                PartCheck.verify(partial, record, "the checkpoint");
                ScanFiles.move(partial, done);
            } else {
                PartCheck.verify(done, record, "the checkpoint");
            }
            published.add(done.getFileName().toString());
        }
        ScanFiles.syncDirectory(dir);
        Path open = dir.resolve(ScanFiles.partialName(prefix, sealed + 1));
        if (state.openBytes() > 0) {
            MessageDigest d = PartCheck.sha256();
            PartCheck.digestPrefix(open, state.openBytes(), d, "the checkpoint");
            if (!PartCheck.hex(((MessageDigest) cloneDigest(d)).digest()).equals(state.openSha256())) {
                throw new ScanDamagedException(open + ": its first " + state.openBytes()
                        + " bytes differ from the SHA-256 the checkpoint records for the open part");
            }
            channel = FileChannel.open(open, StandardOpenOption.WRITE);
            channel.truncate(state.openBytes());
            channel.position(state.openBytes());
            openWriter(d, state.openBytes());
        } else {
            Files.deleteIfExists(open);
        }
        try (var stray = Files.list(dir)) {
            for (Path p : (Iterable<Path>) stray::iterator) {
                String name = p.getFileName().toString();
                if (name.startsWith("." + prefix + "-") && name.endsWith(".partial") && !p.equals(open)
                        && Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS)) {
                    Files.delete(p);
                }
            }
        }
    }

    private void openWriter(MessageDigest digest, long bytes) {
        digesting = new DigestingStream(Channels.newOutputStream(channel), digest, bytes);
        writer = new BufferedWriter(new OutputStreamWriter(digesting, StandardCharsets.UTF_8), 1 << 16);
    }

    /** Appends one data line (without its newline); seals the part when it is full. */
    void append(String line) throws IOException {
        hook.before("append");
        if (writer == null) {
            Path open = dir.resolve(ScanFiles.partialName(prefix, sealed + 1));
            channel = FileChannel.open(open, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.TRUNCATE_EXISTING);
            openWriter(PartCheck.sha256(), 0);
            writer.write(header.apply(sealed + 1));
        }
        writer.write(line);
        writer.write('\n');
        openLines++;
        totalLines++;
        if (openLines >= linesPerFile) {
            seal();
        }
    }

    /** Seals the open part, if it has lines, whatever its length; used at the end of a scan. */
    void sealOpen() throws IOException {
        if (writer != null && openLines > 0) {
            seal();
        }
    }

    private void seal() throws IOException {
        hook.before("seal");
        writer.flush();
        channel.force(true);
        writer.close();
        sealed++;
        parts.add(new SealedPart(ScanFiles.committedName(prefix, sealed), digesting.bytes, openLines,
                PartCheck.hex(digesting.digest.digest())));
        writer = null;
        channel = null;
        digesting = null;
        openLines = 0;
        toPublish.add(sealed);
    }

    /** Makes the open part's content durable; call before writing a checkpoint. */
    void sync() throws IOException {
        if (writer != null) {
            hook.before("sync");
            writer.flush();
            channel.force(false);
        }
    }

    /** True iff a sealed part waits for its rename. */
    boolean hasSealed() {
        return !toPublish.isEmpty();
    }

    /** The state to record; call after {@link #sync()}. */
    PartState state() throws IOException {
        if (channel == null) {
            return new PartState(sealed, 0, openLines, totalLines, "", List.copyOf(parts));
        }
        String prefixDigest = PartCheck.hex(((MessageDigest) cloneDigest(digesting.digest)).digest());
        return new PartState(sealed, channel.size(), openLines, totalLines, prefixDigest, List.copyOf(parts));
    }

    private static Object cloneDigest(MessageDigest d) {
        try {
            return d.clone();
        } catch (CloneNotSupportedException e) {
            // The JDK's SHA-256 is cloneable; a provider that is not would be a build problem, not input.
            throw new IllegalStateException("SHA-256 digest cannot be cloned", e);
        }
    }

    /** Renames sealed parts to their final names; call after the checkpoint that records them. */
    void publishSealed() throws IOException {
        if (toPublish.isEmpty()) {
            return;
        }
        for (int p : toPublish) {
            hook.before("rename");
            Path done = dir.resolve(ScanFiles.committedName(prefix, p));
            ScanFiles.move(dir.resolve(ScanFiles.partialName(prefix, p)), done);
            published.add(done.getFileName().toString());
        }
        toPublish.clear();
        ScanFiles.syncDirectory(dir);
    }

    /** Names of the parts under their final names, in order. */
    List<String> published() {
        return List.copyOf(published);
    }

    /** Records of the parts under their final names, in order. */
    List<SealedPart> publishedParts() {
        return List.copyOf(parts.subList(0, published.size()));
    }

    long totalLines() {
        return totalLines;
    }

    /** Closes the open partial without sealing it. */
    @Override
    public void close() throws IOException {
        if (writer != null) {
            writer.close();
            writer = null;
            channel = null;
            digesting = null;
        }
    }

    /** Passes bytes on and through a digest, counting them. */
    private static final class DigestingStream extends FilterOutputStream {
        final MessageDigest digest;
        long bytes;

        DigestingStream(OutputStream out, MessageDigest digest, long bytes) {
            super(out);
            this.digest = digest;
            this.bytes = bytes;
        }

        @Override
        public void write(int b) throws IOException {
            out.write(b);
            digest.update((byte) b);
            bytes++;
        }

        @Override
        public void write(byte[] b, int off, int len) throws IOException {
            out.write(b, off, len);
            digest.update(b, off, len);
            bytes += len;
        }
    }
}
