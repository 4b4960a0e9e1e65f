package org.winnow.geometry;

import java.util.ArrayList;
import java.util.List;

/**
 * The project's one-line text format: rows {@code n:d1,...,dK} joined by {@code /}, for example
 * {@code 2:3,0/2:0,3/1:1,1}. Blanks around separators are allowed; {@code #} starts a comment.
 * The writer emits no blanks, so the text of a canonical matrix is a byte-exact key.
 */
public final class ConfigurationText {
    /** U+FEFF, the byte-order mark some editors put at the start of a UTF-8 file; skipped at a line's start. */
    public static final String BYTE_ORDER_MARK = "\uFEFF";

    private ConfigurationText() {}

    /** Parses a single configuration given on line 1. */
    public static Configuration parse(String text) {
        return parse(text, 1);
    }

    /**
     * Parses a single configuration; {@code lineNumber} is only used in error messages.
     *
     * @throws ConfigurationFormatException naming the line, the column and what was expected
     */
    public static Configuration parse(String text, int lineNumber) {
        if (text == null) {
            throw new ConfigurationFormatException(lineNumber, 1, "empty input, expected a configuration such as 4:5");
        }
        Scanner s = new Scanner(text, lineNumber);
        if (text.startsWith(BYTE_ORDER_MARK)) {
            // Editors on some systems start a UTF-8 file with this mark; it would cost the file its first line.
            s.advance();
        }
        s.skipBlanks();
        if (s.atEnd()) {
            throw s.error("empty input, expected a configuration such as 4:5");
        }
        List<Integer> dims = new ArrayList<>();
        List<int[]> rows = new ArrayList<>();
        List<Integer> rowColumns = new ArrayList<>();
        while (true) {
            s.skipBlanks();
            int rowStart = s.column();
            dims.add(s.number("the dimension n of a projective factor"));
            s.skipBlanks();
            s.expect(':', "':' after the dimension");
            List<Integer> degrees = new ArrayList<>();
            while (true) {
                s.skipBlanks();
                degrees.add(s.signedNumber("a degree"));
                if (degrees.size() > Configuration.MAX_COLS) {
                    // Stop here rather than collect the rest of a runaway line (files may hold megabyte lines).
                    throw s.error(String.format("too large: more than %d columns, at most %d are supported",
                            Configuration.MAX_COLS, Configuration.MAX_COLS));
                }
                s.skipBlanks();
                if (s.peek() == ',') {
                    s.advance();
                    continue;
                }
                break;
            }
            int[] row = degrees.stream().mapToInt(Integer::intValue).toArray();
            rows.add(row);
            rowColumns.add(rowStart);
            if (rows.size() > 1 && row.length != rows.get(0).length) {
                throw new ConfigurationFormatException(lineNumber, rowStart, String.format(
                        "ragged rows: row 1 has %d entries but row %d has %d",
                        rows.get(0).length, rows.size(), row.length));
            }
            s.skipBlanks();
            if (s.atEnd()) {
                break;
            }
            s.expect('/', "'/' between rows, ',' between degrees, or the end of the configuration");
            if (rows.size() >= Configuration.MAX_ROWS) {
                throw s.error(String.format("too large: more than %d rows, at most %d are supported",
                        Configuration.MAX_ROWS, Configuration.MAX_ROWS));
            }
        }
        int m = dims.size();
        int[] n = new int[m];
        int[][] q = new int[m][];
        for (int r = 0; r < m; r++) {
            n[r] = dims.get(r);
            q[r] = rows.get(r);
        }
        try {
            return Configuration.of(n, q);
        } catch (IllegalArgumentException e) {
            throw new ConfigurationFormatException(lineNumber, 1, e.getMessage());
        }
    }

    /** The first column's name in the header of winnow's tab-separated files (survivors, rejects, references). */
    public static final String HEADER_FIRST_COLUMN = "config";

