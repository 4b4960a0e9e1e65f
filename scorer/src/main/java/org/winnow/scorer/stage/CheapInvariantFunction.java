package org.winnow.scorer.stage;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.CheapInvariants;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.pipeline.ExactInvariants;

/** The exact invariants from the geometry module's calculator; one instance (and calculator) per thread. */
public final class CheapInvariantFunction implements InvariantFunction {
    private final InvariantCalculator calculator = new InvariantCalculator();

    @Override
    public ExactInvariants compute(Configuration canonical) {
        CheapInvariants c = calculator.compute(canonical);
        return new ExactInvariants(c.dim(), c.chi(), canonical.rows(), canonical.cols(), c.blocks());
    }
}
