package org.winnow.scorer.network;

import org.winnow.geometry.Checks;

/**
 * Shape of the embedding network and the layout of its parameters in one flat {@code double[]}.
 *
 * <p>The network reads a configuration as a bipartite graph: one node per row (projective factor) and
 * one per column (polynomial), an edge wherever the degree {@code q_rj} is non-zero, weighted by that
 * degree. Each node starts from a few exact local features, then {@code rounds} rounds of message
 * passing update the column nodes from their rows and the row nodes from their columns with small
 * dense layers shared by all nodes. Sum- and max-pooling over each side, concatenated with exact
 * global features, feed a two-layer readout to the embedding's coordinates. In an {@code anchored}
 * network (the default for real labels) the last coordinate is not learned: it is the first-page
 * estimate of h11 ({@code RefinedH11Estimator}: the first-page estimate, or the Hodge engine's value
 * where the first page is not settled) times
 * {@link #ANCHOR_SCALE}, so two configurations whose estimates differ by one already lie a contrastive
 * margin apart, and a candidate whose estimate no reference point shares is far from all of them (novel)
 * however the learned coordinates fall; the kNN vote then votes on corrections to that estimate
 * ({@link org.winnow.scorer.model.Predictor}). An unanchored network learns every coordinate and votes
 * on h11 itself (for labels that are not h11, such as the synthetic scenario). Every step is a symmetric
 * function of the node sets, so the embedding does not depend on row or column order, and no padding is
 * needed.
 *
 * @param hidden width H of every node state
 * @param rounds number of row-to-column plus column-to-row rounds
 * @param readout width of the readout's hidden layer
 * @param dim embedding dimension, the anchor coordinate included
 * @param anchored whether the last coordinate is the h11 estimate and the vote corrects it
 */
public record Architecture(int hidden, int rounds, int readout, int dim, boolean anchored) {
    /** Exact per-row features: n, row sum, support, largest entry, entries of at least 2. */
    public static final int ROW_FEATURES = 5;
    /** Exact per-column features: column sum, support, largest entry, dimension-weighted degree. */
    public static final int COL_FEATURES = 4;
    /**
     * Exact global features: m, K, chi, non-zeros, entries of at least 2, sum n, rows with n = 1,
     * sum n - K, then the first-page h11 estimate, its excess over m, and its two terms (Euler and kernel).
     */
    public static final int GLOBAL_FEATURES = 12;
    /** Embedding distance between two configurations whose h11 estimates differ by one (the margin). */
    public static final double ANCHOR_SCALE = 1.0;

    public Architecture {
        Checks.requireArgument(hidden >= 1 && hidden <= 256, "hidden width must be in 1..256: %s", hidden);
        Checks.requireArgument(rounds >= 0 && rounds <= 8, "rounds must be in 0..8: %s", rounds);
        Checks.requireArgument(readout >= 1 && readout <= 1024, "readout width must be in 1..1024: %s", readout);
        Checks.requireArgument(dim >= (anchored ? 2 : 1) && dim <= 64,
                "embedding dimension must be in %s..64: %s", anchored ? 2 : 1, dim);
    }

    /** An unanchored network: every coordinate learned, the vote on h11 itself. */
    public Architecture(int hidden, int rounds, int readout, int dim) {
        this(hidden, rounds, readout, dim, false);
    }

    /**
     * The default shape. No message-passing rounds: with about 1% of the labels, the pooled node
     * features alone generalised better than two or three rounds on exactly labelled samples and score
     * about twice as fast (docs/model.md); rounds remain available for larger label sets.
     */
    public static Architecture defaults(int dim) {
        return new Architecture(12, 0, 24, dim, true);
    }

    /** The learned coordinates: all but the anchor coordinate, if there is one. */
    public int learnedDim() {
        return anchored ? dim - 1 : dim;
    }

    /** Width of the pooled vector fed to the readout. */
    public int pooledWidth() {
        return 4 * hidden + GLOBAL_FEATURES;
    }

    // Layout, in order: row encoder, column encoder, per round (column update, row update), readout.

    public int rowEncW() {
        return 0;
    }

    int rowEncB() {
        return rowEncW() + hidden * ROW_FEATURES;
    }

    public int colEncW() {
        return rowEncB() + hidden;
    }

    int colEncB() {
        return colEncW() + hidden * COL_FEATURES;
    }

    private int roundsStart() {
        return colEncB() + hidden;
    }

    private int roundSize() {
        return 2 * (2 * hidden * hidden + hidden);
    }

    /** Self weights of the column update in round t (H x H). */
    public int colSelf(int t) {
        return roundsStart() + t * roundSize();
    }

    /** Message weights of the column update in round t (H x H). */
    public int colMsg(int t) {
        return colSelf(t) + hidden * hidden;
    }

    int colBias(int t) {
        return colMsg(t) + hidden * hidden;
    }

    public int rowSelf(int t) {
        return colBias(t) + hidden;
    }

    public int rowMsg(int t) {
        return rowSelf(t) + hidden * hidden;
    }

    int rowBias(int t) {
        return rowMsg(t) + hidden * hidden;
    }

    public int readW1() {
        return roundsStart() + rounds * roundSize();
    }

    int readB1() {
        return readW1() + readout * pooledWidth();
    }

    public int readW2() {
        return readB1() + readout;
    }

    int readB2() {
        return readW2() + learnedDim() * readout;
    }

    /** Total number of parameters. */
    public int parameterCount() {
        return readB2() + learnedDim();
    }
}
