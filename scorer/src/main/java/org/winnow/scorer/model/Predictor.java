package org.winnow.scorer.model;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.KnownValue;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.hodge.TupleEstimate;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;
import org.winnow.scorer.network.FeatureEncoder;
import org.winnow.scorer.network.Workspace;

/**
 * Scores candidates against one {@link FrozenModel}: embed, find the nearest reference points, vote,
 * measure novelty. NOT thread-safe: it owns reusable buffers, so each worker thread takes its own
 * from {@link FrozenModel#newPredictor()}. {@link #score} allocates only the anchor's small tuple
 * records; {@link #predict} adds the returned records.
 *
 * <p>The anchor is the candidate's Hodge tuple ({@link org.winnow.scorer.network.Anchor}): each value with its basis. The vote
 * weighs each of the k nearest reference points as {@link Calibration} describes. What a neighbour votes
 * for is a correction: its exact h11 minus its own anchor h11 (and, on a four-fold model with full labels,
 * its exact h31 minus its own tuple's h31); the prediction is the candidate's value plus the winning
 * correction. So neighbours teach where the estimate fails, and a candidate of an h11 that no reference
 * point has is still predicted from its own estimate (and flagged by its novelty, since the embedding's
 * anchor coordinate keeps it away from the reference). Ties between corrections go to the one nearer
 * zero, then the smaller.
 *
 * <p>How each value is known: a PROVED value is the prediction itself, with confidence 1; a BOUNDED one is
 * the voted value clamped into its proved interval, with a confidence of at most one value's share of the
 * interval (the vote was never taught inside it); an ESTIMATED one is the voted value. An unproved value's
 * confidence is the rule of succession on the neighbours that agree with the winning correction,
 * {@code (a + 1) / (k + 2)}: a unanimous vote of the 7 nearest gives 8/9, so no unproved value shows
 * near-certainty on its own. A four-fold's h21 and h22 follow from h11 and h31 through
 * {@code chi = 48 + 6(h11 - h21 + h31)} and {@code h22 = 44 + 4 h11 - 2 h21 + 4 h31} with the exact chi
 * (confidence the smaller of the two); a three-fold's h21 is {@code h11 - chi/2}. An unanchored model
 * (labels that need not be h11) votes on h11 itself and marks everything estimated.
 */
public final class Predictor {
    private static final double DISTANCE_FLOOR = 1e-12;

    private final FrozenModel model;
    private final Workspace ws;
    private final int searchK;
    private final int[] neighbours;
    private final double[] distances;
    private final double[] classWeight;
    private final double[] classWeight31;
    private int found;
    private int winner;
    private int winner31;
    private int estimate;
    private double confidence;
    private double confidence31;
    private double novelty;

    Predictor(FrozenModel model) {
        this.model = model;
        this.ws = new Workspace(model.architecture());
        Calibration cal = model.calibration();
        this.searchK = Math.max(cal.k(), cal.noveltyK());
        this.neighbours = new int[searchK];
        this.distances = new double[searchK];
        this.classWeight = new double[model.residualCount()];
        this.classWeight31 = new double[Math.max(1, model.residual31Count())];
    }

