package org.winnow.pipeline.text;

import java.io.Closeable;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.Reader;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.winnow.geometry.Checks;

/**
 * Reads lines like {@link java.io.BufferedReader#readLine()} (ended by {@code \n}, {@code \r\n} or
 * {@code \r}, without the ending), but refuses a line longer than a limit with a
 * {@link LineTooLongException} naming the input and the line, so that memory stays bounded by the limit
 * whatever the input holds. Bytes that are not UTF-8 become U+FFFD, so such a line can be refused by
 * its number by the caller instead of the whole input failing to decode.
 */
public final class BoundedLineReader implements Closeable {
    /** The longest line any user file may have: 8 Mi characters, far beyond any configuration or rule. */
    public static final int MAX_LINE = 8_388_608;

    private final Reader in;
    private final String name;
    private final int limit;
    private final char[] buf = new char[1 << 16];
    private int pos;
    private int end;
    private boolean skipNewline;
    private boolean eof;
    private long lineNumber;

    /** Reads {@code in} as UTF-8 with the default limit; {@code name} is what messages call the input. */
    public BoundedLineReader(InputStream in, String name) {
        this(new InputStreamReader(in, StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPLACE)
                .onUnmappableCharacter(CodingErrorAction.REPLACE)), name, MAX_LINE);
    }

    public BoundedLineReader(Reader in, String name, int limit) {
        Checks.requireArgument(limit >= 1, "the line limit must be at least 1, got %s", limit);
        this.in = in;
        this.name = name;
        this.limit = limit;
    }

    /** Opens {@code file}, named in messages by its path as given. */
    public static BoundedLineReader open(Path file) throws IOException {
        return new BoundedLineReader(Files.newInputStream(file), file.toString());
    }

    /** The next line without its ending, or null at the end of the input. */
    public String readLine() throws IOException {
        StringBuilder partial = null;
        while (true) {
            if (pos >= end && !fill()) {
                if (partial == null) {
                    return null;
                }
                lineNumber++;
                return partial.toString();
            }
            if (skipNewline) {
                skipNewline = false;
                if (buf[pos] == '\n') {
                    pos++;
                    continue;
                }
            }
            int start = pos;
            int i = pos;
            while (i < end && buf[i] != '\n' && buf[i] != '\r') {
                i++;
            }
            int had = partial == null ? 0 : partial.length();
            if ((long) had + (i - start) > limit) {
                throw new LineTooLongException(name, lineNumber + 1, limit);
            }
            if (i < end) {
                skipNewline = buf[i] == '\r';
                pos = i + 1;
                lineNumber++;
                if (partial == null) {
                    return new String(buf, start, i - start);
                }
                return partial.append(buf, start, i - start).toString();
            }
            if (partial == null) {
                partial = new StringBuilder(Math.max(16, i - start) * 2);
            }
            partial.append(buf, start, i - start);
            pos = end;
        }
    }

    /** The number of lines returned so far, which is the number of the last one. */
    public long lineNumber() {
        return lineNumber;
    }

    /** What messages call the input. */
    public String name() {
        return name;
    }

    private boolean fill() throws IOException {
        if (eof) {
            return false;
        }
        int n;
        do {
            n = in.read(buf, 0, buf.length);
        } while (n == 0);
        if (n < 0) {
            eof = true;
            return false;
        }
        pos = 0;
        end = n;
        return true;
    }

    @Override
    public void close() throws IOException {
        in.close();
    }
}
