package org.winnow.scorer.model;

import org.winnow.geometry.Configuration;

/**
 * Scores candidates against one {@link FrozenModel}: embed, find the nearest reference points, vote,
 * measure novelty. NOT thread-safe: it owns reusable buffers, so each worker thread takes its own
 * from {@link FrozenModel#newPredictor()}. {@link #score} allocates nothing; {@link #predict} adds only
 * the returned record.
 *
 * <p>The vote weighs each of the k nearest reference points as {@link Calibration} describes; the
 * confidence is the winning class's share of the total weight. Ties between classes go to the
 * smaller h11.
 */
public final class Predictor {
    private static final double DISTANCE_FLOOR = 1e-12;

    private final FrozenModel model;
    private final Workspace ws;
    private final int searchK;
    private final int[] neighbours;
    private final double[] distances;
    private final double[] classWeight;
    private int found;
    private int winner;
    private double confidence;
    private double novelty;

    Predictor(FrozenModel model) {
        this.model = model;
        this.ws = new Workspace(model.architecture());
        Calibration cal = model.calibration();
        this.searchK = Math.max(cal.k(), cal.noveltyK());
        this.neighbours = new int[searchK];
        this.distances = new double[searchK];
        this.classWeight = new double[cal.classes().length];
    }

    /**
     * Scores one candidate and returns the predicted h11; {@link #confidence()}, {@link #novelty()} and
     * the neighbour accessors then describe this candidate until the next call. Allocation-free.
     *
     * @param chi the candidate's exact Euler characteristic
     */
    public int score(Configuration config, long chi) {
        FeatureEncoder.encode(config, chi, model.normalisation(), ws);
        EmbeddingNetwork.forward(model.rawParameters(), ws);
        found = model.index().search(ws.e, searchK, -1, neighbours, distances);
        Calibration cal = model.calibration();
        int k = Math.min(cal.k(), found);
        double total = 0;
        double bw = cal.bandwidth();
        double inv2 = bw > 0 ? 0.5 / (bw * bw) : 0;
        double d0 = distances[0] * distances[0];
        for (int i = 0; i < k; i++) {
            double w = bw > 0 ? Math.exp(-(distances[i] * distances[i] - d0) * inv2)
                    : 1.0 / (distances[i] + DISTANCE_FLOOR);
            classWeight[model.classOf(neighbours[i])] += w;
            total += w;
        }
        int best = 0;
        double bestWeight = -1;
        for (int i = 0; i < k; i++) {
            int c = model.classOf(neighbours[i]);
            double w = classWeight[c];
            if (w > bestWeight || (w == bestWeight && c < best)) {
                bestWeight = w;
                best = c;
            }
        }
        for (int i = 0; i < k; i++) {
            classWeight[model.classOf(neighbours[i])] = 0;
        }
        winner = best;
        confidence = bestWeight / total;
        int nk = Math.min(cal.noveltyK(), found);
        novelty = cal.novelty(distances[nk - 1]);
        return cal.classes()[winner];
    }

    /** Scores one candidate (see {@link #score}) and packs the result, with the derived Hodge numbers. */
    public Prediction predict(Configuration config, long chi) {
        int h11 = score(config, chi);
        Integer h21 = null;
        Integer h31 = null;
        Integer h22 = null;
        int dim = model.dimension();
        if (dim == 3) {
            if (chi % 2 == 0 && h11 - chi / 2 >= 0) {
                h21 = (int) (h11 - chi / 2);
            }
        } else if (dim == 4) {
            int[] tuple = consistentFourFoldTuple(h11, chi);
            if (tuple != null) {
                h21 = tuple[1];
                h31 = tuple[2];
                h22 = 44 + 4 * h11 - 2 * tuple[1] + 4 * tuple[2];
            }
        }
        int k = Math.min(model.calibration().k(), found);
        int[] votes = new int[k];
        for (int i = 0; i < k; i++) {
            votes[i] = model.reference().h11(neighbours[i]);
        }
        return new Prediction(h11, confidence, h21, h31, h22, novelty, votes,
                model.reference().configs()[neighbours[0]], distances[0]);
    }

    /**
     * Among the voting neighbours of the winning class, nearest first, the first whose (h21, h31)
     * satisfies {@code chi = 48 + 6(h11 - h21 + h31)} with the predicted h11; null if none does.
     */
    private int[] consistentFourFoldTuple(int h11, long chi) {
        int k = Math.min(model.calibration().k(), found);
        for (int i = 0; i < k; i++) {
            int[] label = model.reference().hodge()[neighbours[i]];
            if (label[0] != h11 || label.length < 3) {
                continue;
            }
            if (48L + 6L * (h11 - label[1] + label[2]) == chi) {
                return label;
            }
        }
        return null;
    }

    /** The winner's vote share for the last scored candidate. */
    public double confidence() {
        return confidence;
    }

    /** The novelty of the last scored candidate; near 1 means unlike the reference. */
    public double novelty() {
        return novelty;
    }

    /** Distance to the nearest reference point, for the last scored candidate. */
    public double nearestDistance() {
        return distances[0];
    }

    /** Index in the reference set of the nearest reference point, for the last scored candidate. */
    public int nearestIndex() {
        return neighbours[0];
    }
}
