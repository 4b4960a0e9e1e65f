package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/** The shuffles every order-independence test relies on: real permutations, and not the identity. */
class RandomConfigurationsTest {
    @Test
    void aPermutationHoldsEveryIndexOnceAndAllOrdersOfThreeOccur() {
        RandomConfigurations random = new RandomConfigurations(new SplittableRandom(4));
        java.util.Set<String> orders = new java.util.HashSet<>();
        for (int i = 0; i < 200; i++) {
            int[] p = random.permutation(7);
            int[] sorted = p.clone();
            Arrays.sort(sorted);
            assertArrayEquals(new int[] {0, 1, 2, 3, 4, 5, 6}, sorted);
            orders.add(Arrays.toString(random.permutation(3)));
        }
        assertEquals(6, orders.size(), "all 3! orders drawn in 200 tries: " + orders);
        assertEquals(0, random.permutation(0).length);
    }

    @Test
    void aPermutedMatrixHasTheSameRowsAndColumnsInAnotherOrder() {
        SplittableRandom rng = new SplittableRandom(9);
        RandomConfigurations random = new RandomConfigurations(rng);
        int moved = 0;
        for (int i = 0; i < 100; i++) {
            Configuration c = random.calabiYau(3, 4, 3);
            Configuration p = random.permuted(c);
            assertEquals(c.canonicalText(), p.canonicalText());
            assertEquals(rowMultiset(c), rowMultiset(p), c + " vs " + p);
            if (!c.toText().equals(p.toText())) {
                moved++;
            }
        }
        assertTrue(moved > 50, "the shuffle moved only " + moved + " of 100 matrices");
    }

    /** Each row as its n and sorted degrees, the rows sorted: what a reordering of rows and columns keeps. */
    private static String rowMultiset(Configuration c) {
        String[] rows = new String[c.rows()];
        for (int r = 0; r < c.rows(); r++) {
            int[] q = new int[c.cols()];
            for (int j = 0; j < c.cols(); j++) {
                q[j] = c.q(r, j);
            }
            Arrays.sort(q);
            rows[r] = c.n(r) + ":" + Arrays.toString(q);
        }
        Arrays.sort(rows);
        return String.join("/", rows);
    }
}
