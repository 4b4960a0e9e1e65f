package org.winnow.pipeline;

import org.winnow.geometry.Checks;

/**
 * What the frozen model says about one candidate: the one record of a prediction, from the model's
 * predictor through the scorer's rules to the sink's lines and the wire.
 *
 * @param h11              predicted h^{1,1} (the winner of the neighbour vote)
 * @param confidence       the winner's share of the vote weight, in [0, 1]
 * @param h21              h^{2,1}: for a three-fold {@code h11 - chi/2} exactly; for a four-fold from the
 *                         nearest voting neighbour of the winning class whose tuple satisfies
 *                         {@code chi = 48 + 6(h11 - h21 + h31)}; null when not determined (no consistent
 *                         value, another dimension, or a candidate of another dimension than the model's)
 * @param h31              four-folds only, as h21; null otherwise
 * @param h22              four-folds only, {@code 44 + 4 h11 - 2 h21 + 4 h31}; null otherwise
 * @param novelty          calibrated novelty in [0, 1]: near 1 means unlike the reference set
 * @param nearestReference canonical text of the nearest reference configuration, or "" if none
 */
public record Prediction(int h11, double confidence, Integer h21, Integer h31, Integer h22, double novelty,
        String nearestReference) {
    public Prediction {
        Checks.requireArgument(confidence >= 0 && confidence <= 1, "confidence must be in [0, 1]: %s", confidence);
        Checks.requireArgument(novelty >= 0 && novelty <= 1, "novelty must be in [0, 1]: %s", novelty);
        nearestReference = nearestReference == null ? "" : nearestReference;
    }

    /** A prediction without the four-fold numbers h31 and h22 (a three-fold, or a stand-in model). */
    public static Prediction of(int h11, double confidence, Integer h21, double novelty, String nearestReference) {
        return new Prediction(h11, confidence, h21, null, null, novelty, nearestReference);
    }
}
