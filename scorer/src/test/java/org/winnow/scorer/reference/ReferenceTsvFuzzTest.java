package org.winnow.scorer.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.SplittableRandom;
import java.util.random.RandomGenerator;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.testsupport.Damage;

/**
 * Seeded fuzzing of the reference TSV reader: a three-fold and a four-fold reference file edited at random on
 * the byte level (bytes deleted, inserted, flipped, cut short; tabs, newlines, signs, long numbers, fullwidth
 * digits and bytes that are not UTF-8 swapped in). Each input must either read as rows that keep the file's
 * promises (exact rows have non-negative integer values, four-folds exactly under the four-value header) or
 * be refused with one short line {@code line N: reason} with N a line of the input; nothing else may come
 * out. {@code -Dwinnow.fuzz.inputs=N} scales the run (a fifth of N inputs, 2 x 10^4 by default).
 */
class ReferenceTsvFuzzTest {
    // Hodge numbers of the seeds: the quintic 4:5 (1, 101), 2:3/2:3 (2, 83), 3:4/1:2 (2, 86), the sextic 5:6
    // (1, 0, 426, 1752), 4:5/1:2 (2, 0, 350, 1452), from memory; the reader does not check them, only their form.
    private static final String THREEFOLDS = "config\th11\th21\tstatus\tsource\n# three-folds\n4:5\t1\t101\texact\tcomputed\n"
            + "2:3/2:3\t2\t83\texact\tcomputed\n\n3:4/1:2\t2\t86\texact\timported\n6:3,2,2\t1..2\t70..80\tbounded\tcomputed\n";
    private static final String FOURFOLDS = "config\th11\th21\th31\th22\tstatus\tsource\n5:6\t1\t0\t426\t1752\texact\tcomputed\n"
            + "4:5/1:2\t2\t0\t350\t1452\texact\tcomputed\n3:4,0/3:0,4\t40\t0\t40\t404\texact\tproduct\n";
    private static final byte[][] TOKENS = {bytes("\t"), bytes("\n"), bytes("-1"), bytes("-"), bytes("+3"),
        bytes("99999999999"), bytes("2147483648"), bytes("0"), bytes("exact"), bytes("bounded"), bytes("product"),
        bytes("#"), bytes("\uFF15"), bytes("\u0000"), bytes(" "), bytes("1..2"), bytes("5:6"), bytes("3:4"),
        bytes("/1:2"), bytes("h31\th22"), {(byte) 0xFF}, {(byte) 0xC3}, {(byte) 0xE2, (byte) 0x82}};
    private static final Pattern REFUSAL = Pattern.compile("line (\\d+)(, column \\d+)?: [^\\n]+");

    @Test
    void everyEditedReferenceReadsCheckedOrIsRefusedInOneLine() throws Exception {
        byte[][] seeds = {bytes(THREEFOLDS), bytes(FOURFOLDS)};
        int inputs = Integer.getInteger("winnow.fuzz.inputs", 100_000) / 5;
        RandomGenerator rnd = new SplittableRandom(20261205L);
        int read = 0;
        int refused = 0;
        long start = System.nanoTime();
        for (int i = 0; i < inputs; i++) {
            byte[] input = edit(seeds[rnd.nextInt(seeds.length)], rnd);
            try {
                checkPromises(ReferenceTsv.read(new ByteArrayInputStream(input)), i);
                read++;
            } catch (IllegalArgumentException e) {
                String m = e.getMessage();
                Matcher match = REFUSAL.matcher(m);
                assertTrue(match.matches() && m.length() < 400, "input " + i + ": " + m);
                int line = Integer.parseInt(match.group(1));
                long lines = 1 + new String(input, StandardCharsets.ISO_8859_1).chars().filter(c -> c == '\n').count();
                assertTrue(line >= 1 && line <= lines, "input " + i + ": line " + line + " of " + lines + ": " + m);
                refused++;
            } catch (RuntimeException e) {
                fail("input " + i + " threw " + e);
            }
        }
        // Both outcomes must occur, or the edits are too weak or too strong to test anything.
        assertTrue(refused > inputs / 4 && read > inputs / 20, "read " + read + ", refused " + refused);
        System.out.printf("reference reader fuzz: %d inputs, %d read and checked, %d refused, %.1f s%n", inputs, read,
                refused, (System.nanoTime() - start) / 1e9);
    }

