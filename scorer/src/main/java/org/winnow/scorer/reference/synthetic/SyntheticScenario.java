package org.winnow.scorer.reference.synthetic;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import java.util.SplittableRandom;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.scorer.reference.LabelledExample;

/**
 * Seeded random three-dimensional configuration matrices (every row summing to n_r + 1) with a toy
 * label that depends on the matrix only up to row and column order:
 * <pre>
 *   label = m + #{(r, j) : q_rj >= 2 and column j sums to at least 3}
 *   chi   = -2 (sum_j colsum_j^2 - K)            (a toy "chi": even, at most 0)
 * </pre>
 * The label mixes a global count with a local pattern, so a model has to look at the graph, not only
 * at the global features. The toy chi is fed where the real model gets the exact chi.
 */
public final class SyntheticScenario {
    private SyntheticScenario() {}

    /** {@code count} distinct examples (as matrices) drawn with {@code seed}. */
    public static List<LabelledExample> generate(int count, long seed) {
        Checks.requireArgument(count >= 0, "count must not be negative: %s", count);
        SplittableRandom rng = new SplittableRandom(seed);
        Set<Configuration> seen = new LinkedHashSet<>();
        int attempts = 0;
        while (seen.size() < count) {
            Checks.requireState(++attempts < 100 * count + 1000, "could not draw %s distinct examples", count);
            seen.add(draw(rng));
        }
        List<LabelledExample> out = new ArrayList<>(count);
        for (Configuration c : seen) {
            out.add(new LabelledExample(c, toyChi(c), new int[] {toyLabel(c), toyLabel(c) - (int) (toyChi(c) / 2)}));
        }
        return out;
    }

    /** One random matrix: K in 1..5, sum n = K + 3, every column summing to at least 2. */
    public static Configuration draw(SplittableRandom rng) {
        while (true) {
            int k = 1 + rng.nextInt(5);
            int sumN = k + 3;
            int m = 1 + rng.nextInt(Math.min(sumN, 8));
            int[] n = new int[m];
            java.util.Arrays.fill(n, 1);
            for (int extra = sumN - m; extra > 0; extra--) {
                n[rng.nextInt(m)]++;
            }
            int[][] q = new int[m][k];
            for (int r = 0; r < m; r++) {
                for (int unit = 0; unit <= n[r]; unit++) {
                    q[r][rng.nextInt(k)]++;
                }
            }
            boolean ok = true;
            for (int j = 0; j < k && ok; j++) {
                int s = 0;
                for (int r = 0; r < m; r++) {
                    s += q[r][j];
                }
                ok = s >= 2;
            }
            if (ok) {
                return Configuration.of(n, q);
            }
        }
    }

    /** The toy label; see the class comment. */
    public static int toyLabel(Configuration c) {
        int label = c.rows();
        for (int j = 0; j < c.cols(); j++) {
            if (c.colSum(j) < 3) {
                continue;
            }
            for (int r = 0; r < c.rows(); r++) {
                label += c.q(r, j) >= 2 ? 1 : 0;
            }
        }
        return label;
    }

    /** The toy chi; see the class comment. */
    public static long toyChi(Configuration c) {
        long s = 0;
        for (int j = 0; j < c.cols(); j++) {
            s += (long) c.colSum(j) * c.colSum(j);
        }
        return -2 * (s - c.cols());
    }
}
