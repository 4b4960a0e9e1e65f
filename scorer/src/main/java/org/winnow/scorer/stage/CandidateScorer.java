package org.winnow.scorer.stage;

import java.util.Objects;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Scored;
import org.winnow.scorer.rules.KeepRules;

/**
 * Scores one candidate: exact invariants, prediction, rules. Single-threaded, like its parts; the
 * scorer stage and anyone who wants a second opinion on a single candidate (tests, reports) use it.
 */
public final class CandidateScorer {
    private final InvariantFunction invariants;
    private final PredictionFunction predictions;
    private final KeepRules rules;

    public CandidateScorer(InvariantFunction invariants, PredictionFunction predictions, KeepRules rules) {
        this.invariants = Objects.requireNonNull(invariants, "invariants");
        this.predictions = Objects.requireNonNull(predictions, "predictions");
        this.rules = Objects.requireNonNull(rules, "rules");
    }

    /** Makes a scorer from fresh per-thread parts. */
    public static CandidateScorer of(ScoringFunctions functions, KeepRules rules) {
        return new CandidateScorer(functions.newInvariants(), functions.newPredictions(), rules);
    }

    /** The verdict on {@code candidate}, with everything it was based on. */
    public Scored score(Candidate candidate) {
        ExactInvariants exact = invariants.compute(candidate.config());
        Prediction p = predictions.predict(candidate.config(), exact);
        return Scored.of(candidate, exact, p, rules.decide(exact, p));
    }
}
