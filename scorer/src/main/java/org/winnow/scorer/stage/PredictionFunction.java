package org.winnow.scorer.stage;

import org.winnow.geometry.Configuration;
import java.time.Duration;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Prediction;

/** Asks the model about a candidate. One instance per thread; need not be thread-safe. */
@FunctionalInterface
public interface PredictionFunction {
    Prediction predict(Configuration canonical, ExactInvariants exact);

    /**
     * True iff the last {@link #predict} left some value wider than the model's complete tuple would (the
     * engine was deferred: a scan's saving), so that {@link #complete} may prove more. False by default.
     */
    default boolean lastDeferred() {
        return false;
    }

    /**
     * The prediction of {@link #predict} with nothing deferred, for a candidate whose verdict hinges on a
     * value the deferred one left open. By default nothing is deferred, so this is {@link #predict}.
     */
    default Prediction complete(Configuration canonical, ExactInvariants exact) {
        return predict(canonical, exact);
    }

    /**
     * The proof step: {@code predicted} with what an exact computation proves within {@code budget}, marked
     * {@link Proof#OUT_OF_TIME} when the time ran out and {@link Proof#UNSETTLED} otherwise (the caller
     * upgrades that to settled when every value it needs is proved). By default nothing can be proved
     * here, so the prediction comes back unchanged and unsettled.
     */
    default Prediction prove(Configuration canonical, ExactInvariants exact, Prediction predicted, Duration budget) {
        return predicted.withProof(Proof.UNSETTLED);
    }
}
