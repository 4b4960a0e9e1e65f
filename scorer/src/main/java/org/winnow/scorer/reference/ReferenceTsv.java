package org.winnow.scorer.reference;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.pipeline.text.BoundedLineReader;
import org.winnow.pipeline.text.LineTooLongException;

/**
 * The labelled reference file: tab-separated, a header line naming the columns
 * {@code config h11 h21 [h31 h22] status source}, then one configuration per line. {@code status} is
 * {@code exact} or {@code bounded}, {@code source} is {@code computed}, {@code imported} or {@code product}. Blank
 * lines and {@code #} comments are skipped. Hodge values of a bounded row may be non-integers (for
 * example ranges) and are then kept as text only; training uses exact rows alone.
 *
 * <p>The header decides the dimension: the four-value header holds four-folds only, the two-value header
 * everything below. A four-fold under the two-value header has no h31 and h22 to check its chi against, and
 * a three-fold under the four-value header has meaningless ones; both are refused rather than half-read.
 * Bytes that are not UTF-8 become U+FFFD, so they make a bad line with its number; Hodge values are
 * ASCII digits only ({@code Integer.parseInt} would read fullwidth digits as numbers).
 */
public final class ReferenceTsv {
    /** Label status. */
    public enum Status { EXACT, BOUNDED }

    /**
     * Where a label came from: computed by the Hodge engine, imported, or computed as a product (a
     * block-diagonal matrix, whose diamond is the Kunneth product of its blocks'; its holonomy is smaller, so
     * the identities of full holonomy, such as the four-fold chi identity, do not hold for it).
     */
    public enum Source { COMPUTED, IMPORTED, PRODUCT }

    /**
     * One line of the file.
     *
     * @param hodge {@code {h11, h21}} or {@code {h11, h21, h31, h22}}; null for a bounded row whose
     *     values are not all integers
     * @param line 1-based line number in the file
     */
    public record Row(Configuration config, int[] hodge, Status status, Source source, int line) {
        public boolean exact() {
            return status == Status.EXACT;
        }
    }

    private static final List<String> THREEFOLD = List.of("config", "h11", "h21", "status", "source");
    private static final List<String> FOURFOLD = List.of("config", "h11", "h21", "h31", "h22", "status", "source");

    private ReferenceTsv() {}

    /**
     * Reads every row.
     *
     * @throws IllegalArgumentException with a one-line message {@code line N: reason} on the first bad line
     * @throws IOException when the file cannot be read at all (missing, a directory, unreadable)
     */
    public static List<Row> read(Path path) throws IOException {
        try (InputStream in = Files.newInputStream(path)) {
            return read(in);
        }
    }

    static List<Row> read(InputStream bytes) throws IOException {
        // Bytes that are not UTF-8 become U+FFFD and are refused with their line; an endless line is refused too.
        try (BoundedLineReader in = new BoundedLineReader(bytes, "reference")) {
            return read(in);
        } catch (LineTooLongException e) {
            throw new IllegalArgumentException("line " + e.line() + ": " + e.reason(), e);
        }
    }

