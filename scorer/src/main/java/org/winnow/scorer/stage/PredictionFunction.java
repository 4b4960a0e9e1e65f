package org.winnow.scorer.stage;

import org.winnow.geometry.Configuration;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Prediction;

/** Asks the model about a candidate. One instance per thread; need not be thread-safe. */
@FunctionalInterface
public interface PredictionFunction {
    Prediction predict(Configuration canonical, ExactInvariants exact);
}
