package org.winnow.geometry.canonical;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/**
 * The canonical form against its definition, evaluated literally: the maximum row-major word over
 * all row permutations that sort n descending and all column permutations (common practice, no
 * source).
 */
class CanonicalFormBruteForceTest {
    @Test
    void equalsTheMaximumOverAllPermutations() {
        SplittableRandom rnd = new SplittableRandom(42L);
        for (int i = 0; i < 3000; i++) {
            Configuration c = RandomMatrices.matrix(rnd, 4, 5, 3, 3);
            assertEquals(bruteForce(c), c.canonicalText(), c.toText());
        }
    }

    private static String bruteForce(Configuration c) {
        int m = c.rows();
        int k = c.cols();
        List<int[]> rowPerms = permutations(m);
        List<int[]> colPerms = permutations(k);
        int[] bestWord = null;
        int[] bestN = null;
        for (int[] rp : rowPerms) {
            int[] n = new int[m];
            boolean sorted = true;
            for (int r = 0; r < m; r++) {
                n[r] = c.n(rp[r]);
                if (r > 0 && n[r] > n[r - 1]) {
                    sorted = false;
                }
            }
            if (!sorted) {
                continue;
            }
            for (int[] cp : colPerms) {
                int[] word = new int[m * k];
                for (int r = 0; r < m; r++) {
                    for (int j = 0; j < k; j++) {
                        word[r * k + j] = c.q(rp[r], cp[j]);
                    }
                }
                if (bestWord == null || java.util.Arrays.compare(word, bestWord) > 0) {
                    bestWord = word;
                    bestN = n;
                }
            }
        }
        int[][] q = new int[m][k];
        for (int r = 0; r < m; r++) {
            System.arraycopy(bestWord, r * k, q[r], 0, k);
        }
        return Configuration.of(bestN, q).toText();
    }

    private static List<int[]> permutations(int size) {
        List<int[]> out = new ArrayList<>();
        permute(new int[size], new boolean[size], 0, out);
        return out;
    }

    private static void permute(int[] p, boolean[] taken, int at, List<int[]> out) {
        if (at == p.length) {
            out.add(p.clone());
            return;
        }
        for (int v = 0; v < p.length; v++) {
            if (!taken[v]) {
                taken[v] = true;
                p[at] = v;
                permute(p, taken, at + 1, out);
                taken[v] = false;
            }
        }
    }
}
