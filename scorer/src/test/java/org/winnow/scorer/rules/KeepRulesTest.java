package org.winnow.scorer.rules;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Keepable;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Verdict;

class KeepRulesTest {
    private static final ExactInvariants EXACT = new ExactInvariants(3, -200, 1, 1, 1);

    @Test
    void rangesParseInEveryForm() {
        assertEquals(new RangeRule(Keepable.H11, 4, 6), RangeRule.parse("h11=4..6"));
        assertEquals(new RangeRule(Keepable.CHI, -60, 0), RangeRule.parse(" chi = -60 .. 0 "));
        assertEquals(new RangeRule(Keepable.ROWS, 3, 3), RangeRule.parse("rows=3"));
        assertEquals(new RangeRule(Keepable.COLS, 2, Long.MAX_VALUE), RangeRule.parse("cols=2.."));
        assertEquals(new RangeRule(Keepable.H21, Long.MIN_VALUE, 50), RangeRule.parse("H21=..50"));
        assertEquals("h11=4..6", RangeRule.parse("h11=4..6").toString());
        assertEquals("cols=2..", RangeRule.parse("cols=2..").toString());
        assertEquals("rows=3", RangeRule.parse("rows=3").toString());
    }

    @Test
    void badRulesFailWithOneLineNamingTheRule() {
        assertMessage("rule 'h12=1..2': unknown invariant 'h12' (known: h11, h21, h31, h22, chi, rows, cols, dim, blocks)",
                () -> RangeRule.parse("h12=1..2"));
        assertMessage("rule 'h11=6..4': empty range, 6 > 4", () -> RangeRule.parse("h11=6..4"));
        assertMessage("rule 'h11=a..4': 'a' is not a whole number", () -> RangeRule.parse("h11=a..4"));
        assertMessage("rule 'h11': expected INVARIANT=LO..HI, such as h11=4..6", () -> RangeRule.parse("h11"));
        assertMessage("rule 'h11=..': the range needs at least one bound", () -> RangeRule.parse("h11=.."));
        assertMessage("rule 'h11=5': h11 already has the rule 'h11=1..3'; give one range per invariant",
                () -> KeepRules.of(List.of("h11=1..3", "h11=5"), 0.9, 0.99));
        assertMessage("rule 'min-confidence 1.5': must be in [0, 1]", () -> KeepRules.of(List.of(), 1.5, 0.99));
        assertMessage("rule 'novelty 0.0': must be in (0, 1]", () -> KeepRules.of(List.of(), 0.5, 0));
    }

    private static void assertMessage(String expected, org.junit.jupiter.api.function.Executable e) {
        RuleException ex = assertThrows(RuleException.class, e);
        assertEquals(expected, ex.getMessage());
        assertTrue(!ex.getMessage().contains("\n"));
    }

    @Test
    void exactRangesRejectWhateverThePredictionSays() {
        KeepRules rules = KeepRules.of(List.of("h11=1..100", "chi=-100..0"), 0.9, 0.99);
        // Even a maximally novel, unconfident candidate is rejected on an exact invariant.
        assertEquals(Reason.EXACT_CHI_OUT_OF_RANGE, rules.decide(EXACT, Prediction.of(5, 0.1, 105, 1.0, "")));
        assertEquals(Reason.KEPT_IN_RANGE,
                rules.decide(new ExactInvariants(3, -50, 1, 1, 1), Prediction.of(5, 0.1, 30, 1.0, "")));
    }

    @Test
    void aPredictionRejectsOnlyWhenConfidentAndFamiliar() {
        KeepRules rules = KeepRules.of(List.of("h11=4..6"), 0.9, 0.99);
        assertEquals(Reason.PREDICTED_H11_OUT_OF_RANGE, rules.decide(EXACT, Prediction.of(9, 0.95, null, 0.5, "")));
        assertEquals(Reason.KEPT_AS_NOVEL, rules.decide(EXACT, Prediction.of(9, 0.95, null, 0.99, "")));
        assertEquals(Reason.KEPT_LOW_CONFIDENCE, rules.decide(EXACT, Prediction.of(9, 0.89, null, 0.5, "")));
        // At exactly the threshold the prediction counts as confident.
        assertEquals(Reason.PREDICTED_H11_OUT_OF_RANGE, rules.decide(EXACT, Prediction.of(9, 0.9, null, 0.5, "")));
        assertEquals(Reason.KEPT_IN_RANGE, rules.decide(EXACT, Prediction.of(5, 0.95, null, 0.5, "")));
    }

