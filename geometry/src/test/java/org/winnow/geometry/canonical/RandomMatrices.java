package org.winnow.geometry.canonical;

import java.util.random.RandomGenerator;
import org.winnow.geometry.Configuration;

/** Seeded random matrices and permutations for the canonical-form tests. */
public final class RandomMatrices {
    private RandomMatrices() {}

    /**
     * A random matrix with few distinct n values and small entries, with some rows duplicated so
     * that interchangeable rows and large symmetry groups occur often.
     */
    static Configuration matrix(RandomGenerator rnd, int maxRows, int maxCols, int maxN, int maxEntry) {
        int m = 1 + rnd.nextInt(maxRows);
        int k = 1 + rnd.nextInt(maxCols);
        int[] n = new int[m];
        int[][] q = new int[m][k];
        for (int r = 0; r < m; r++) {
            if (r > 0 && rnd.nextInt(4) == 0) {
                int src = rnd.nextInt(r);
                n[r] = n[src];
                q[r] = q[src].clone();
                continue;
            }
            n[r] = 1 + rnd.nextInt(maxN);
            for (int j = 0; j < k; j++) {
                q[r][j] = rnd.nextInt(3) == 0 ? rnd.nextInt(maxEntry + 1) : 0;
            }
        }
        return Configuration.of(n, q);
    }

    /** The same matrix with rows and columns shuffled. */
    public static Configuration permuted(RandomGenerator rnd, Configuration c) {
        int[] rows = permutation(rnd, c.rows());
        int[] cols = permutation(rnd, c.cols());
        int[] n = new int[c.rows()];
        int[][] q = new int[c.rows()][c.cols()];
        for (int r = 0; r < c.rows(); r++) {
            n[r] = c.n(rows[r]);
            for (int j = 0; j < c.cols(); j++) {
                q[r][j] = c.q(rows[r], cols[j]);
            }
        }
        return Configuration.of(n, q);
    }

    static int[] permutation(RandomGenerator rnd, int size) {
        int[] p = new int[size];
        for (int i = 0; i < size; i++) {
            p[i] = i;
        }
        for (int i = size - 1; i > 0; i--) {
            int j = rnd.nextInt(i + 1);
            int t = p[i];
            p[i] = p[j];
            p[j] = t;
        }
        return p;
    }
}
