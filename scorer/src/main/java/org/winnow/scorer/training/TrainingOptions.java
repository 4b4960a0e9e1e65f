package org.winnow.scorer.training;

import org.winnow.geometry.Checks;
import org.winnow.scorer.network.Architecture;

/**
 * Hyperparameters of one training run.
 *
 * @param architecture the network shape
 * @param epochs number of epochs; an epoch is {@code max(2048, 2 n)} sampled pairs for n examples
 * @param pairsPerBatch pairs per Adam step
 * @param learningRate initial Adam step size, decayed by a cosine to a twentieth of it
 * @param margin the contrastive margin: pairs of different classes are pushed at least this far apart
 * @param seed the only source of randomness (initial weights and pair sampling)
 * @param threads worker threads; the result does not depend on it (see {@link Trainer})
 * @param k neighbours that vote
 * @param noveltyK which neighbour's distance measures novelty
 * @param labelSource where the labels came from, recorded in the model
 */
public record TrainingOptions(Architecture architecture, int epochs, int pairsPerBatch, double learningRate,
        double margin, long seed, int threads, int k, int noveltyK, String labelSource) {
    public TrainingOptions {
        Checks.requireArgument(epochs >= 0, "epochs must not be negative: %s", epochs);
        Checks.requireArgument(pairsPerBatch >= 1, "pairs per batch must be positive: %s", pairsPerBatch);
        Checks.requireArgument(learningRate > 0 && learningRate < 1, "learning rate must be in (0, 1): %s",
                learningRate);
        Checks.requireArgument(margin > 0, "margin must be positive: %s", margin);
        Checks.requireArgument(threads >= 1, "threads must be positive: %s", threads);
        Checks.requireArgument(k >= 1, "k must be positive: %s", k);
        Checks.requireArgument(noveltyK >= 1, "novelty neighbour must be positive: %s", noveltyK);
    }

    /** The defaults for embedding dimension {@code dim}. */
    public static TrainingOptions defaults(int dim, long seed) {
        return new TrainingOptions(Architecture.defaults(dim), 40, 128, 3e-3, 1.0, seed, 2, 7, 1, "unspecified");
    }

    public TrainingOptions withEpochs(int e) {
        return new TrainingOptions(architecture, e, pairsPerBatch, learningRate, margin, seed, threads, k, noveltyK,
                labelSource);
    }

    public TrainingOptions withThreads(int t) {
        return new TrainingOptions(architecture, epochs, pairsPerBatch, learningRate, margin, seed, t, k, noveltyK,
                labelSource);
    }

    public TrainingOptions withArchitecture(Architecture a) {
        return new TrainingOptions(a, epochs, pairsPerBatch, learningRate, margin, seed, threads, k, noveltyK,
                labelSource);
    }

    public TrainingOptions withLabelSource(String source) {
        return new TrainingOptions(architecture, epochs, pairsPerBatch, learningRate, margin, seed, threads, k,
                noveltyK, source);
    }

    public TrainingOptions withNeighbours(int voteK, int novelK) {
        return new TrainingOptions(architecture, epochs, pairsPerBatch, learningRate, margin, seed, threads, voteK,
                novelK, labelSource);
    }
}
