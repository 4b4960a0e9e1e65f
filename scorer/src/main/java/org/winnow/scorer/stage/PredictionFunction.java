package org.winnow.scorer.stage;

import org.winnow.geometry.Configuration;
import org.winnow.pipeline.ExactInvariants;

/** Asks the model about a candidate. One instance per thread; need not be thread-safe. */
@FunctionalInterface
public interface PredictionFunction {
    Predicted predict(Configuration canonical, ExactInvariants exact);
}
