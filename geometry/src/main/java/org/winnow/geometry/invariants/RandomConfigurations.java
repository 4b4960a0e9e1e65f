package org.winnow.geometry.invariants;

import java.util.random.RandomGenerator;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * Seeded random configuration matrices for tests and benchmarks (shared so both use the same
 * distribution). These are not a catalogue: they over-represent small rows and may contain
 * hyperplane columns and blocks, which is what an oracle comparison wants.
 */
public final class RandomConfigurations {
    private final RandomGenerator random;

    /** Draws from {@code random}; pass a seeded generator (e.g. {@code new SplittableRandom(seed)}). */
    public RandomConfigurations(RandomGenerator random) {
        this.random = random;
    }

    /**
     * A Calabi-Yau matrix of dimension {@code dim} with {@code 1..maxRows} rows and
     * {@code 1 <= n_r <= maxN}. The {@code n_r + 1} units of each row are shuffled over the
     * columns so that every column receives at least one unit (no zero column).
     */
    public Configuration calabiYau(int dim, int maxRows, int maxN) {
        Checks.requireArgument(dim >= 0, "dimension must be non-negative: %d", dim);
        Checks.requireArgument(maxRows >= 1 && maxRows <= Configuration.MAX_ROWS, "maxRows out of range: %d", maxRows);
        Checks.requireArgument(maxN >= 1 && maxN <= Configuration.MAX_N, "maxN out of range: %d", maxN);
        while (true) {
            int m = 1 + random.nextInt(maxRows);
            int[] n = new int[m];
            int total = 0;
            for (int r = 0; r < m; r++) {
                n[r] = 1 + random.nextInt(maxN);
                total += n[r];
            }
            int k = total - dim;
            if (k < 1 || k > Configuration.MAX_COLS) {
                continue;
            }
            int[] units = new int[total + m];
            int u = 0;
            for (int r = 0; r < m; r++) {
                for (int i = 0; i <= n[r]; i++) {
                    units[u++] = r;
                }
            }
            shuffle(units);
            int[][] q = new int[m][k];
            for (int i = 0; i < units.length; i++) {
                int col = i < k ? i : random.nextInt(k);
                q[units[i]][col]++;
            }
            return Configuration.of(n, q);
        }
    }

    /**
     * Any matrix (usually not Calabi-Yau) of dimension {@code dim}: {@code 1..maxRows} rows,
     * {@code 1 <= n_r <= maxN}, entries {@code 0..maxEntry}, no zero column.
     */
    public Configuration arbitrary(int dim, int maxRows, int maxN, int maxEntry) {
        Checks.requireArgument(maxEntry >= 1, "maxEntry must be positive: %d", maxEntry);
        while (true) {
            int m = 1 + random.nextInt(maxRows);
            int[] n = new int[m];
            int total = 0;
            for (int r = 0; r < m; r++) {
                n[r] = 1 + random.nextInt(maxN);
                total += n[r];
            }
            int k = total - dim;
            if (k < 1 || k > Configuration.MAX_COLS) {
                continue;
            }
            int[][] q = new int[m][k];
            for (int j = 0; j < k; j++) {
                q[random.nextInt(m)][j] = 1 + random.nextInt(maxEntry);
                for (int r = 0; r < m; r++) {
                    if (random.nextInt(3) == 0) {
                        q[r][j] = random.nextInt(maxEntry + 1);
                    }
                }
                if (columnIsZero(q, j)) {
                    q[random.nextInt(m)][j] = 1;
                }
            }
            return Configuration.of(n, q);
        }
    }

    /**
     * {@code c} with {@code count} hyperplane columns added: each raises a random row's dimension by
     * one and adds a column with a single 1 in that row, at a random position. The variety, and so
     * every invariant, is unchanged; Calabi-Yau input stays Calabi-Yau.
     */
    public Configuration withHyperplaneColumns(Configuration c, int count) {
        int[] n = c.dims();
        int[][] q = c.degrees();
        for (int i = 0; i < count; i++) {
            int r = random.nextInt(n.length);
            if (n[r] == Configuration.MAX_N || q[0].length == Configuration.MAX_COLS) {
                break;
            }
            n[r]++;
            int pos = random.nextInt(q[0].length + 1);
            for (int s = 0; s < n.length; s++) {
                int[] row = new int[q[s].length + 1];
                System.arraycopy(q[s], 0, row, 0, pos);
                System.arraycopy(q[s], pos, row, pos + 1, q[s].length - pos);
                row[pos] = s == r ? 1 : 0;
                q[s] = row;
            }
        }
        return Configuration.of(n, q);
    }

    /** A uniformly random permutation of {@code 0..size-1} (Fisher-Yates from the last place down). */
    public int[] permutation(int size) {
        int[] p = new int[size];
        for (int i = 0; i < size; i++) {
            p[i] = i;
        }
        shuffle(p);
        return p;
    }

    /**
     * The same matrix with its rows and then its columns in random order: the same manifold, so every
     * invariant and the canonical form must not change (what the order-independence tests check).
     */
    public Configuration permuted(Configuration c) {
        int[] rows = permutation(c.rows());
        int[] cols = permutation(c.cols());
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

    private static boolean columnIsZero(int[][] q, int j) {
        for (int[] row : q) {
            if (row[j] != 0) {
                return false;
            }
        }
        return true;
    }

    private void shuffle(int[] a) {
        for (int i = a.length - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }
    }
}
