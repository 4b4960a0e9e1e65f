package org.winnow.geometry.canonical;

import java.util.random.RandomGenerator;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.RandomConfigurations;

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
        return new RandomConfigurations(rnd).permuted(c);
    }

    static int[] permutation(RandomGenerator rnd, int size) {
        return new RandomConfigurations(rnd).permutation(size);
    }
}