    @Test
    void badBytesAndFullwidthDigitsAreABadLineWithItsNumber(@TempDir Path tmp) throws Exception {
        Path file = tmp.resolve("r.tsv");
        Files.write(file, concat(bytes("config\th11\th21\tstatus\tsource\n4:5\t1\t10"), new byte[] {(byte) 0xFF},
                bytes("1\texact\tcomputed\n")));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ReferenceTsv.read(file));
        assertEquals("line 2: h21 of an exact row must be a whole number of ASCII digits below 2^31, got '10\\uFFFD1'",
                e.getMessage());
        Files.writeString(file, "config\th11\th21\tstatus\tsource\n4:5\t\uFF11\t101\texact\tcomputed\n");
        e = assertThrows(IllegalArgumentException.class, () -> ReferenceTsv.read(file));
        assertTrue(e.getMessage().startsWith("line 2: h11 of an exact row must be a whole number"), e.getMessage());
    }

    @Test
    void aHugeBadLineIsQuotedCut(@TempDir Path tmp) throws Exception {
        Path file = tmp.resolve("r.tsv");
        Files.writeString(file, "x".repeat(5_000_000) + "\n");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ReferenceTsv.read(file));
        assertTrue(e.getMessage().startsWith("line 1: expected the tab-separated header")
                && e.getMessage().endsWith("... (5000000 characters)'") && e.getMessage().length() < 300, e.getMessage());
    }

    @Test
    void aFourfoldNeedsTheFourValueHeaderAndOnlyFourfoldsHaveIt(@TempDir Path tmp) throws Exception {
        Path file = tmp.resolve("r.tsv");
        Files.writeString(file, "config\th11\th21\tstatus\tsource\n4:5\t1\t101\texact\tcomputed\n5:6\t1\t0\texact\tcomputed\n");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ReferenceTsv.read(file));
        assertEquals("line 3: 5:6 has dimension 4, but the header has no h31 h22 columns, which a four-fold needs; "
                + "keep four-folds and lower dimensions in separate files", e.getMessage());
        Files.writeString(file, "config\th11\th21\th31\th22\tstatus\tsource\n5:6\t1\t0\t426\t1752\texact\tcomputed\n"
                + "4:5\t1\t101\t0\t0\texact\tcomputed\n");
        e = assertThrows(IllegalArgumentException.class, () -> ReferenceTsv.read(file));
        assertEquals("line 3: 4:5 has dimension 3, but the header's h31 h22 columns are for four-folds only; "
                + "keep four-folds and lower dimensions in separate files", e.getMessage());
    }

    private static void checkPromises(List<ReferenceTsv.Row> rows, int input) {
        int width = -1;
        for (ReferenceTsv.Row r : rows) {
            if (r.hodge() != null) {
                assertTrue(width < 0 || width == r.hodge().length, "input " + input + ": mixed widths");
                width = r.hodge().length;
                assertEquals(r.config().dimension() == 4, width == 4, "input " + input + ": width " + width + " for "
                        + r.config().toText());
                for (int v : r.hodge()) {
                    assertTrue(v >= 0, "input " + input + ": negative value");
                }
            } else {
                assertTrue(!r.exact(), "input " + input + ": exact row without integer values");
            }
        }
    }

    private static byte[] edit(byte[] seed, RandomGenerator rnd) {
        return Damage.bytes(seed, rnd, TOKENS, 3, 12);
    }

    private static byte[] bytes(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    private static byte[] concat(byte[]... parts) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        for (byte[] p : parts) {
            out.writeBytes(p);
        }
        return out.toByteArray();
    }
}
