package org.winnow.scorer.training;

/** Receives the mean contrastive loss after every epoch; called on the training thread. */
@FunctionalInterface
public interface TrainingProgress {
    void epochDone(int epoch, int epochs, double meanLoss);

    /** Ignores every report. */
    static TrainingProgress silent() {
        return (e, n, l) -> { };
    }
}