    @Test
    void anUndeterminedPredictionNeverRejects() {
        KeepRules rules = KeepRules.of(List.of("h21=10..20"), 0.5, 0.99);
        assertEquals(Reason.KEPT_UNDECIDED, rules.decide(new ExactInvariants(4, 0, 1, 1, 1), Prediction.of(5, 1.0, null, 0, "")));
        assertEquals(Reason.PREDICTED_H21_OUT_OF_RANGE, rules.decide(EXACT, Prediction.of(5, 1.0, 105, 0, "")));
    }

    /** The decision against a direct reading of the rule text, on seeded random inputs. */
    @Test
    void decisionsAgreeWithTheRuleTextOnRandomInputs() {
        KeepRules rules = KeepRules.of(List.of("h11=3..7", "chi=-120..-20", "h21=20..60", "rows=..3"), 0.8, 0.95);
        SplittableRandom rnd = new SplittableRandom(20261201L);
        for (int i = 0; i < 20_000; i++) {
            long chi = -200 + rnd.nextInt(220);
            int rows = 1 + rnd.nextInt(5);
            int h11 = rnd.nextInt(12);
            Integer h21 = rnd.nextInt(4) == 0 ? null : h11 - (int) (chi / 2);
            double conf = rnd.nextInt(11) / 10.0;
            double nov = rnd.nextInt(101) / 100.0;
            Reason r = rules.decide(new ExactInvariants(3, chi, rows, 2, 1), Prediction.of(h11, conf, h21, nov, ""));
            boolean exactOk = chi >= -120 && chi <= -20 && rows <= 3;
            boolean predictedOut = h11 < 3 || h11 > 7 || (h21 != null && (h21 < 20 || h21 > 60));
            boolean mayReject = conf >= 0.8 && nov < 0.95;
            Verdict expected = !exactOk || (predictedOut && mayReject) ? Verdict.REJECT : Verdict.KEEP;
            assertEquals(expected, r.verdict(), "chi=" + chi + " rows=" + rows + " h11=" + h11 + " h21=" + h21
                    + " conf=" + conf + " nov=" + nov + " -> " + r.code());
            if (r.verdict() == Verdict.REJECT && !r.name().startsWith("EXACT")) {
                assertTrue(conf >= 0.8 && nov < 0.95, "rejected on a prediction without confidence or familiarity");
            }
        }
    }

    @Test
    void rulesFileReadsOneRuleALineAndNamesTheBadLine() {
        RulesFile.Contents c = RulesFile.parse(List.of("# demo rules", "keep h11=4..6", "", "keep chi=-60..0  # exact",
                "min-confidence 0.85", "novelty 0.97"), "demo.rules");
        assertEquals(List.of("h11=4..6", "chi=-60..0"), c.keeps());
        assertEquals(0.85, c.minConfidence().getAsDouble());
        assertEquals(0.97, c.noveltyGuard().getAsDouble());
        assertMessage("demo.rules:2: rule 'keep x11=4..6': unknown invariant 'x11' (known: h11, h21, h31, h22, chi, rows, cols, dim, blocks)"
                .replace("rule 'keep x11=4..6'", "rule 'x11=4..6'"),
                () -> RulesFile.parse(List.of("keep h11=1..2", "keep x11=4..6"), "demo.rules"));
        assertMessage("demo.rules:1: rule 'confidence 0.9': expected 'keep INVARIANT=LO..HI', 'keep chi%M=R', 'min-confidence X' or 'novelty X'",
                () -> RulesFile.parse(List.of("confidence 0.9"), "demo.rules"));
        assertMessage("demo.rules:1: rule 'novelty high': 'high' is not a number",
                () -> RulesFile.parse(List.of("novelty high"), "demo.rules"));
    }

    @Test
    void describeRoundTripsThroughTheFileForm() {
        KeepRules rules = KeepRules.of(List.of("h11=4..6", "chi=..0"), 0.85, 0.97);
        RulesFile.Contents c = RulesFile.parse(rules.describe(), "described");
        assertEquals(rules, KeepRules.of(c.keeps(), c.minConfidence().getAsDouble(), c.noveltyGuard().getAsDouble()));
    }
}
