package org.winnow.producer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.hodge.KnownValue;
import org.winnow.geometry.hodge.RefinedTupleEstimator;
import org.winnow.geometry.hodge.TupleEstimate;
import org.winnow.geometry.invariants.InvariantCalculator;

/**
 * The tuple estimator against the full Hodge engine on every matrix of an enumerated space under the base rules
 * (which keep the hyperplane columns, identities and redundant rows the lossless rules drop, so the first pages
 * meet the awkward shapes too): no value marked proved is wrong, no proved interval misses the exact value, and
 * the first page never contradicts the engine. Both the cheap form ({@code estimateFirstPage}) and the refined
 * one ({@code estimate}) are checked; they share no code with the engine's spectral sequence.
 */
class TupleAgainstEngineOnBaseSpaceTest {
    @ParameterizedTest(name = "d = {0}, rows <= {1}")
    @CsvSource({"3, 4", "4, 3"})
    void noProvedValueIsWrongAndNoBoundMissesOnAWholeBaseRuleSpace(int dim, int maxRows) {
        List<Configuration> space = new ArrayList<>();
        new Enumerator().run(Bounds.complete(dim).withRows(1, maxRows), ExclusionSet.BASE, ShardSpec.ALL,
                e -> space.add(e.configuration()));
        RefinedTupleEstimator tuple = new RefinedTupleEstimator(() -> 0L);
        HodgeEngine full = HodgeEngine.standard();
        InvariantCalculator invariants = new InvariantCalculator();
        long contradictionsBefore = RefinedTupleEstimator.contradictions();
        int exact = 0;
        int proved = 0;
        for (Configuration c : space) {
            HodgeResult oracle = full.compute(c);
            if (!oracle.isExact()) {
                continue;
            }
            exact++;
            long[] truth = dim == 3 ? new long[] {oracle.h11().value(), oracle.h21().value()}
                    : new long[] {oracle.h11().value(), oracle.h21().value(), oracle.h31().value(), oracle.h22().value()};
            long chi = invariants.chi(c);
            for (TupleEstimate e : List.of(tuple.estimateFirstPage(c, chi), tuple.estimate(c, chi))) {
                KnownValue[] v = {e.h11(), e.h21(), e.h31(), e.h22()};
                for (int i = 0; i < truth.length; i++) {
                    String where = c.toText() + " value " + i + " " + v[i] + " (" + e.method() + ") vs exact " + truth[i];
                    switch (v[i].basis()) {
                        case PROVED -> {
                            assertEquals(truth[i], v[i].value(), where);
                            proved++;
                        }
                        case BOUNDED -> assertTrue(v[i].lo() <= truth[i] && truth[i] <= v[i].hi(), where);
                        case ESTIMATED -> { }
                    }
                }
            }
        }
        assertEquals(contradictionsBefore, RefinedTupleEstimator.contradictions(), "first page and engine contradicted");
        // The whole space is labelled exactly by the engine, and most of its values are proved cheaply.
        assertTrue(exact > 1000, "matrices with exact labels: " + exact + " of " + space.size());
        assertTrue(proved > exact, "proved values: " + proved);
    }
}
