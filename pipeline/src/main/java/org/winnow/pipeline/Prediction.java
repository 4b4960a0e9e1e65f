package org.winnow.pipeline;

import java.util.Objects;
import org.winnow.geometry.Checks;

/**
 * What the scorer predicts for one candidate: the one record of a prediction, from the model's predictor
 * through the scorer's rules to the sink's lines and the wire. Every Hodge number carries how it is known
 * ({@link PredictedValue}: proved, bounded or estimated) and a confidence that is 1 only for a proof.
 *
 * @param h11Value         h^{1,1}
 * @param h21Value         h^{2,1}; null when not determined
 * @param h31Value         h^{3,1}; four-folds only, null otherwise or when not determined
 * @param h22Value         h^{2,2}; four-folds only, null otherwise or when not determined
 * @param product          true for a block-diagonal candidate: identities of full holonomy fail for it, so
 *                         values derived through them (h21, h31, h22) never reject it
 * @param novelty          calibrated novelty in [0, 1]: near 1 means unlike the reference set
 * @param nearestReference canonical text of the nearest reference configuration, or "" if none
 * @param proof            what the opt-in proof step did for this candidate
 */
public record Prediction(PredictedValue h11Value, PredictedValue h21Value, PredictedValue h31Value,
        PredictedValue h22Value, boolean product, double novelty, String nearestReference, Proof proof)
        implements HodgeValues {
    public Prediction {
        Objects.requireNonNull(h11Value, "h11Value");
        Objects.requireNonNull(proof, "proof");
        Checks.requireArgument(novelty >= 0 && novelty <= 1, "novelty must be in [0, 1]: %s", novelty);
        nearestReference = nearestReference == null ? "" : nearestReference;
    }

    /** A prediction no proof step has looked at. */
    public Prediction(PredictedValue h11Value, PredictedValue h21Value, PredictedValue h31Value, PredictedValue h22Value,
            boolean product, double novelty, String nearestReference) {
        this(h11Value, h21Value, h31Value, h22Value, product, novelty, nearestReference, Proof.NOT_ATTEMPTED);
    }

    /** This prediction with the proof step's outcome. */
    public Prediction withProof(Proof outcome) {
        return new Prediction(h11Value, h21Value, h31Value, h22Value, product, novelty, nearestReference, outcome);
    }

    /**
     * A prediction with nothing proved: every given value estimated with one confidence, kept below 1
     * (which only a proof shows).
     */
    public Prediction(int h11, double confidence, Integer h21, Integer h31, Integer h22, double novelty,
            String nearestReference) {
        this(unproved(h11, confidence), unproved(h21, confidence), unproved(h31, confidence), unproved(h22, confidence),
                false, novelty, nearestReference);
    }

    private static PredictedValue unproved(Integer v, double confidence) {
        Checks.requireArgument(confidence >= 0 && confidence <= 1, "confidence must be in [0, 1]: %s", confidence);
        return v == null ? null : PredictedValue.estimated(v, Math.min(confidence, Math.nextDown(1.0)));
    }

    /** A prediction without the four-fold numbers h31 and h22 (a three-fold, or a stand-in model). */
    public static Prediction of(int h11, double confidence, Integer h21, double novelty, String nearestReference) {
        return new Prediction(h11, confidence, h21, null, null, novelty, nearestReference);
    }
}
