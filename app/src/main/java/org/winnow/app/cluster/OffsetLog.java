package org.winnow.app.cluster;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.Map;
import java.util.TreeMap;
import java.util.zip.CRC32;
import org.winnow.app.cli.Limits;
import org.winnow.kafka.ClusterRefusedException;

/**
 * The sink's Kafka offsets, kept beside its files: one line per checkpoint, {@code nextSeq <TAB>
 * partition=offset,... <TAB> crc}, appended and forced to disk just before the checkpoint that it belongs to is
 * committed. The checkpoint's atomic rename is the commit point of both: on restart the sink looks up the
 * line of the checkpoint's {@code nextSeq}, and lines of checkpoints that never committed are ignored. A
 * torn last line (a crash mid-append, so no newline) is ignored the same way.
 *
 * <p>Every whole line was forced to disk whole, so a whole line that does not parse or whose CRC-32 (of
 * the text before its last tab, eight hex digits) does not match is damage, and is refused naming the file
 * and line. Without the CRC a flipped digit in an offset would be believed: an offset moved back only
 * re-reads records the checkpoint drops, but one moved forward skips records, and the sink would wait for
 * them forever.
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
        sb.append('\t').append(crc(sb.substring(0, sb.length() - 1))).append('\n');
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                StandardOpenOption.APPEND)) {
            ch.write(ByteBuffer.wrap(sb.toString().getBytes(StandardCharsets.UTF_8)));
            ch.force(true);
        }
    }

    /**
     * The offsets committed with the checkpoint at {@code nextSeq} (an empty map: from the beginning), or
     * null when no line is for it.
     *
     * @throws ClusterRefusedException naming the file and line when a whole line is damaged
     */
    Map<Integer, Long> lookup(long nextSeq) throws IOException {
        if (!Files.exists(file)) {
            return null;
        }
        if (!Files.isRegularFile(file)) {
            throw new ClusterRefusedException(file + ": not a regular file, expected the sink's Kafka offsets");
        }
        return lookup(Files.readAllBytes(file), nextSeq);
    }

    /** {@link #lookup(long)} on the file's bytes. */
    Map<Integer, Long> lookup(byte[] bytes, long nextSeq) {
        String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPLACE)
                    .onUnmappableCharacter(CodingErrorAction.REPLACE).decode(ByteBuffer.wrap(bytes)).toString();
        } catch (java.nio.charset.CharacterCodingException e) {
            throw new IllegalStateException("a replacing decoder does not throw", e);
        }
        Map<Integer, Long> found = null;
        // Only lines ended by a newline were appended whole.
        int end = text.lastIndexOf('\n');
        int lineNo = 0;
        for (int from = 0; from <= end; ) {
            int nl = text.indexOf('\n', from);
            lineNo++;
            String line = text.substring(from, nl);
            from = nl + 1;
            Entry e = parse(line, lineNo);
            if (e.nextSeq == nextSeq) {
                found = e.offsets;
            }
        }
        return found;
    }

    private record Entry(long nextSeq, Map<Integer, Long> offsets) {}

    private Entry parse(String line, int lineNo) {
        int last = line.lastIndexOf('\t');
        int first = line.indexOf('\t');
        if (first < 0 || first == last) {
            throw damaged(lineNo, line, "expected nextSeq, offsets and a CRC-32 separated by tabs (an older winnow "
                    + "sink wrote no CRC; give this run a new directory)");
        }
        String body = line.substring(0, last);
        if (!line.substring(last + 1).equals(crc(body))) {
            throw damaged(lineNo, line, "its CRC-32 does not match (edited or damaged after it was written)");
        }
        long seq = natural(body.substring(0, first));
        String rest = body.substring(first + 1);
        Map<Integer, Long> offsets = new TreeMap<>();
        if (seq >= 0 && !rest.isEmpty()) {
            for (String part : rest.split(",", -1)) {
                int eq = part.indexOf('=');
                long partition = eq < 0 ? -1 : natural(part.substring(0, eq));
                long offset = eq < 0 ? -1 : natural(part.substring(eq + 1));
                if (partition < 0 || partition > Integer.MAX_VALUE || offset < 0
                        || offsets.put((int) partition, offset) != null) {
                    seq = -1;
                    break;
                }
            }
        }
        if (seq < 0) {
            throw damaged(lineNo, line, "expected nextSeq <TAB> partition=offset,... with whole numbers and each "
                    + "partition once");
        }
        return new Entry(seq, offsets);
    }

    private ClusterRefusedException damaged(int lineNo, String line, String why) {
        return new ClusterRefusedException(file + ":" + lineNo + ": damaged Kafka offsets '" + Limits.excerpt(line)
                + "': " + why);
    }

    /** ASCII digits that fit a long, else -1. */
    private static long natural(String s) {
        if (s.isEmpty() || s.length() > 18 || !s.chars().allMatch(c -> c >= '0' && c <= '9')) {
            return -1;
        }
        return Long.parseLong(s);
    }

    private static String crc(String body) {
        CRC32 crc = new CRC32();
        crc.update(body.getBytes(StandardCharsets.UTF_8));
        return String.format("%08x", crc.getValue());
    }
}
