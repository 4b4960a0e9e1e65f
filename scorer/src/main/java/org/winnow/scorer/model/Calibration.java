package org.winnow.scorer.model;

import org.winnow.geometry.Checks;

/**
 * How the frozen model turns distances into a vote and a novelty score.
 *
 * <p>{@code looDistances} are, sorted ascending, the distances from every reference point to its
 * {@code noveltyK}-th nearest other reference point (leave one out). A candidate whose
 * {@code noveltyK}-th neighbour lies at distance {@code delta} gets the empirical p-value
 * {@code p = (1 + #{D_i >= delta}) / (N + 1)} and the novelty {@code 1 - p}: near 0 when it sits as close
 * to the reference as reference points sit to each other, near 1 when it is farther out than almost all.
 * Beyond the largest leave-one-out distance {@code D_max} the empirical p-value would stop at
 * {@code 1 / (N + 1)} (with 80 reference points a novelty guard of 0.99 could never fire), so there it
 * continues as an exponential tail, {@code p = exp(-(delta - D_max) / tailScale) / (N + 1)}, with
 * {@code tailScale} the mean excess of the distances above their 90% quantile (a peaks-over-threshold
 * fit). With fewer than two reference points there is nothing to calibrate against and the novelty is 1.
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

    /** Novelty of a candidate whose {@code noveltyK}-th neighbour is at {@code delta}; see the class comment. */
    public double novelty(double delta) {
        double[] d = looDistances;
        if (d.length == 0) {
            return 1.0; // a single reference point calibrates nothing: vouch for no candidate
        }
        int lo = 0;
        int hi = d.length;
        while (lo < hi) { // first index with d[i] >= delta
            int mid = (lo + hi) >>> 1;
            if (d[mid] < delta) {
                lo = mid + 1;
            } else {
                hi = mid;
            }
        }
        int atLeast = d.length - lo;
        double max = d[d.length - 1];
        if (atLeast == 0 && tailScale > 0) {
            return 1.0 - Math.exp(-(delta - max) / tailScale) / (d.length + 1.0);
        }
        return 1.0 - (1.0 + atLeast) / (d.length + 1.0);
    }
}
