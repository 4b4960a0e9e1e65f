package org.winnow.scorer.stage;

import java.util.Objects;
import org.winnow.pipeline.Estimate;

/**
 * The model's answer for one candidate.
 *
 * @param estimate the predicted labels and their confidence
 * @param novelty  how unlike the reference set the candidate is, in [0, 1]
 */
public record Predicted(Estimate estimate, double novelty) {
    public Predicted {
        Objects.requireNonNull(estimate, "estimate");
    }
}
