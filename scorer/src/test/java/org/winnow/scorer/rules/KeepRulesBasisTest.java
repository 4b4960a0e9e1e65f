package org.winnow.scorer.rules;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.hodge.Basis;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Verdict;

/** Rejection by basis: proved, bounded, or a confident vote on a familiar candidate. */
class KeepRulesBasisTest {
    private static final ExactInvariants FOUR = new ExactInvariants(4, 1206, 1, 3, 1);

    private static PredictedValue bounded(long value, long lo, long hi, double confidence) {
        return new PredictedValue(value, Basis.BOUNDED, lo, hi, confidence);
    }

    private static Prediction tuple(PredictedValue h11, PredictedValue h31, boolean product) {
        return tuple(h11, h31, product, 0);
    }

    private static Prediction tuple(PredictedValue h11, PredictedValue h31, boolean product, double novelty) {
        PredictedValue h21 = PredictedValue.estimated(5, 0.5);
        PredictedValue h22 = PredictedValue.estimated(900, 0.5);
        return new Prediction(h11, h21, h31, h22, product, novelty, "");
    }

    private static Prediction nov(Prediction p, double novelty) {
        return new Prediction(p.h11Value(), p.h21Value(), p.h31Value(), p.h22Value(), p.product(), novelty, "");
    }

    @Test
    void aProvedValueOutsideRejectsEvenANovelUnconfidentCandidate() {
        KeepRules rules = KeepRules.of(List.of("h31=100..150"), 0.85, 0.99);
        Prediction e = tuple(PredictedValue.proved(1), PredictedValue.proved(192), false);
        assertEquals(Reason.PROVED_H31_OUT_OF_RANGE, rules.decide(FOUR, nov(e, 1.0)));
        assertEquals(Reason.KEPT_IN_RANGE,
                rules.decide(FOUR, tuple(PredictedValue.proved(1), PredictedValue.proved(120), false, 1.0)));
    }

    @Test
    void aBoundedValueRejectsOnlyWhenItsWholeIntervalIsOutside() {
        KeepRules rules = KeepRules.of(List.of("h31=100..150"), 0.85, 0.99);
        Prediction outside = tuple(PredictedValue.proved(1), bounded(180, 160, 200, 0.2), false);
        assertEquals(Reason.BOUNDED_H31_OUT_OF_RANGE, rules.decide(FOUR, nov(outside, 1.0)));
        // The interval reaches into the range: only the vote's confidence and familiarity can reject.
        Prediction overlapping = tuple(PredictedValue.proved(1), bounded(180, 140, 200, 0.2), false);
        assertEquals(Reason.KEPT_AS_NOVEL, rules.decide(FOUR, nov(overlapping, 1.0)));
        assertEquals(Reason.KEPT_LOW_CONFIDENCE, rules.decide(FOUR, nov(overlapping, 0.1)));
        Prediction confident = tuple(PredictedValue.proved(1), bounded(180, 140, 200, 0.88), false);
        assertEquals(Reason.PREDICTED_H31_OUT_OF_RANGE, rules.decide(FOUR, nov(confident, 0.1)));
    }

    @Test
    void aProofWinsOverAnEarlierRuleThatOnlyAPredictionBreaks() {
        KeepRules rules = KeepRules.of(List.of("h11=2..5", "h31=100..150"), 0.85, 0.99);
        Prediction e = tuple(PredictedValue.estimated(9, 0.88), PredictedValue.proved(192), false);
        assertEquals(Reason.PROVED_H31_OUT_OF_RANGE, rules.decide(FOUR, nov(e, 0.1)));
    }

    @Test
    void eachUnprovedValueRejectsOnItsOwnConfidence() {
        KeepRules rules = KeepRules.of(List.of("h11=2..5", "h31=100..150"), 0.85, 0.99);
        // h11 outside but unsure; h31 outside and sure: the rejection names h31.
        Prediction e = tuple(PredictedValue.estimated(9, 0.6), PredictedValue.estimated(192, 0.88), false);
        assertEquals(Reason.PREDICTED_H31_OUT_OF_RANGE, rules.decide(FOUR, nov(e, 0.1)));
        Prediction unsure = tuple(PredictedValue.estimated(9, 0.6), PredictedValue.estimated(192, 0.6), false);
        assertEquals(Reason.KEPT_LOW_CONFIDENCE, rules.decide(FOUR, nov(unsure, 0.1)));
    }

