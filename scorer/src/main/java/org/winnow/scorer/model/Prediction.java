package org.winnow.scorer.model;

/**
 * What the model says about one candidate.
 *
 * @param h11 the predicted h11 (the winner of the distance-weighted vote)
 * @param confidence the winner's share of the vote weight, in (0, 1]
 * @param h21 for a three-fold, {@code h11 - chi/2} exactly; for a four-fold, from the nearest voting
 *     neighbour of the winning class whose tuple satisfies {@code chi = 48 + 6(h11 - h21 + h31)}; null
 *     when no consistent value exists (also for other dimensions)
 * @param h31 four-folds only, as h21; null otherwise
 * @param h22 four-folds only, {@code 44 + 4 h11 - 2 h21 + 4 h31}; null otherwise
 * @param novelty calibrated novelty in [0, 1): near 1 means unlike the reference (see {@link Calibration})
 * @param neighbourH11 the h11 labels of the voting neighbours, nearest first
 * @param nearestReference the text form of the nearest reference configuration
 * @param nearestDistance its distance in the embedding
 */
public record Prediction(int h11, double confidence, Integer h21, Integer h31, Integer h22, double novelty,
        int[] neighbourH11, String nearestReference, double nearestDistance) {
    public Prediction {
        neighbourH11 = neighbourH11.clone();
    }

    @Override
    public int[] neighbourH11() {
        return neighbourH11.clone();
    }
}
