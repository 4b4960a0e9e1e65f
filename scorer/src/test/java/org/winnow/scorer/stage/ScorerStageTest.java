package org.winnow.scorer.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotSame;

import io.micrometer.core.instrument.MeterRegistry;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.metrics.ScorerMetrics;
import org.winnow.scorer.rules.KeepRules;

class ScorerStageTest {
    /** Predicts h11 = number of rows, with confidence and novelty fixed per test. */
    static ScoringFunctions fake(double confidence, double novelty, List<Object> madeOn) {
        return new ScoringFunctions() {
            @Override
            public InvariantFunction newInvariants() {
                madeOn.add(Thread.currentThread());
                return new CheapInvariantFunction();
            }

            @Override
            public PredictionFunction newPredictions() {
                return (c, exact) -> Prediction.of(c.rows(), confidence,
                        exact.dim() == 3 ? c.rows() - (int) (exact.chi() / 2) : null, novelty, "4:5");
            }

            @Override
            public String modelChecksum() {
                return "fake";
            }
        };
    }

    private static StageContext<Scored> context(MeterRegistry reg, List<Scored> out) {
        return StageContext.single("scorer", reg, s -> out.add(s));
    }

    private static Candidate candidate(String text, long seq) {
        Configuration c = Configuration.parse(text).canonical();
        return new Candidate(c, c.canonicalText(), 0, seq);
    }

    @Test
    void scoresWithExactInvariantsThenPredictionThenRules() throws Exception {
        KeepRules rules = KeepRules.of(List.of("chi=-200..-100", "h11=2..2"), 0.9, 0.99);
        List<Object> madeOn = new ArrayList<>();
        SimpleMeterRegistry reg = new SimpleMeterRegistry();
        List<Scored> out = new ArrayList<>();
        long[] clock = {0};
        ScorerStage stage = new ScorerStage(fake(0.95, 0.2, madeOn), rules, () -> clock[0] += 1000);
        stage.open(context(reg, out));
        // Euler characteristics: quintic -200 and bicubic -162, standard textbook values (from memory);
        // 3:3,0,1/3:0,3,1 has chi = -18, "New Calabi-Yau Manifolds with Small Hodge Numbers", arXiv:0809.4681 (2008).
        stage.accept(candidate("4:5", 0));
        stage.accept(candidate("2:3/2:3", 1));
        stage.accept(candidate("3:3,0,1/3:0,3,1", 2));
        assertEquals(List.of(Reason.PREDICTED_H11_OUT_OF_RANGE, Reason.KEPT_IN_RANGE, Reason.EXACT_CHI_OUT_OF_RANGE),
                out.stream().map(Scored::reason).toList());
        assertEquals(new ExactInvariants(3, -200, 1, 1, 1), out.get(0).invariants());
        assertEquals(-162, out.get(1).invariants().chi());
        assertEquals(-18, out.get(2).invariants().chi());
        assertEquals(1, madeOn.size());
        assertEquals(1.0, reg.get(ScorerMetrics.VERDICTS).tag(ScorerMetrics.TAG_REASON, "kept-in-range").counter().count());
        assertEquals(3, reg.get(ScorerMetrics.LATENCY).timer().count());
        assertEquals(Scored.of(out.get(1).candidate(), out.get(1).invariants(), out.get(1).prediction(),
                Reason.KEPT_IN_RANGE), CandidateScorer.of(fake(0.95, 0.2, new ArrayList<>()), rules)
                .score(out.get(1).candidate()));
    }

    @Test
    void eachWorkerGetsItsOwnParts() {
        List<Object> madeOn = new ArrayList<>();
        ScoringFunctions f = fake(0.5, 0.5, madeOn);
        assertNotSame(f.newInvariants(), f.newInvariants());
        assertEquals(2, madeOn.size());
    }
}
