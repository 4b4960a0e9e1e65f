package org.winnow.scorer.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Scored;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.rules.RulesFile;

/**
 * A scan defers the Hodge engine to the candidates whose verdict hinges on a value the first page leaves
 * open. Against scoring with the complete tuple on the same model: the same verdict on every candidate,
 * and no value marked proved that the exact labels contradict.
 */
class DeferredEngineTest {
    private static final Path MODEL = Path.of("../demo-data/fourfolds-1pct.wnm");
    private static final Path RULES = Path.of("../demo-data/rules-fourfolds.txt");
    private static final Path FOURFOLDS = Path.of("../geometry/src/test/resources/org/winnow/geometry/hodge/"
            + "lossless-fourfolds-6rows.tsv");

    /** Counts the completions a deferred prediction function is asked for. */
    private static final class Counting implements PredictionFunction {
        final PredictionFunction inner;
        int deferred;
        int completed;

        Counting(PredictionFunction inner) {
            this.inner = inner;
        }

        @Override
        public Prediction predict(Configuration c, ExactInvariants exact) {
            Prediction p = inner.predict(c, exact);
            deferred += inner.lastDeferred() ? 1 : 0;
            return p;
        }

        @Override
        public boolean lastDeferred() {
            return inner.lastDeferred();
        }

        @Override
        public Prediction complete(Configuration c, ExactInvariants exact) {
            completed++;
            return inner.complete(c, exact);
        }
    }

    @Test
    void deferredScoringGivesTheCompleteVerdictsAndNoWrongProof() throws IOException {
        FrozenModel model = FrozenModel.load(MODEL);
        RulesFile.Contents contents = RulesFile.read(RULES);
        KeepRules rules = KeepRules.of(contents.keeps(), contents.minConfidence().orElseThrow(),
                contents.noveltyGuard().orElseThrow());
        // h31 alone, so that the chi rules reject nothing first and more verdicts hinge on an open value.
        KeepRules h31Only = KeepRules.of(List.of("h31=80..200"), 0.85, 0.99);
        ModelScoring scoring = new ModelScoring(model);
        Predictor full = model.newPredictor();
        PredictionFunction complete = (c, exact) -> full.predict(c, exact.chi());
        for (KeepRules r : List.of(rules, h31Only)) {
            Counting deferring = new Counting(scoring.newPredictions());
            CandidateScorer lazy = new CandidateScorer(new CheapInvariantFunction(), deferring, r);
            CandidateScorer eager = new CandidateScorer(new CheapInvariantFunction(), complete, r);
            int rows = 0;
            int lineNo = 0;
            for (String line : Files.readAllLines(FOURFOLDS, StandardCharsets.UTF_8)) {
                if (line.startsWith("#") || line.isBlank() || lineNo++ % 2 != 0) {
                    continue; // every other row keeps the test to seconds
                }
                String[] f = line.split("\t");
                Configuration c = Configuration.parse(f[0]).canonical();
                Candidate candidate = new Candidate(c, c.canonicalText(), 0, rows++);
                Scored a = lazy.score(candidate);
                Scored b = eager.score(candidate);
                String where = c.toText() + " " + a.reason().code() + " vs " + b.reason().code();
                assertEquals(b.verdict(), a.verdict(), where);
                Prediction p = a.prediction();
                PredictedValue[] v = {p.h11Value(), p.h21Value(), p.h31Value(), p.h22Value()};
                for (int i = 0; i < 4; i++) {
                    long exact = Long.parseLong(f[1 + i]);
                    if (v[i].isProved()) {
                        assertEquals(exact, v[i].value(), where + " value " + i);
                    } else if (v[i].basis() == org.winnow.geometry.hodge.Basis.BOUNDED) {
                        assertTrue(v[i].lo() <= exact && exact <= v[i].hi(), where + " value " + i);
                    }
                }
            }
            assertEquals(650, rows);
            assertTrue(deferring.deferred > 0, "nothing deferred: the comparison would be empty");
            assertTrue(deferring.completed < deferring.deferred,
                    "completed " + deferring.completed + " of " + deferring.deferred + " deferred");
            if (r == h31Only) {
                // Here some verdicts hinge on an open h31, so the comparison covers completed candidates too.
                assertTrue(deferring.completed > 0, "nothing completed under a rule on h31 alone");
            }
        }
    }
}
