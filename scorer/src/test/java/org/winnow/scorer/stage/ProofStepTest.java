package org.winnow.scorer.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.scorer.rules.KeepRules;

/** The opt-in proof step: it runs only where a proof could change the verdict, and says what it did. */
class ProofStepTest {
    private static final Path DEMO_MODEL = Path.of("../demo-data/threefolds-1pct.wnm");
    /** The cheap tuple only bounds its h11 (7..11); the exact engine proves 8. */
    private static final Configuration BOUNDED =
            Configuration.parse("2:2,1,0,0,0/2:0,1,1,1,0/1:0,0,2,0,0/1:0,0,2,0,0/1:0,0,0,1,1/1:0,0,0,0,2");

    private static Scored score(ModelScoring scoring, KeepRules rules, Configuration c) {
        return CandidateScorer.of(scoring, rules).score(new Candidate(c, c.canonicalText(), 0, 0));
    }

    @Test
    void aProofWithinTheBudgetSettlesTheValueAndTheVerdict() throws IOException {
        assertEquals(8, HodgeEngine.standard().compute(BOUNDED).h11().value(), "the exact engine's h11");
        KeepRules rules = KeepRules.of(List.of("h11=2..7"), 0.85, 0.99);
        ModelScoring plain = ModelScoring.load(DEMO_MODEL);
        Scored before = score(plain, rules, BOUNDED);
        assertEquals(Basis.BOUNDED, before.prediction().h11Value().basis());
        assertEquals(Proof.NOT_ATTEMPTED, before.prediction().proof());
        assertTrue(before.verdict() == org.winnow.pipeline.Verdict.KEEP, "unproved and overlapping the range: kept, "
                + before.reason().code());
        Scored after = score(plain.withProofBudget(Duration.ofSeconds(120), System::nanoTime), rules, BOUNDED);
        assertEquals(Proof.SETTLED, after.prediction().proof());
        assertTrue(after.prediction().h11Value().isProved());
        assertEquals(8, after.prediction().h11());
        assertEquals(Reason.PROVED_H11_OUT_OF_RANGE, after.reason());
        // The proved h21 follows from h11 and the exact chi.
        assertTrue(after.prediction().h21Value().isProved());
        assertEquals(8 - after.invariants().chi() / 2, (long) after.prediction().h21());
    }

    @Test
    void aProofThatRunsOutOfTimeLeavesTheValueAsItWasAndSaysSo() throws IOException {
        // A clock an hour further on at every reading: whatever the engine does, the budget has run out.
        AtomicLong now = new AtomicLong();
        ModelScoring late = ModelScoring.load(DEMO_MODEL)
                .withProofBudget(Duration.ofSeconds(120), () -> now.addAndGet(3_600_000_000_000L));
        KeepRules rules = KeepRules.of(List.of("h11=2..7"), 0.85, 0.99);
        Scored s = score(late, rules, BOUNDED);
        assertEquals(Proof.OUT_OF_TIME, s.prediction().proof());
        assertEquals(Basis.BOUNDED, s.prediction().h11Value().basis());
        assertFalse(s.prediction().h11Value().isProved());
        assertEquals(org.winnow.pipeline.Verdict.KEEP, s.verdict());
    }

    @Test
    void noProofRunsWhereTheVerdictDoesNotRestOnAnUnprovedValue() throws IOException {
        ModelScoring proving = ModelScoring.load(DEMO_MODEL).withProofBudget(Duration.ofSeconds(120), System::nanoTime);
        // Rejected by the exact chi first: no proof could change that.
        Scored exact = score(proving, KeepRules.of(List.of("chi=0..10", "h11=2..7"), 0.85, 0.99), BOUNDED);
        assertEquals(Reason.EXACT_CHI_OUT_OF_RANGE, exact.reason());
        assertEquals(Proof.NOT_ATTEMPTED, exact.prediction().proof());
        // The quintic's h11 is proved by the cheap tuple already.
        Scored quintic = score(proving, KeepRules.of(List.of("h11=2..7"), 0.85, 0.99), Configuration.parse("4:5"));
        assertEquals(Reason.PROVED_H11_OUT_OF_RANGE, quintic.reason());
        assertEquals(Proof.NOT_ATTEMPTED, quintic.prediction().proof());
        // No rule on a predicted value: nothing to prove.
        Scored none = score(proving, KeepRules.of(List.of("chi=..0"), 0.85, 0.99), BOUNDED);
        assertEquals(Proof.NOT_ATTEMPTED, none.prediction().proof());
    }
}