    /**
     * Scores one candidate and returns the predicted h11 (clamped into its proved interval when it has
     * one); {@link #confidence()}, {@link #novelty()} and the neighbour accessors then describe this
     * candidate until the next call.
     *
     * @param chi the candidate's exact Euler characteristic
     */
    public int score(Configuration config, long chi) {
        FeatureEncoder.encode(config, chi, model.normalisation(), ws);
        model.network().forward(ws);
        found = model.index().search(ws.e, searchK, -1, neighbours, distances);
        Calibration cal = model.calibration();
        int k = Math.min(cal.k(), found);
        boolean four = model.residual31Count() > 0;
        double bw = cal.bandwidth();
        double inv2 = bw > 0 ? 0.5 / (bw * bw) : 0;
        double d0 = distances[0] * distances[0];
        for (int i = 0; i < k; i++) {
            double w = bw > 0 ? Math.exp(-(distances[i] * distances[i] - d0) * inv2)
                    : 1.0 / (distances[i] + DISTANCE_FLOOR);
            classWeight[model.residualOf(neighbours[i])] += w;
            if (four) {
                classWeight31[model.residual31Of(neighbours[i])] += w;
            }
        }
        int best = -1;
        double bestWeight = -1;
        int best31 = -1;
        double bestWeight31 = -1;
        for (int i = 0; i < k; i++) {
            int c = model.residualOf(neighbours[i]);
            double w = classWeight[c];
            if (w > bestWeight || (w == bestWeight && prefer(c, best))) {
                bestWeight = w;
                best = c;
            }
            if (four) {
                int c31 = model.residual31Of(neighbours[i]);
                double w31 = classWeight31[c31];
                if (w31 > bestWeight31 || (w31 == bestWeight31 && prefer31(c31, best31))) {
                    bestWeight31 = w31;
                    best31 = c31;
                }
            }
        }
        // The rule of succession on the neighbours that agree with the winner: never 1 from a vote alone.
        int agree = 0;
        int agree31 = 0;
        for (int i = 0; i < k; i++) {
            agree += model.residualOf(neighbours[i]) == best ? 1 : 0;
            classWeight[model.residualOf(neighbours[i])] = 0;
            if (four) {
                agree31 += model.residual31Of(neighbours[i]) == best31 ? 1 : 0;
                classWeight31[model.residual31Of(neighbours[i])] = 0;
            }
        }
        winner = best;
        winner31 = best31;
        confidence = (agree + 1.0) / (k + 2.0);
        confidence31 = four ? (agree31 + 1.0) / (k + 2.0) : 0;
        int nk = Math.min(cal.noveltyK(), found);
        novelty = cal.novelty(distances[nk - 1]);
        boolean anchored = model.architecture().anchored();
        estimate = anchored ? ws.h11Estimate : 0;
        if (anchored && ws.anchor.h11Proved()) {
            confidence = 1.0; // proved: nothing for the neighbours to correct
            return estimate;
        }
        int voted = estimate + model.residual(winner);
        TupleEstimate t = anchored ? ws.anchor.tuple() : null;
        if (t != null && t.h11().basis() == Basis.BOUNDED) {
            return Math.toIntExact(Math.max(t.h11().lo(), Math.min(t.h11().hi(), voted)));
        }
        return voted;
    }

    private boolean prefer(int c, int over) {
        int a = Math.abs(model.residual(c));
        int b = Math.abs(model.residual(over));
        return a < b || (a == b && model.residual(c) < model.residual(over));
    }

    private boolean prefer31(int c, int over) {
        int a = Math.abs(model.residual31(c));
        int b = Math.abs(model.residual31(over));
        return a < b || (a == b && model.residual31(c) < model.residual31(over));
    }

    /**
     * Scores one candidate (see {@link #score}) and packs the result, every value with its basis; the
     * neighbour accessors then describe this candidate until the next call.
     */
    public Prediction predict(Configuration config, long chi) {
        int h11Voted = score(config, chi);
        String nearest = model.reference().configs()[neighbours[0]];
        TupleEstimate t = model.architecture().anchored() ? ws.anchor.tuple() : null;
        if (t == null) {
            // No tuple (another dimension, or an unanchored model): nothing proved, every value estimated.
            Integer h21 = model.dimension() == 3 && config.dimension() == 3 && chi % 2 == 0 && h11Voted - chi / 2 >= 0
                    ? Math.toIntExact(h11Voted - chi / 2) : null;
            return new Prediction(h11Voted, Math.min(confidence, UNPROVED_MAX), h21, null, null, novelty, nearest);
        }
        PredictedValue h11 = value(t.h11(), h11Voted, confidence);
        if (t.dim() == 3) {
            PredictedValue h21 = value(t.h21(), h11.value() - chi / 2, h11.confidence());
            return new Prediction(h11, h21, null, null, t.product(), novelty, nearest);
        }
        long shift = Math.floorDiv(chi, 6) - 8; // h11 - h21 + h31
        long h31Guess;
        double c31;
        if (t.h31().isProved() || !t.h21().isProved()) {
            boolean voted = model.residual31Count() > 0;
            h31Guess = t.h31().value() + (voted ? model.residual31(winner31) : 0);
            // Without h31 labels the tuple's own h31 stands, and only a proof or a proved interval rejects on it.
            c31 = voted ? confidence31 : 0;
        } else {
            h31Guess = t.h21().value() - h11.value() + shift; // a proved h21 ties h31 to h11
            c31 = h11.confidence();
        }
        PredictedValue h31 = value(t.h31(), h31Guess, c31);
        double both = Math.min(h11.confidence(), h31.confidence());
        PredictedValue h21 = value(t.h21(), h11.value() + h31.value() - shift, both);
        PredictedValue h22 = value(t.h22(), 44 + 4 * h11.value() - 2 * h21.value() + 4 * h31.value(), both);
        return new Prediction(h11, h21, h31, h22, t.product(), novelty, nearest);
    }

