package org.winnow.pipeline;

import org.winnow.geometry.Checks;

/**
 * What the frozen model predicts for a candidate.
 *
 * @param h11              predicted h^{1,1}
 * @param confidence       the share of the neighbour vote for {@code h11}, in [0, 1]
 * @param h21              h^{2,1} derived from {@code h11} and the exact Euler characteristic when the
 *                         dimension is 3; null when it is not determined (other dimensions)
 * @param nearestReference canonical text of the nearest reference configuration, or "" if none
 */
public record Estimate(int h11, double confidence, Integer h21, String nearestReference) {
    public Estimate {
        Checks.requireArgument(confidence >= 0 && confidence <= 1, "confidence must be in [0, 1]: %s", confidence);
        nearestReference = nearestReference == null ? "" : nearestReference;
    }
}
