package org.winnow.scorer.model;

/**
 * Where a frozen model came from: the seed and sizes of its training, where its labels came from,
 * and the held-out evaluation measured right after training (as {@code name: value} lines).
 */
public record TrainingMetadata(long seed, int examples, int classes, int epochs, long pairs, double finalLoss,
        String labelSource, String evaluation) {
    public TrainingMetadata {
        labelSource = labelSource == null ? "" : labelSource;
        evaluation = evaluation == null ? "" : evaluation;
    }

    /** The same metadata with the evaluation replaced. */
    public TrainingMetadata withEvaluation(String text) {
        return new TrainingMetadata(seed, examples, classes, epochs, pairs, finalLoss, labelSource, text);
    }
}
