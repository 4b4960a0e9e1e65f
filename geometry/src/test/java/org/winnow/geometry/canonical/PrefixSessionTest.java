package org.winnow.geometry.canonical;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/** The incremental prefix session must agree with the one-shot test under generator-like use. */
class PrefixSessionTest {
    @Test
    void pushesAgreeWithTheOneShotTestWhileRowsAreReplacedAndRestored() {
        SplittableRandom rnd = new SplittableRandom(5L);
        CanonicalSearch session = new CanonicalSearch();
        CanonicalSearch oneShot = new CanonicalSearch();
        int rejected = 0;
        int accepted = 0;
        for (int i = 0; i < 400; i++) {
            Configuration c = RandomMatrices.matrix(rnd, 9, 10, 2, 2).canonical();
            int m = c.rows();
            int k = c.cols();
            int[] n = c.dims();
            int[][] q = c.degrees();
            session.startPrefix(k);
            for (int t = 0; t < m; t++) {
                int[] original = q[t].clone();
                for (int trial = 0; trial < 6; trial++) {
                    // a sibling: some row of the same matrix with the same n, or a shuffled copy of this one
                    int src = rnd.nextInt(m);
                    int[] variant = n[src] == n[t] && rnd.nextBoolean() ? q[src].clone() : shuffled(rnd, original);
                    q[t] = variant;
                    boolean expected = oneShot.isCanonical(n, q, t + 1, k);
                    assertEquals(expected, session.pushRow(n, q, t), c.toText() + " row " + t);
                    if (expected) {
                        accepted++;
                    } else {
                        rejected++;
                    }
                }
                q[t] = original;
                assertTrue(session.pushRow(n, q, t), "a canonical prefix is accepted: " + c.toText());
            }
        }
        assertTrue(accepted > 500 && rejected > 500, accepted + " accepted, " + rejected + " rejected");
    }

    private static int[] shuffled(SplittableRandom rnd, int[] row) {
        int[] p = RandomMatrices.permutation(rnd, row.length);
        int[] out = new int[row.length];
        for (int j = 0; j < row.length; j++) {
            out[j] = row[p[j]];
        }
        return out;
    }
}
