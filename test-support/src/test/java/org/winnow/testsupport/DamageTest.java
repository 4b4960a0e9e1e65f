package org.winnow.testsupport;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.util.HashSet;
import java.util.Set;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** Every single damage is one of the five edits, listed here by brute force; all five occur; a seed repeats. */
class DamageTest {
    private static final String SEED = "ab\tcd\n";

    /** Every result of one edit of {@code s} with the token {@code t}, runs up to {@code span} long. */
    private static Set<String> oneEdit(String s, String t, int span, int bits) {
        Set<String> all = new HashSet<>();
        for (int at = 0; at < s.length(); at++) {
            all.add(s.substring(0, at) + s.substring(at + 1));
            all.add(s.substring(0, at) + t + s.substring(at));
            for (int bit = 0; bit < bits; bit++) {
                all.add(s.substring(0, at) + (char) (s.charAt(at) ^ (1 << bit)) + s.substring(at + 1));
            }
            all.add(s.substring(0, at));
            for (int len = 1; len <= span; len++) {
                all.add(s.substring(0, at) + t + s.substring(Math.min(s.length(), at + len)));
            }
        }
        return all;
    }

    @Test
    void oneTextEditIsOneOfTheFiveAndEachKindOccurs() {
        Set<String> possible = oneEdit(SEED, "XY", 3, 7);
        SplittableRandom rnd = new SplittableRandom(1);
        Set<String> seen = new HashSet<>();
        for (int i = 0; i < 2_000; i++) {
            String d = Damage.text(SEED, rnd, new String[] {"XY"}, 1, 3);
            assertTrue(possible.contains(d), "not one edit of the seed: '" + d + "'");
            seen.add(d);
        }
        // The bit flips alone make 7 results a place; 2,000 draws reach nearly all of them.
        assertTrue(seen.size() > possible.size() * 9 / 10, seen.size() + " of " + possible.size());
        assertTrue(seen.contains("") && seen.contains("XYb\tcd\n") && seen.contains("b\tcd\n"));
    }

    @Test
    void oneByteEditIsOneOfTheFiveAndFlipsReachTheHighBit() {
        String latin1 = SEED;
        Set<String> possible = oneEdit(latin1, "XY", 3, 8);
        SplittableRandom rnd = new SplittableRandom(2);
        boolean high = false;
        for (int i = 0; i < 2_000; i++) {
            byte[] d = Damage.bytes(SEED.getBytes(StandardCharsets.ISO_8859_1), rnd,
                    new byte[][] {"XY".getBytes(StandardCharsets.ISO_8859_1)}, 1, 3);
            String s = new String(d, StandardCharsets.ISO_8859_1);
            assertTrue(possible.contains(s), "not one edit of the seed: '" + s + "'");
            for (byte b : d) {
                high |= b < 0;
            }
        }
        assertTrue(high, "a byte that is not ASCII (so not UTF-8 alone) was made");
    }

    @Test
    void theSameSeedGivesTheSameDamageAndEditsStopAtAnEmptyInput() {
        String[] tokens = {"-1", "\t", "null"};
        for (int seed = 0; seed < 50; seed++) {
            assertEquals(Damage.text(SEED, new SplittableRandom(seed), tokens, 3, 12),
                    Damage.text(SEED, new SplittableRandom(seed), tokens, 3, 12));
            assertArrayEquals(Damage.bytes(new byte[] {1, 2, 3}, new SplittableRandom(seed), new byte[][] {{9}}, 3, 6),
                    Damage.bytes(new byte[] {1, 2, 3}, new SplittableRandom(seed), new byte[][] {{9}}, 3, 6));
        }
        assertEquals("", Damage.text("", new SplittableRandom(3), tokens, 3, 12));
        assertEquals(0, Damage.bytes(new byte[0], new SplittableRandom(3), new byte[][] {{9}}, 3, 6).length);
    }
}