    /**
     * Strips a {@code #} comment; returns null when nothing but blanks remains, or for the header line of a
     * tab-separated file whose first column is {@value #HEADER_FIRST_COLUMN}, so that a survivors, rejects or
     * reference file can be given as a file of configurations (the header was refused as a bad line).
     */
    public static String stripComment(String line) {
        int hash = line.indexOf('#');
        String body = hash >= 0 ? line.substring(0, hash) : line;
        // Files may carry annotations after a tab; the configuration is the first field.
        int tab = body.indexOf('\t');
        if (tab >= 0) {
            body = body.substring(0, tab);
            if (body.replace(BYTE_ORDER_MARK, "").strip().equals(HEADER_FIRST_COLUMN)) {
                return null;
            }
        }
        return body.isBlank() ? null : body;
    }

    /** Writes the configuration in its own row and column order, without blanks. */
    public static String format(Configuration c) {
        StringBuilder sb = new StringBuilder(8 * c.rows() * (c.cols() + 1));
        for (int r = 0; r < c.rows(); r++) {
            if (r > 0) {
                sb.append('/');
            }
            sb.append(c.n(r)).append(':');
            for (int j = 0; j < c.cols(); j++) {
                if (j > 0) {
                    sb.append(',');
                }
                sb.append(c.q(r, j));
            }
        }
        return sb.toString();
    }

    /**
     * Only the ASCII digits 0-9 make numbers: {@link Character#isDigit} also accepts fullwidth and other
     * scripts' digits, whose {@code char - '0'} is far from their value (fullwidth 5 read as 65253).
     */
    static boolean isAsciiDigit(char c) {
        return c >= '0' && c <= '9';
    }

    private static final class Scanner {
        private final String text;
        private final int line;
        private int pos;

        Scanner(String text, int line) {
            this.text = text;
            this.line = line;
        }

        boolean atEnd() {
            return pos >= text.length();
        }

        char peek() {
            return atEnd() ? '\0' : text.charAt(pos);
        }

        void advance() {
            pos++;
        }

        int column() {
            return pos + 1;
        }

        void skipBlanks() {
            while (!atEnd() && (text.charAt(pos) == ' ' || text.charAt(pos) == '\t')) {
                pos++;
            }
        }

        void expect(char c, String what) {
            if (peek() != c) {
                throw error("expected " + what + " but found " + describe());
            }
            pos++;
        }

        int signedNumber(String what) {
            if (peek() == '-') {
                int start = pos;
                pos++;
                if (!isAsciiDigit(peek())) {
                    pos = start;
                    throw error("expected " + what + " but found " + describe());
                }
                return -digits(what);
            }
            return number(what);
        }

        int number(String what) {
            if (!isAsciiDigit(peek())) {
                throw error("expected " + what + " but found " + describe());
            }
            return digits(what);
        }

        private int digits(String what) {
            int start = pos;
            long v = 0;
            while (!atEnd() && isAsciiDigit(text.charAt(pos))) {
                v = v * 10 + (text.charAt(pos) - '0');
                if (v > 1_000_000) {
                    pos = start;
                    int end = start;
                    while (end < text.length() && end - start < 12 && isAsciiDigit(text.charAt(end))) {
                        end++;
                    }
                    throw error(what + " is too large: " + text.substring(start, end)
                            + (end < text.length() && isAsciiDigit(text.charAt(end)) ? "..." : ""));
                }
                pos++;
            }
            return (int) v;
        }

        String describe() {
            if (atEnd()) {
                return "the end of the input";
            }
            int cp = text.codePointAt(pos);
            // Control characters, other scripts' digits and the like would be invisible or look like ASCII.
            if (cp == 0xFFFD) {
                // What a reader puts where the bytes were not UTF-8.
                return "U+FFFD (bytes that are not valid UTF-8)";
            }
            return cp >= 0x20 && cp < 0x7f ? "'" + (char) cp + "'" : String.format("U+%04X", cp);
        }

        ConfigurationFormatException error(String problem) {
            return new ConfigurationFormatException(line, column(), problem);
        }
    }
}
