package org.winnow.geometry.canonical;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

class CanonicalFormTest {
    @Test
    void workedExampleOfTheSpecification() {
        // the split bicubic given with its P^1 row first; the two P^2 rows tie at level 0
        Configuration c = Configuration.parse("1:1,1/2:3,0/2:0,3");
        assertEquals("2:3,0/2:0,3/1:1,1", CanonicalForm.canonicalText(c));
        assertEquals("2:3,0/2:0,3/1:1,1", c.canonicalText());
        assertFalse(CanonicalForm.isCanonical(c));
        assertTrue(CanonicalForm.isCanonical(Configuration.parse("2:3,0/2:0,3/1:1,1")));
    }

    @Test
    void canonicalLinesOfKnownMatricesAreTheirDoublyLexicalForms() {
        assertEquals("4:5", Configuration.parse("4:5").canonicalText());
        assertEquals("5:4,2", Configuration.parse("5:2,4").canonicalText());
        assertEquals("1:2/1:2/1:2/1:2", Configuration.parse("1:2/1:2/1:2/1:2").canonicalText());
        assertEquals("3:3,1,0/3:0,1,3", Configuration.parse("3:0,1,3/3:3,1,0").canonicalText());
        // columns compare as whole vectors: the larger first entry wins even with a smaller sum below
        assertEquals("2:2,1,0/1:0,1,1", Configuration.parse("1:1,1,0/2:0,1,2").canonicalText());
    }

    @Test
    void rowsWithEqualValuesButDifferentDimensionsAreNotInterchangeable() {
        Configuration c = Configuration.parse("1:1,1/2:1,1");
        assertEquals("2:1,1/1:1,1", c.canonicalText());
    }

    @Test
    void canonicalFormIsInvariantUnderTenThousandRandomPermutations() {
        SplittableRandom rnd = new SplittableRandom(20261201L);
        int permutations = 0;
        for (int i = 0; i < 250; i++) {
            Configuration c = RandomMatrices.matrix(rnd, 10, 14, 3, 3);
            Configuration canonical = c.canonical();
            assertTrue(CanonicalForm.isCanonical(canonical), canonical.toText());
            assertEquals(canonical, canonical.canonical(), "a canonical form is its own canonical form");
            for (int p = 0; p < 40; p++) {
                Configuration shuffled = RandomMatrices.permuted(rnd, c);
                assertEquals(canonical.toText(), shuffled.canonicalText(), c.toText());
                assertEquals(shuffled.equals(canonical), CanonicalForm.isCanonical(shuffled), shuffled.toText());
                permutations++;
            }
        }
        assertTrue(permutations >= 10_000);
    }

    @Test
    void everyPrefixOfACanonicalMatrixIsCanonical() {
        SplittableRandom rnd = new SplittableRandom(11L);
        CanonicalSearch search = new CanonicalSearch();
        for (int i = 0; i < 500; i++) {
            Configuration c = RandomMatrices.matrix(rnd, 8, 10, 3, 3).canonical();
            int[] n = c.dims();
            int[][] q = c.degrees();
            for (int t = 1; t <= c.rows(); t++) {
                assertTrue(search.isCanonical(n, q, t, c.cols()), t + " rows of " + c.toText());
            }
            Configuration shuffled = RandomMatrices.permuted(rnd, c);
            assertEquals(shuffled.equals(c),
                    search.isCanonical(shuffled.dims(), shuffled.degrees(), c.rows(), c.cols()), shuffled.toText());
        }
    }

    @Test
    void highlySymmetricMatricesAreHandled() {
        // P^1 rows on the edges of K_{3,3}: many ties and a large automorphism group
        String k33 = "2:1,1,1,0,0,0,0,0,0/2:0,0,0,1,1,1,0,0,0/2:0,0,0,0,0,0,1,1,1"
                + "/2:1,0,0,1,0,0,1,0,0/2:0,1,0,0,1,0,0,1,0/2:0,0,1,0,0,1,0,0,1";
        Configuration c = Configuration.parse(k33);
        SplittableRandom rnd = new SplittableRandom(7L);
        String canonical = c.canonicalText();
        for (int p = 0; p < 200; p++) {
            assertEquals(canonical, RandomMatrices.permuted(rnd, c).canonicalText());
        }
    }
}