    private static PredictedValue value(KnownValue known, long guess, double voteConfidence) {
        double c = Math.min(voteConfidence, UNPROVED_MAX);
        if (known.basis() == Basis.BOUNDED) {
            c = Math.min(c, 1.0 / (known.hi() - known.lo() + 1));
        }
        return PredictedValue.of(known, guess, c);
    }

    /** The largest confidence an unproved value can show (a unanimous vote of 30 neighbours). */
    static final double UNPROVED_MAX = 31.0 / 32.0;

    /**
     * Turns the deferred engine on or off ({@link org.winnow.scorer.network.Anchor#deferEngine}): with it on,
     * {@link #predict} skips the Hodge engine where the first page proves h11 or reads it settled, so values
     * may keep the first page's wider proved intervals ({@link #lastDeferred()}; an h11 read settled is
     * BOUNDED, never proved). Where that reading is right (every settled four-fold and three-fold of the
     * lossless enumerations measured so far; docs/model.md) the features, the embedding, the neighbours and
     * the novelty are those of the complete tuple. Off by default (training and evaluation).
     */
    public void deferEngine(boolean on) {
        ws.anchor.deferEngine(on);
    }

    /** True iff the last {@link #predict} deferred the engine and {@link #complete} may prove more. */
    public boolean lastDeferred() {
        return ws.anchor.deferred();
    }

    /**
     * The prediction {@link #predict} gives with the engine not deferred (whatever the setting), for a
     * candidate whose verdict hinges on a value the deferred tuple left open. The setting is kept.
     */
    public Prediction complete(Configuration config, long chi) {
        boolean was = ws.anchor.deferring();
        ws.anchor.deferEngine(false);
        try {
            return predict(config, chi);
        } finally {
            ws.anchor.deferEngine(was);
        }
    }

    /** The anchor tuple of the last scored candidate, or null (another dimension than 3 and 4). */
    public TupleEstimate tuple() {
        return ws.anchor.tuple();
    }

    /**
     * The h11 the vote alone gives for the last scored candidate: its anchor plus the winning correction,
     * before a proof replaces it or a proved interval clamps it (what a port of the vote reproduces).
     */
    public int votedH11() {
        return estimate + model.residual(winner);
    }

    /** The h11 each voting neighbour stands for, nearest first, for the last scored candidate. */
    public int[] neighbourH11() {
        int k = Math.min(model.calibration().k(), found);
        int[] votes = new int[k];
        for (int i = 0; i < k; i++) {
            votes[i] = estimate + model.residual(model.residualOf(neighbours[i]));
        }
        return votes;
    }

    /** How the last candidate's anchor h11 was found, in the terms of the h11-only anchor ({@link org.winnow.scorer.network.Anchor#source()}). */
    public RefinedH11Estimator.Source estimateSource() {
        return ws.anchor.source();
    }

    /**
     * The anchor h11 of the last scored candidate (the prediction before correction); 0 for an unanchored
     * model, which votes on h11 directly.
     */
    public int firstPageEstimate() {
        return estimate;
    }

    /** The h11 confidence of the last scored candidate: 1 when proved, else the shrunk vote share. */
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
