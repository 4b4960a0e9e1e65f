package org.winnow.scorer.stage;

import java.time.Duration;
import java.util.Objects;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Reason;
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
    private final Duration proofBudget;

    public CandidateScorer(InvariantFunction invariants, PredictionFunction predictions, KeepRules rules) {
        this(invariants, predictions, rules, null);
    }

    /** A scorer whose proof step has {@code proofBudget} per candidate (null: no proof step). */
    public CandidateScorer(InvariantFunction invariants, PredictionFunction predictions, KeepRules rules,
            Duration proofBudget) {
        this.invariants = Objects.requireNonNull(invariants, "invariants");
        this.predictions = Objects.requireNonNull(predictions, "predictions");
        this.rules = Objects.requireNonNull(rules, "rules");
        this.proofBudget = proofBudget;
    }

    /** Makes a scorer from fresh per-thread parts, with the functions' proof budget. */
    public static CandidateScorer of(ScoringFunctions functions, KeepRules rules) {
        return new CandidateScorer(functions.newInvariants(), functions.newPredictions(), rules, functions.proofBudget());
    }

    /** The verdict on {@code candidate}, with everything it was based on. */
    public Scored score(Candidate candidate) {
        ExactInvariants exact = invariants.compute(candidate.config());
        Prediction p = predictions.predict(candidate.config(), exact);
        Reason reason = rules.decide(exact, p);
        if (predictions.lastDeferred() && rules.hingesOnOpenValue(exact, p, reason)) {
            // The engine was skipped; this verdict hinges on a value the complete tuple may pin differently.
            p = predictions.complete(candidate.config(), exact);
            reason = rules.decide(exact, p);
        }
        if (proofBudget != null && rules.restsOnUnproved(exact, p, reason)) {
            // The opt-in proof step: only where a proof could change the verdict, within the budget.
            p = predictions.prove(candidate.config(), exact, p, proofBudget);
            if (p.proof() == Proof.UNSETTLED && rules.namedValuesProved(exact, p)) {
                p = p.withProof(Proof.SETTLED);
            }
            reason = rules.decide(exact, p);
        }
        return Scored.of(candidate, exact, p, reason);
    }
}
