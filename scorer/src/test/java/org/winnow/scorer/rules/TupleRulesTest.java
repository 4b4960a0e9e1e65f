package org.winnow.scorer.rules;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Reason;

/** Rules on the whole four-fold tuple, residue rules on chi, and products. */
class TupleRulesTest {
    private static final ExactInvariants FOUR = new ExactInvariants(4, 1206, 1, 3, 1);
    private static final ExactInvariants PRODUCT = new ExactInvariants(4, 1206, 2, 2, 2);

    private static Prediction tuple(int h11, int h21, int h31, int h22, double confidence, double novelty) {
        return new Prediction(h11, confidence, h21, h31, h22, novelty, "");
    }

    @Test
    void h31AndH22RulesRejectOnlyWhenConfidentAndFamiliar() {
        KeepRules rules = KeepRules.of(List.of("h31=100..150", "h22=..1000"), 0.9, 0.99);
        // (1, 0, 192, 816) is 7:2,3,3's tuple (standard values, from memory; CHECK-VALUES.md).
        assertEquals(Reason.PREDICTED_H31_OUT_OF_RANGE, rules.decide(FOUR, tuple(1, 0, 192, 816, 0.95, 0.1)));
        assertEquals(Reason.KEPT_AS_NOVEL, rules.decide(FOUR, tuple(1, 0, 192, 816, 0.95, 0.995)));
        assertEquals(Reason.KEPT_LOW_CONFIDENCE, rules.decide(FOUR, tuple(1, 0, 192, 816, 0.5, 0.1)));
        assertEquals(Reason.PREDICTED_H22_OUT_OF_RANGE, rules.decide(FOUR, tuple(1, 0, 120, 1100, 0.95, 0.1)));
        assertEquals(Reason.KEPT_IN_RANGE, rules.decide(FOUR, tuple(1, 0, 120, 600, 0.95, 0.1)));
        assertEquals(Reason.KEPT_UNDECIDED, rules.decide(FOUR, Prediction.of(1, 0.95, 0, 0.1, "")));
    }

    @Test
    void aProductIsNeverRejectedOnValuesTheIdentitiesGive() {
        KeepRules rules = KeepRules.of(List.of("h21=..5", "h31=100..150", "h22=..1000"), 0.5, 0.99);
        assertEquals(Reason.KEPT_UNDECIDED, rules.decide(PRODUCT, tuple(2, 50, 300, 1500, 0.95, 0.1)));
        assertEquals(Reason.PREDICTED_H11_OUT_OF_RANGE,
                KeepRules.of(List.of("h11=5..9", "h31=100..150"), 0.5, 0.99).decide(PRODUCT, tuple(2, 50, 300, 1500, 0.95, 0.1)));
    }

    @Test
    void residueRulesOnChi() {
        KeepRules rules = KeepRules.of(List.of("chi%24=0", "h11=1..3"), 0.9, 0.99);
        // 1206 = 24 * 50 + 6: chi/24 is not integral; 1152 = 24 * 48 is.
        assertEquals(Reason.EXACT_CHI_WRONG_RESIDUE, rules.decide(FOUR, tuple(1, 0, 192, 816, 0.1, 1)));
        assertEquals(Reason.KEPT_IN_RANGE, rules.decide(new ExactInvariants(4, 1152, 1, 4, 1), tuple(1, 0, 183, 780, 0.1, 1)));
        // Residues of negative values are taken in 0..M-1: -4 = 6 * (-1) + 2.
        KeepRules two = KeepRules.of(List.of("chi%6=2"), 0.9, 0.99);
        assertEquals(Reason.KEPT_IN_RANGE, two.decide(new ExactInvariants(4, -4, 1, 1, 1), tuple(1, 0, 1, 1, 0.1, 1)));
        assertEquals(Reason.EXACT_CHI_WRONG_RESIDUE, two.decide(new ExactInvariants(4, -3, 1, 1, 1), tuple(1, 0, 1, 1, 0.1, 1)));
        // An exact range comes first, then the residue.
        assertEquals(Reason.EXACT_CHI_OUT_OF_RANGE, KeepRules.of(List.of("chi%24=0", "chi=..1000"), 0.9, 0.99)
                .decide(FOUR, tuple(1, 0, 192, 816, 0.1, 1)));
        assertEquals(List.of("keep h11=1..3", "keep chi%24=0", "min-confidence 0.9", "novelty 0.99"), rules.describe());
        RulesFile.Contents c = RulesFile.parse(rules.describe(), "described");
        assertEquals(rules, KeepRules.of(c.keeps(), c.minConfidence().getAsDouble(), c.noveltyGuard().getAsDouble()));
    }

    @Test
    void badResidueRulesFailWithOneLineNamingTheRule() {
        assertMessage("rule 'h11%2=0': only chi takes a residue rule (chi%M=R)", () -> KeepRules.of(List.of("h11%2=0"), 0.9, 0.99));
        assertMessage("rule 'chi%1=0': the modulus must be at least 2", () -> KeepRules.of(List.of("chi%1=0"), 0.9, 0.99));
        assertMessage("rule 'chi%24=30': the residue must be in 0..23", () -> KeepRules.of(List.of("chi%24=30"), 0.9, 0.99));
        assertMessage("rule 'chi%x=0': 'x' is not a whole number", () -> KeepRules.of(List.of("chi%x=0"), 0.9, 0.99));
        assertMessage("rule 'chi%24': expected INVARIANT%M=R, such as chi%24=0", () -> KeepRules.of(List.of("chi%24"), 0.9, 0.99));
        assertMessage("rule 'x%2=0': unknown invariant 'x' (known: h11, h21, h31, h22, chi, rows, cols, dim, blocks)",
                () -> KeepRules.of(List.of("x%2=0"), 0.9, 0.99));
        assertMessage("rule 'chi%12=0': chi already has the rule 'chi%24=0'; give one residue per invariant",
                () -> KeepRules.of(List.of("chi%24=0", "chi%12=0"), 0.9, 0.99));
        assertMessage("r.txt:2: rule 'chi%0=0': the modulus must be at least 2",
                () -> RulesFile.parse(List.of("keep chi%24=0", "keep chi%0=0"), "r.txt"));
        assertMessage("r.txt:3: rule 'keep chi%12=0': chi already has a residue at r.txt:1; give one residue per invariant",
                () -> RulesFile.parse(List.of("keep chi%24=0", "keep chi=0..2000", "keep chi%12=0"), "r.txt"));
    }

    private static void assertMessage(String expected, org.junit.jupiter.api.function.Executable e) {
        RuleException ex = assertThrows(RuleException.class, e);
        assertEquals(expected, ex.getMessage());
    }
}
