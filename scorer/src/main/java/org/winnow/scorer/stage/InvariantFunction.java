package org.winnow.scorer.stage;

import org.winnow.geometry.Configuration;
import org.winnow.pipeline.ExactInvariants;

/** Computes the cheap exact invariants of a candidate. One instance per thread; need not be thread-safe. */
@FunctionalInterface
public interface InvariantFunction {
    ExactInvariants compute(Configuration canonical);
}