    @Test
    void aProductNeverRejectsOnValuesTheIdentitiesGive() {
        KeepRules rules = KeepRules.of(List.of("h22=1000..2000", "h21=10..20"), 0.5, 0.99);
        Prediction product = new Prediction(PredictedValue.estimated(2, 0.8), PredictedValue.estimated(50, 0.8),
                PredictedValue.estimated(300, 0.8), PredictedValue.estimated(900, 0.8), true, 0.0, "");
        assertEquals(Reason.KEPT_UNDECIDED, rules.decide(FOUR, nov(product, 0.0)));
        Prediction single = new Prediction(product.h11Value(), product.h21Value(), product.h31Value(), product.h22Value(),
                false, 0.0, "");
        assertEquals(Reason.PREDICTED_H22_OUT_OF_RANGE, rules.decide(FOUR, nov(single, 0.0)));
    }

    private static void assertMessage(String expected, org.junit.jupiter.api.function.Executable e) {
        RuleException ex = assertThrows(RuleException.class, e);
        assertEquals(expected, ex.getMessage());
    }

    /** The decision by basis against a direct reading of the rules, on seeded random tuples. */
    @Test
    void decisionsByBasisAgreeWithTheRuleTextOnRandomInputs() {
        KeepRules rules = KeepRules.of(List.of("h11=2..6", "h31=50..200", "chi=..2000"), 0.85, 0.95);
        SplittableRandom rnd = new SplittableRandom(20261205L);
        int[] byKind = new int[3];
        for (int i = 0; i < 20_000; i++) {
            PredictedValue h11 = random(rnd, 10);
            PredictedValue h31 = random(rnd, 300);
            boolean product = rnd.nextInt(8) == 0;
            long chi = 600 + 6L * rnd.nextInt(300);
            double nov = rnd.nextInt(101) / 100.0;
            Reason r = rules.decide(new ExactInvariants(4, chi, 2, 2, 1), tuple(h11, h31, product, nov));
            // A product's h31 comes through identities that fail for products: its rule never decides.
            boolean h31Counts = !product;
            boolean provedOut = outsideProved(h11, 2, 6) || h31Counts && outsideProved(h31, 50, 200);
            boolean unprovedOut = h11.value() < 2 || h11.value() > 6 || h31Counts && (h31.value() < 50 || h31.value() > 200);
            boolean confidentOut = (h11.value() < 2 || h11.value() > 6) && h11.confidence() >= 0.85
                    || h31Counts && (h31.value() < 50 || h31.value() > 200) && h31.confidence() >= 0.85;
            Verdict expected = chi > 2000 || provedOut || unprovedOut && nov < 0.95 && confidentOut ? Verdict.REJECT : Verdict.KEEP;
            assertEquals(expected, r.verdict(), h11 + " " + h31 + " chi=" + chi + " nov=" + nov + " -> " + r.code());
            if (r.code().startsWith("proved")) {
                byKind[0]++;
            } else if (r.code().startsWith("bounded")) {
                byKind[1]++;
            } else if (r.code().startsWith("predicted")) {
                byKind[2]++;
                assertTrue(nov < 0.95, "rejected a novel candidate on an unproved value");
            }
        }
        assertTrue(byKind[0] > 100 && byKind[1] > 100 && byKind[2] > 100, "each kind seen: " + java.util.Arrays.toString(byKind));
    }

    private static boolean outsideProved(PredictedValue v, long lo, long hi) {
        return v.basis() != Basis.ESTIMATED && (v.hi() < lo || v.lo() > hi);
    }

    private static PredictedValue random(SplittableRandom rnd, int range) {
        long v = rnd.nextInt(range);
        double c = rnd.nextInt(100) / 100.0;
        return switch (rnd.nextInt(3)) {
            case 0 -> PredictedValue.proved(v);
            case 1 -> {
                long lo = Math.max(0, v - rnd.nextInt(1, range / 4));
                yield new PredictedValue(v, Basis.BOUNDED, lo, v + rnd.nextInt(1, range / 4), c);
            }
            default -> PredictedValue.estimated(v, c);
        };
    }
}
