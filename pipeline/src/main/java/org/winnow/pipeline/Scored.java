package org.winnow.pipeline;

import java.util.Objects;
import org.winnow.geometry.Checks;

/**
 * A candidate with the scorer's findings and verdict.
 *
 * @param candidate  the candidate
 * @param invariants its cheap exact invariants
 * @param estimate   the model's prediction
 * @param novelty    how unlike the reference set it is, in [0, 1]; near 1 means unlike anything known
 * @param verdict    keep or reject; always {@code reason.verdict()}
 * @param reason     why
 */
public record Scored(Candidate candidate, ExactInvariants invariants, Estimate estimate, double novelty,
        Verdict verdict, Reason reason) {
    public Scored {
        Objects.requireNonNull(candidate, "candidate");
        Objects.requireNonNull(invariants, "invariants");
        Objects.requireNonNull(estimate, "estimate");
        Objects.requireNonNull(reason, "reason");
        Checks.requireArgument(novelty >= 0 && novelty <= 1, "novelty must be in [0, 1]: %s", novelty);
        Checks.requireArgument(verdict == reason.verdict(), "verdict %s contradicts reason %s", verdict, reason.code());
    }

    /** Builds a scored record whose verdict follows from the reason. */
    public static Scored of(Candidate candidate, ExactInvariants invariants, Estimate estimate, double novelty,
            Reason reason) {
        return new Scored(candidate, invariants, estimate, novelty, reason.verdict(), reason);
    }

    /** The candidate's position in the source's output. */
    public long seq() {
        return candidate.seq();
    }
}
