package org.winnow.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Seeded fuzzing of the configuration parser: every input either parses to a configuration whose text
 * parses back to itself, or is refused with a {@link ConfigurationFormatException} whose message is one
 * short line of printable characters naming line and column. Nothing else may come out (no other
 * exception, no digits of other scripts read as numbers).
 *
 * <p>{@code -Dwinnow.fuzz.inputs=N} sets the number of inputs (10^5 by default, a few seconds); the
 * longer run with 10^6 and its figures are in {@code docs/scan-pipeline.md}.
 */
class ConfigurationTextFuzzTest {
    private static final String ALPHABET = "0123456789:,/- \t#-:,/0123456789";
    private static final String[] ODD = {
        "\uFF10", "\uFF15", "\u0665", "\u096B", "\u00B2", "\u2075", "\u0000", "\r", "\n", "\uFEFF", "\uD83D\uDE00",
        "\uD800", "\u00A0", "+", ".", "e", "x", "9999999999", "00000000000000000007", "--", "::", ",,", "//",
    };

    @Test
    void everyInputParsesOrIsRefusedInOneTypedLine() {
        int inputs = Integer.getInteger("winnow.fuzz.inputs", 100_000);
        SplittableRandom rnd = new SplittableRandom(20261205L);
        int parsed = 0;
        int refused = 0;
        long start = System.nanoTime();
        for (int i = 0; i < inputs; i++) {
            String text = input(rnd);
            Configuration c;
            try {
                c = ConfigurationText.parse(text, 1 + i % 1000);
            } catch (ConfigurationFormatException e) {
                String m = e.getMessage();
                assertTrue(m.startsWith("line " + (1 + i % 1000) + ", column "), m);
                assertTrue(m.length() <= 200, "long message for input " + i + ": " + m);
                assertTrue(m.chars().allMatch(ch -> ch >= 0x20 && ch < 0x7f), "unprintable message: " + m);
                refused++;
                continue;
            } catch (RuntimeException e) {
                fail("input " + i + " " + escape(text) + " threw " + e);
                return;
            }
            parsed++;
            assertTrue(text.chars().filter(Character::isDigit).allMatch(ch -> ch >= '0' && ch <= '9'),
                    "parsed an input with non-ASCII digits: " + escape(text));
            assertEquals(c, ConfigurationText.parse(c.toText()), escape(text));
        }
        assertTrue(parsed > inputs / 20 && refused > inputs / 4, "parsed " + parsed + ", refused " + refused);
        System.out.printf("configuration parser fuzz: %d inputs, %d parsed, %d refused, %.1f s%n", inputs, parsed,
                refused, (System.nanoTime() - start) / 1e9);
    }

    /** A valid configuration, then up to 4 random edits; or random characters; or a runaway line. */
    private static String input(SplittableRandom rnd) {
        int kind = rnd.nextInt(200);
        if (kind >= 1 && kind < 10) {
            StringBuilder sb = new StringBuilder();
            int len = rnd.nextInt(300);
            for (int i = 0; i < len; i++) {
                sb.append(pick(rnd));
            }
            return sb.toString();
        }
        if (kind == 0) {
            // Long lines: many columns or rows, or one huge number.
            String unit = switch (rnd.nextInt(3)) {
                case 0 -> "1,";
                case 1 -> "1:2/";
                default -> "9";
            };
            return "2:" + unit.repeat(1 + rnd.nextInt(5_000));
        }
        StringBuilder sb = new StringBuilder(valid(rnd));
        int edits = rnd.nextInt(5);
        for (int e = 0; e < edits && sb.length() > 0; e++) {
            int at = rnd.nextInt(sb.length() + 1);
            switch (rnd.nextInt(3)) {
                case 0 -> sb.insert(at, pick(rnd));
                case 1 -> sb.deleteCharAt(Math.min(at, sb.length() - 1));
                default -> sb.replace(Math.min(at, sb.length() - 1), Math.min(at, sb.length() - 1) + 1, pick(rnd));
            }
        }
        return sb.toString();
    }

    private static String pick(SplittableRandom rnd) {
        return rnd.nextInt(6) == 0 ? ODD[rnd.nextInt(ODD.length)] : String.valueOf(ALPHABET.charAt(rnd.nextInt(ALPHABET.length())));
    }

    private static String valid(SplittableRandom rnd) {
        int m = 1 + rnd.nextInt(5);
        int k = 1 + rnd.nextInt(5);
        StringBuilder sb = new StringBuilder();
        for (int r = 0; r < m; r++) {
            if (r > 0) {
                sb.append(rnd.nextBoolean() ? "/" : " / ");
            }
            sb.append(1 + rnd.nextInt(5)).append(':');
            for (int j = 0; j < k; j++) {
                if (j > 0) {
                    sb.append(',');
                }
                sb.append(rnd.nextInt(4));
            }
        }
        return sb.toString();
    }

    private static String escape(String s) {
        StringBuilder sb = new StringBuilder();
        s.codePoints().limit(200).forEach(cp -> sb.append(cp >= 0x20 && cp < 0x7f ? Character.toString(cp)
                : String.format("\\u%04X", cp)));
        return sb.toString();
    }

    /** Fullwidth digits used to be read as numbers: "\uFF15" gave a degree of 65253. */
    @Test
    void fullwidthDigitsAreRefusedNotReadAsNumbers() {
        ConfigurationFormatException e = org.junit.jupiter.api.Assertions.assertThrows(
                ConfigurationFormatException.class, () -> ConfigurationText.parse("4:\uFF15"));
        assertEquals("line 1, column 3: expected a degree but found U+FF15", e.getMessage());
        org.junit.jupiter.api.Assertions.assertThrows(ConfigurationFormatException.class,
                () -> ConfigurationText.parse("\u0664:5"));
    }
}
