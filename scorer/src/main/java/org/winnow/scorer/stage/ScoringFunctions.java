package org.winnow.scorer.stage;

/**
 * Makes the per-thread scoring parts. Called once by each worker, on its own thread, when its stage
 * instance opens; must itself be thread-safe (it usually shares one loaded model).
 */
public interface ScoringFunctions {
    /** A fresh invariant calculator for the calling thread. */
    InvariantFunction newInvariants();

    /** A fresh predictor for the calling thread. */
    PredictionFunction newPredictions();

    /** The checksum of the model behind the predictions, for the manifest. */
    String modelChecksum();

    /** The per-candidate budget of the opt-in proof step, or null when it is off (the default). */
    default java.time.Duration proofBudget() {
        return null;
    }

    /** The model file these functions were loaded from, as an absolute path, or null when not from a file. */
    default String modelFile() {
        return null;
    }
}
