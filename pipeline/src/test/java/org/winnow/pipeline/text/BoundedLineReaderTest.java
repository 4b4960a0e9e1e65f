package org.winnow.pipeline.text;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The bounded reader against {@link BufferedReader} as the oracle, and its refusal of endless lines. */
class BoundedLineReaderTest {
    private static List<String> oracle(String text) throws IOException {
        List<String> lines = new ArrayList<>();
        try (BufferedReader r = new BufferedReader(new StringReader(text))) {
            for (String l = r.readLine(); l != null; l = r.readLine()) {
                lines.add(l);
            }
        }
        return lines;
    }

    private static List<String> bounded(String text, int limit) throws IOException {
        List<String> lines = new ArrayList<>();
        try (BoundedLineReader r = new BoundedLineReader(new StringReader(text), "t", limit)) {
            for (String l = r.readLine(); l != null; l = r.readLine()) {
                lines.add(l);
                assertEquals(lines.size(), r.lineNumber());
            }
            assertNull(r.readLine(), "the end stays the end");
        }
        return lines;
    }

    @Test
    void agreesWithBufferedReaderOnRandomTextWithEveryLineEnding() throws IOException {
        SplittableRandom rnd = new SplittableRandom(5);
        String[] pieces = {"\n", "\r\n", "\r", "\r\r", "\n\n", "a", "2:3/2:3", "x".repeat(70_000), "\t#c", "\u00e9"};
        for (int round = 0; round < 300; round++) {
            StringBuilder sb = new StringBuilder();
            int n = rnd.nextInt(40);
            for (int i = 0; i < n; i++) {
                // Mostly short pieces; now and then one longer than the buffer, so lines and CRLF pairs straddle it.
                String p = pieces[rnd.nextInt(pieces.length)];
                sb.append(p == pieces[7] && rnd.nextInt(4) != 0 ? "y" : p);
            }
            String text = sb.toString();
            assertEquals(oracle(text), bounded(text, BoundedLineReader.MAX_LINE), () -> "round text of length "
                    + text.length());
        }
    }

    @Test
    void aCrlfPairSplitAcrossTheBufferIsOneLineEnding() throws IOException {
        String first = "z".repeat((1 << 16) - 1);
        String text = first + "\r\nnext\r\n";
        assertEquals(List.of(first, "next"), bounded(text, BoundedLineReader.MAX_LINE));
    }

    @Test
    void aLineAtTheLimitIsReadAndOneCharacterMoreIsRefusedWithItsNumber() throws IOException {
        assertEquals(List.of("ok", "abcde", "last"), bounded("ok\nabcde\nlast", 5));
        try (BoundedLineReader r = new BoundedLineReader(new StringReader("ok\nabcdef\n"), "rules.txt", 5)) {
            assertEquals("ok", r.readLine());
            LineTooLongException e = assertThrows(LineTooLongException.class, r::readLine);
            assertEquals(2, e.line());
            assertEquals("rules.txt line 2: longer than 5 characters; is it a text file with one entry a line?",
                    e.getMessage());
        }
    }

    @Test
    void anEndlessInputWithoutLineBreaksIsRefusedAfterTheLimitNotReadForever() throws IOException {
        // Zero bytes without end, like /dev/zero: the reader must stop after about the limit.
        long[] served = {0};
        InputStream zeros = new InputStream() {
            @Override
            public int read() {
                served[0]++;
                return 0;
            }

            @Override
            public int read(byte[] b, int off, int len) {
                java.util.Arrays.fill(b, off, off + len, (byte) 0);
                served[0] += len;
                return len;
            }
        };
        try (BoundedLineReader r = new BoundedLineReader(zeros, "/dev/zero")) {
            LineTooLongException e = assertThrows(LineTooLongException.class, r::readLine);
            assertEquals("/dev/zero", e.input());
            assertEquals(1, e.line());
            assertTrue(e.getMessage().startsWith("/dev/zero line 1: longer than 8388608 characters"), e.getMessage());
        }
        assertTrue(served[0] < 2L * BoundedLineReader.MAX_LINE, "read " + served[0] + " bytes");
    }

    @Test
    void bytesThatAreNotUtf8BecomeReplacementCharactersOnTheirOwnLine() throws IOException {
        byte[] bytes = {'a', '\n', (byte) 0xff, 'b', '\n', 'c'};
        try (BoundedLineReader r = new BoundedLineReader(new ByteArrayInputStream(bytes), "f")) {
            assertEquals("a", r.readLine());
            assertEquals("\uFFFDb", r.readLine());
            assertEquals("c", r.readLine());
            assertNull(r.readLine());
        }
        assertEquals(List.of("\u00e9"), bounded(new String("\u00e9".getBytes(StandardCharsets.UTF_8),
                StandardCharsets.UTF_8), 1));
    }
}