    private static List<Row> read(BoundedLineReader in) throws IOException {
        List<Row> rows = new ArrayList<>();
        List<String> header = null;
        String raw;
        int lineNo = 0;
        while ((raw = in.readLine()) != null) {
            lineNo++;
            if (lineNo == 1 && raw.startsWith(ConfigurationText.BYTE_ORDER_MARK)) {
                raw = raw.substring(1);
            }
            String line = raw.strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String[] f = raw.split("\t", -1);
            if (header == null) {
                header = Arrays.stream(f).map(s -> s.strip().toLowerCase(Locale.ROOT)).toList();
                if (!header.equals(THREEFOLD) && !header.equals(FOURFOLD)) {
                    throw new IllegalArgumentException("line " + lineNo + ": expected the tab-separated header "
                            + String.join(" ", THREEFOLD) + " (or with h31 h22 after h21), got '" + excerpt(line) + "'");
                }
                continue;
            }
            if (f.length != header.size()) {
                throw new IllegalArgumentException("line " + lineNo + ": expected " + header.size()
                        + " tab-separated fields, got " + f.length);
            }
            Configuration config;
            try {
                config = ConfigurationText.parse(f[0], lineNo);
            } catch (ConfigurationFormatException e) {
                throw new IllegalArgumentException(e.getMessage(), e);
            }
            int values = header.size() - 3;
            if ((config.dimension() == 4) != (values == 4)) {
                throw new IllegalArgumentException("line " + lineNo + ": " + excerpt(f[0].strip()) + " has dimension "
                        + config.dimension() + (values == 4 ? ", but the header's h31 h22 columns are for four-folds only"
                        : ", but the header has no h31 h22 columns, which a four-fold needs")
                        + "; keep four-folds and lower dimensions in separate files");
            }
            Status status = parseEnum(Status.class, f[values + 1], "status", "exact | bounded", lineNo);
            Source source = parseEnum(Source.class, f[values + 2], "source", "computed | imported | product", lineNo);
            int[] hodge = new int[values];
            boolean integral = true;
            for (int i = 0; i < values; i++) {
                String s = f[1 + i].strip();
                if (s.startsWith("-") && s.length() > 1 && s.substring(1).chars().allMatch(ReferenceTsv::asciiDigit)) {
                    throw new IllegalArgumentException("line " + lineNo + ": " + header.get(1 + i)
                            + " must not be negative: " + excerpt(s));
                }
                int v = naturalNumber(s);
                if (v >= 0) {
                    hodge[i] = v;
                } else if (status == Status.EXACT) {
                    throw new IllegalArgumentException("line " + lineNo + ": " + header.get(1 + i)
                            + " of an exact row must be a whole number of ASCII digits below 2^31, got '" + excerpt(s) + "'");
                } else {
                    integral = false;
                }
            }
            rows.add(new Row(config, integral ? hodge : null, status, source, lineNo));
        }
        if (header == null) {
            throw new IllegalArgumentException("line " + Math.max(1, lineNo) + ": empty reference file, expected a header "
                    + String.join(" ", THREEFOLD));
        }
        return rows;
    }

    private static <E extends Enum<E>> E parseEnum(Class<E> type, String text, String what, String allowed,
            int lineNo) {
        try {
            return Enum.valueOf(type, text.strip().toUpperCase(Locale.ROOT));
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException("line " + lineNo + ": " + what + " must be " + allowed + ", got '"
                    + excerpt(text.strip()) + "'");
        }
    }

    private static boolean asciiDigit(int c) {
        return c >= '0' && c <= '9';
    }

    /** {@code s} as a number of ASCII digits that fits an int, else -1. */
    private static int naturalNumber(String s) {
        if (s.isEmpty() || s.length() > 10 || !s.chars().allMatch(ReferenceTsv::asciiDigit)) {
            return -1;
        }
        long v = Long.parseLong(s);
        return v > Integer.MAX_VALUE ? -1 : (int) v;
    }

    /** Text quoted back in a message: printable ASCII, cut after 80 characters with the full length said. */
    static String excerpt(String text) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < text.length() && i < 80; i++) {
            char c = text.charAt(i);
            sb.append(c >= 0x20 && c < 0x7f ? String.valueOf(c) : String.format("\\u%04X", (int) c));
        }
        if (text.length() > 80) {
            sb.append("... (").append(text.length()).append(" characters)");
        }
        return sb.toString();
    }

    /** Writes rows with the header that fits their label width (2 or 4 Hodge numbers). */
    public static void write(Path path, List<Row> rows) throws IOException {
        boolean four = !rows.isEmpty() && rows.get(0).hodge() != null && rows.get(0).hodge().length == 4;
        try (BufferedWriter out = Files.newBufferedWriter(path, StandardCharsets.UTF_8)) {
            out.write(String.join("\t", four ? FOURFOLD : THREEFOLD));
            out.write('\n');
            for (Row r : rows) {
                StringBuilder sb = new StringBuilder(r.config().toText());
                for (int v : r.hodge()) {
                    sb.append('\t').append(v);
                }
                sb.append('\t').append(r.status().name().toLowerCase(Locale.ROOT));
                sb.append('\t').append(r.source().name().toLowerCase(Locale.ROOT)).append('\n');
                out.write(sb.toString());
            }
        }
    }
}
