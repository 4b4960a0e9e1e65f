package org.winnow.sink;

import java.io.IOException;
import java.io.Writer;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.function.IntFunction;
import java.io.BufferedWriter;
import java.io.OutputStreamWriter;

/**
 * A series of TSV files that rolls over every N data lines: {@code prefix-00001.tsv}, ... Lines go to
 * a hidden partial file; a full part is sealed (flushed, fsynced, closed) and renamed to its final
 * name only after the checkpoint that records it, see {@link #publishSealed()}.
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
    private int sealed;
    private long openLines;
    private long totalLines;
    private FileChannel channel;
    private Writer writer;

    /**
     * Opens the series at the state of a checkpoint, repairing what a crash may have left: renames
     * sealed parts still under their partial name, cuts the open part back to its recorded length, and
     * removes partial files the checkpoint does not know.
     *
     * @param header the header lines of part p, ending in a newline
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
        for (int p = 1; p <= sealed; p++) {
            Path done = dir.resolve(ScanFiles.committedName(prefix, p));
            Path partial = dir.resolve(ScanFiles.partialName(prefix, p));
            if (!Files.exists(done)) {
                if (!Files.exists(partial)) {
                    throw new IOException(dir + ": " + done.getFileName() + " is recorded as complete but missing");
                }
                ScanFiles.move(partial, done);
            }
            published.add(done.getFileName().toString());
        }
        ScanFiles.syncDirectory(dir);
        Path open = dir.resolve(ScanFiles.partialName(prefix, sealed + 1));
        if (state.openBytes() > 0) {
            if (!Files.exists(open) || Files.size(open) < state.openBytes()) {
                throw new IOException(dir + ": " + open.getFileName() + " is shorter than its checkpoint says");
            }
            channel = FileChannel.open(open, StandardOpenOption.WRITE);
            channel.truncate(state.openBytes());
            channel.position(state.openBytes());
            writer = newWriter(channel);
        } else {
            Files.deleteIfExists(open);
        }
        try (var stray = Files.list(dir)) {
            for (Path p : (Iterable<Path>) stray::iterator) {
                String name = p.getFileName().toString();
                if (name.startsWith("." + prefix + "-") && name.endsWith(".partial") && !p.equals(open)) {
                    Files.delete(p);
                }
            }
        }
    }

    private static Writer newWriter(FileChannel ch) {
        return new BufferedWriter(new OutputStreamWriter(Channels.newOutputStream(ch), StandardCharsets.UTF_8), 1 << 16);
    }

    /** Appends one data line (without its newline); seals the part when it is full. */
    void append(String line) throws IOException {
        hook.before("append");
        if (writer == null) {
            Path open = dir.resolve(ScanFiles.partialName(prefix, sealed + 1));
            channel = FileChannel.open(open, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.TRUNCATE_EXISTING);
            writer = newWriter(channel);
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
        writer = null;
        channel = null;
        sealed++;
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
        return new PartState(sealed, channel == null ? 0 : channel.size(), openLines, totalLines);
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
        }
    }
}
