package org.winnow.geometry.hodge;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.invariants.RandomConfigurations;

class RefinedH11EstimatorTest {
    @Test
    void settledPagesKeepTheFirstPageAndUnsettledOnesTakeTheEnginesProof() {
        SplittableRandom rng = new SplittableRandom(23);
        RandomConfigurations gen = new RandomConfigurations(rng);
        RefinedH11Estimator refined = new RefinedH11Estimator(() -> 0L);
        H11Estimator firstPage = new H11Estimator();
        HodgeEngine full = HodgeEngine.standard();
        int settled = 0;
        int proved = 0;
        for (int trial = 0; trial < 3000 && (proved < 4 || settled < 30); trial++) {
            Configuration c = gen.calabiYau(3, 5, 3);
            if (c.cols() > 8) {
                continue;
            }
            int value = refined.estimate(c);
            int estimate = firstPage.estimate(c);
            if (firstPage.settled()) {
                assertEquals(RefinedH11Estimator.Source.FIRST_PAGE, refined.source(), c.toText());
                assertEquals(estimate, value, c.toText());
                settled++;
                continue;
            }
            // The oracle: the full engine, exact backend included.
            HodgeResult exact = full.compute(c);
            if (refined.source() == RefinedH11Estimator.Source.ENGINE_EXACT && exact.h11() != null
                    && exact.h11().isExact()) {
                assertEquals(exact.h11().value(), value, c.toText());
                proved++;
            }
        }
        assertTrue(settled >= 30, "settled cases seen: " + settled);
        assertTrue(proved >= 1, "no unsettled case was proved by the engine in the sample");
    }

    @Test
    void aSettledFirstPageAgreesWithTheFullEngineOnRandomThreeAndFourFolds() {
        // Settled pages make every line bundle number exact; what is left is the assumption that
        // H^2(N*) -> H^2(Omega_A|X) has maximal rank. This checks it against the full engine (the oracle).
        SplittableRandom rng = new SplittableRandom(29);
        RandomConfigurations gen = new RandomConfigurations(rng);
        H11Estimator firstPage = new H11Estimator();
        HodgeEngine full = HodgeEngine.standard();
        int checked = 0;
        for (int trial = 0; trial < 600 && checked < 120; trial++) {
            Configuration c = gen.calabiYau(3 + trial % 2, 4, 3);
            if (c.cols() > 8) {
                continue;
            }
            int estimate = firstPage.estimate(c);
            if (!firstPage.settled()) {
                continue;
            }
            HodgeResult exact = full.compute(c);
            if (exact.h11() != null && exact.h11().isExact()) {
                assertEquals(exact.h11().value(), estimate, c.toText());
                checked++;
            }
        }
        assertTrue(checked >= 60, "settled cases checked against the engine: " + checked);
    }

    @Test
    void thePublishedNonFavourableThreeFoldsAreSettled() {
        // "New Calabi-Yau Manifolds with Small Hodge Numbers", arXiv:0809.4681 (2008): h11 = 14 and 19.
        RefinedH11Estimator refined = new RefinedH11Estimator();
        assertEquals(14, refined.estimate(Configuration.parse("3:3,0,1/3:0,3,1")));
        assertEquals(RefinedH11Estimator.Source.FIRST_PAGE, refined.source());
        assertEquals(19, refined.estimate(Configuration.parse("2:3,0/2:0,3/1:1,1")));
        assertEquals(RefinedH11Estimator.Source.FIRST_PAGE, refined.source());
    }
}
