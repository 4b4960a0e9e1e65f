package org.winnow.app.cluster;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * The sink's Kafka offsets, kept beside its files: one line per checkpoint, {@code nextSeq <TAB>
 * partition=offset,...}, appended and forced to disk just before the checkpoint that it belongs to is
 * committed. The checkpoint's atomic rename is the commit point of both: on restart the sink looks up the
 * line of the checkpoint's {@code nextSeq}, and lines of checkpoints that never committed are ignored. A
 * torn last line (a crash mid-append) does not parse and is ignored the same way.
 */
final class OffsetLog {
    static final String FILE = "kafka-offsets.tsv";

    private final Path file;

    OffsetLog(Path dir) {
        this.file = dir.resolve(FILE);
    }

    /** Appends the offsets that go with a checkpoint at {@code nextSeq}, durably. */
    void append(long nextSeq, Map<Integer, Long> offsets) throws IOException {
        StringBuilder sb = new StringBuilder().append(nextSeq).append('\t');
        String sep = "";
        for (var e : new TreeMap<>(offsets).entrySet()) {
            sb.append(sep).append(e.getKey()).append('=').append(e.getValue());
            sep = ",";
        }
        sb.append('\n');
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                StandardOpenOption.APPEND)) {
            ch.write(ByteBuffer.wrap(sb.toString().getBytes(StandardCharsets.UTF_8)));
            ch.force(true);
        }
    }

    /**
     * The offsets committed with the checkpoint at {@code nextSeq} (an empty map: from the beginning), or
     * null when no line is for it.
     */
    Map<Integer, Long> lookup(long nextSeq) throws IOException {
        if (!Files.exists(file)) {
            return null;
        }
        Map<Integer, Long> found = null;
        String text = Files.readString(file, StandardCharsets.UTF_8);
        // Only lines ended by a newline were appended whole.
        List<String> lines = List.of(text.substring(0, text.lastIndexOf('\n') + 1).split("\n"));
        for (String line : lines) {
            Map<Integer, Long> parsed = parse(line, nextSeq);
            if (parsed != null) {
                found = parsed;
            }
        }
        return found;
    }

    private static Map<Integer, Long> parse(String line, long nextSeq) {
        int tab = line.indexOf('\t');
        if (tab < 0) {
            return null;
        }
        try {
            if (Long.parseLong(line.substring(0, tab)) != nextSeq) {
                return null;
            }
            Map<Integer, Long> offsets = new TreeMap<>();
            String rest = line.substring(tab + 1);
            if (!rest.isEmpty()) {
                for (String part : rest.split(",")) {
                    int eq = part.indexOf('=');
                    offsets.put(Integer.parseInt(part.substring(0, eq)), Long.parseLong(part.substring(eq + 1)));
                }
            }
            return offsets;
        } catch (RuntimeException e) {
            return null;
        }
    }
}
