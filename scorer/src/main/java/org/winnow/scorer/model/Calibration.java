package org.winnow.scorer.model;

import org.winnow.geometry.Checks;

/**
 * How the frozen model turns distances into a vote and a novelty score.
 *
 * <p>{@code looDistances} are, sorted ascending, the distances from every reference point to its
 * {@code noveltyK}-th nearest other reference point of the same h11 (leave one out, within the class;
 * see {@code Trainer.calibrate} for why). A candidate whose
 * {@code noveltyK}-th neighbour lies at distance {@code delta} gets the empirical p-value
 * {@code p = (1 + #{D_i >= delta}) / (N + 1)} and the novelty {@code 1 - p}: near 0 when it sits as close
 * to the reference as reference points sit to each other, near 1 when it is farther out than almost all.
 * Above the 90% quantile {@code u} of the distances the p-value is a peaks-over-threshold fit instead,
 * {@code p = (1 + #{D_i > u}) / (N + 1) * exp(-(delta - u) / tailScale)}, with {@code tailScale} the
 * mean excess of the distances above u. Two reasons: the empirical p-value stops at {@code 1 / (N + 1)}
 * (with 80 reference points a novelty guard of 0.99 could never fire), and with few labels a single
 * far-out reference point (one whose class-mates happen to be unlike it) would otherwise make every
 * distance below its own look ordinary. The fit joins the empirical p-value at u. With
 * {@code tailScale = 0} (no spread above u) the empirical p-value is used everywhere. With fewer than
 * two reference points there is nothing to calibrate against and the novelty is 1.
 *
 * <p>The vote weighs a neighbour at distance d by {@code exp(-(d^2 - d_0^2) / (2 bandwidth^2))}, d_0
 * being the nearest distance, so neighbours well beyond the typical spacing of the reference
 * ({@code bandwidth} is the median leave-one-out distance) stop counting, while a neighbour of another
 * class at a comparable distance lowers the confidence; with {@code bandwidth = 0} the weight is
 * {@code 1 / (d + 1e-12)}.
 *
 * <p>{@code classes} lists the h11 values of the reference in ascending order; {@code classQuantiles[c]}
 * holds, for class c, the leave-one-out distances at {@link #QUANTILES} (for reports, not for voting).
 *
 * @param k neighbours that vote
 * @param noveltyK which neighbour's distance measures novelty
 */
public record Calibration(int k, int noveltyK, double bandwidth, double tailScale, double[] looDistances, int[] classes,
        double[][] classQuantiles) {
    /** The quantile levels of {@link #classQuantiles}. */
    public static final double[] QUANTILES = {0.5, 0.9, 0.99, 1.0};

    public Calibration {
        Checks.requireArgument(k >= 1, "k must be positive: %s", k);
        Checks.requireArgument(noveltyK >= 1, "the novelty neighbour must be positive: %s", noveltyK);
        Checks.requireArgument(bandwidth >= 0, "bandwidth must not be negative: %s", bandwidth);
        Checks.requireArgument(tailScale >= 0, "tail scale must not be negative: %s", tailScale);
        Checks.requireArgument(classes.length == classQuantiles.length, "%s classes but %s quantile rows",
                classes.length, classQuantiles.length);
    }

    /** First index i of the sorted distances with {@code d[i] > x} (strict) or {@code d[i] >= x}. */
    private int firstIndex(double x, boolean strict) {
        double[] d = looDistances;
        int lo = 0;
        int hi = d.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (strict ? d[mid] <= x : d[mid] < x) {
                lo = mid + 1;
            } else {
                hi = mid;
            }
        }
        return lo;
    }

    /** The 90% quantile of the leave-one-out distances, where the fitted tail starts (0 when there are none). */
    public double tailThreshold() {
        double[] d = looDistances;
        return d.length == 0 ? 0 : d[(int) Math.floor(0.9 * (d.length - 1))];
    }

    /** Novelty of a candidate whose {@code noveltyK}-th neighbour is at {@code delta}; see the class comment. */
    public double novelty(double delta) {
        double[] d = looDistances;
        if (d.length == 0) {
            return 1.0; // a single reference point calibrates nothing: vouch for no candidate
        }
        double u = tailThreshold();
        if (delta > u && tailScale > 0) {
            int above = d.length - firstIndex(u, true);
            return 1.0 - (1.0 + above) / (d.length + 1.0) * Math.exp(-(delta - u) / tailScale);
        }
        int atLeast = d.length - firstIndex(delta, false);
        return 1.0 - (1.0 + atLeast) / (d.length + 1.0);
    }
}
