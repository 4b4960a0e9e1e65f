package org.winnow.pipeline;

import java.util.Objects;
import org.winnow.geometry.Checks;

/**
 * A candidate with the scorer's findings and verdict.
 *
 * @param candidate  the candidate
 * @param invariants its cheap exact invariants
 * @param prediction the model's prediction, with the candidate's novelty
 * @param verdict    keep or reject; always {@code reason.verdict()}
 * @param reason     why
 */
public record Scored(Candidate candidate, ExactInvariants invariants, Prediction prediction, Verdict verdict,
        Reason reason) {
    public Scored {
        Objects.requireNonNull(candidate, "candidate");
        Objects.requireNonNull(invariants, "invariants");
        Objects.requireNonNull(prediction, "prediction");
        Objects.requireNonNull(reason, "reason");
        Checks.requireArgument(verdict == reason.verdict(), "verdict %s contradicts reason %s", verdict, reason.code());
    }

    /** Builds a scored record whose verdict follows from the reason. */
    public static Scored of(Candidate candidate, ExactInvariants invariants, Prediction prediction, Reason reason) {
        return new Scored(candidate, invariants, prediction, reason.verdict(), reason);
    }

    /** How unlike the reference set the candidate is, in [0, 1]; near 1 means unlike anything known. */
    public double novelty() {
        return prediction.novelty();
    }

    /** The candidate's position in the source's output. */
    public long seq() {
        return candidate.seq();
    }
}
