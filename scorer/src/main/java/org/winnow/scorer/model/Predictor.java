package org.winnow.scorer.model;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.KnownValue;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.hodge.RefinedTupleEstimator;
import org.winnow.geometry.hodge.TupleEstimate;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;

/**
 * Scores candidates against one {@link FrozenModel}: embed, find the nearest reference points, vote,
 * measure novelty. NOT thread-safe: it owns reusable buffers, so each worker thread takes its own
 * from {@link FrozenModel#newPredictor()}. {@link #score} allocates nothing; {@link #predict} adds only
 * the returned record.
 *
 * <p>The vote weighs each of the k nearest reference points as {@link Calibration} describes. What a
 * neighbour votes for is a correction: its exact h11 minus its own first-page estimate
 * ({@code RefinedH11Estimator}); the prediction is the candidate's estimate plus the winning correction, and the
 * confidence is that correction's share of the total weight. So neighbours teach where the estimate
 * fails, and a candidate of an h11 that no reference point has is still predicted from its own
 * estimate (and flagged by its novelty, since the embedding's anchor coordinate keeps it away from the
 * reference). Ties between corrections go to the one nearer zero, then the smaller.
 */
public final class Predictor {
    private static final double DISTANCE_FLOOR = 1e-12;

    private final FrozenModel model;
    private final Workspace ws;
    private final int searchK;
    private final int[] neighbours;
    private final double[] distances;
    private final RefinedTupleEstimator tuples = new RefinedTupleEstimator();
    private TupleEstimate tuple;
    private final double[] classWeight;
    private int found;
    private int winner;
    private int estimate;
    private double confidence;
    private double novelty;

    Predictor(FrozenModel model) {
        this.model = model;
        this.ws = new Workspace(model.architecture());
        Calibration cal = model.calibration();
        this.searchK = Math.max(cal.k(), cal.noveltyK());
        this.neighbours = new int[searchK];
        this.distances = new double[searchK];
        this.classWeight = new double[model.residualCount()];
    }

    /**
     * Scores one candidate and returns the predicted h11; {@link #confidence()}, {@link #novelty()} and
     * the neighbour accessors then describe this candidate until the next call. Allocation-free.
     *
     * @param chi the candidate's exact Euler characteristic
     */
    public int score(Configuration config, long chi) {
        FeatureEncoder.encode(config, chi, model.normalisation(), ws);
        model.network().forward(ws);
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
            classWeight[model.residualOf(neighbours[i])] += w;
            total += w;
        }
        int best = -1;
        double bestWeight = -1;
        for (int i = 0; i < k; i++) {
            int c = model.residualOf(neighbours[i]);
            double w = classWeight[c];
            if (w > bestWeight || (w == bestWeight && prefer(c, best))) {
                bestWeight = w;
                best = c;
            }
        }
        for (int i = 0; i < k; i++) {
            classWeight[model.residualOf(neighbours[i])] = 0;
        }
        winner = best;
        // The rule of succession on the neighbours that agree with the winner: never 1 from a vote alone.
        int agree = 0;
        for (int i = 0; i < k; i++) {
            agree += model.residualOf(neighbours[i]) == best ? 1 : 0;
        }
        confidence = (agree + 1.0) / (k + 2.0);
        int nk = Math.min(cal.noveltyK(), found);
        novelty = cal.novelty(distances[nk - 1]);
        estimate = model.architecture().anchored() ? ws.h11Estimate : 0;
        if (model.architecture().anchored() && ws.estimator.source() == RefinedH11Estimator.Source.ENGINE_EXACT) {
            confidence = 1.0; // proved by the Hodge engine: nothing for the neighbours to correct
            return estimate;
        }
        return estimate + model.residual(winner);
    }

    private boolean prefer(int c, int over) {
        int a = Math.abs(model.residual(c));
        int b = Math.abs(model.residual(over));
        return a < b || (a == b && model.residual(c) < model.residual(over));
    }

    /**
     * Scores one candidate (see {@link #score}) and packs the result, with the derived Hodge numbers; the
     * neighbour accessors then describe this candidate until the next call.
     */
    public Prediction predict(Configuration config, long chi) {
        int h11 = score(config, chi);
        int d = config.dimension();
        tuple = null;
        if (model.architecture().anchored() && (d == 3 || d == 4)) {
            tuple = tuples.estimate(config, chi);
            return withBases(tuple, h11, chi);
        }
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
        // The vote share cannot leave [0, 1] (a partial sum of non-negative weights never exceeds the whole
        // in floating point either); the clamp only guards the record's contract.
        return new Prediction(h11, Math.min(1.0, Math.max(0.0, confidence)), h21, h31, h22, novelty,
                model.reference().configs()[neighbours[0]]);
    }

    /**
     * The prediction with every value's basis from the candidate's tuple: a PROVED value is the prediction
     * itself (confidence 1); a BOUNDED one the voted value clamped into its interval, with a confidence of
     * at most one value's share of the interval (the vote does not see inside it); an ESTIMATED one the
     * voted value. h31 has no vote of its own yet: its estimate comes from the tuple with confidence 0, so
     * only a proof or a proved interval rejects on it, and so do h21 and h22 of a four-fold, derived from
     * h11 and h31 through {@code chi = 48 + 6(h11 - h21 + h31)} and {@code h22 = 44 + 4 h11 - 2 h21 + 4 h31}.
     */
    private Prediction withBases(TupleEstimate t, int h11Voted, long chi) {
        PredictedValue h11 = value(t.h11(), h11Voted, confidence);
        PredictedValue h21;
        PredictedValue h31 = null;
        PredictedValue h22 = null;
        if (t.dim() == 3) {
            h21 = value(t.h21(), h11.value() - chi / 2, h11.confidence());
        } else {
            h31 = value(t.h31(), t.h31().value(), 0);
            double both = Math.min(h11.confidence(), h31.confidence());
            h21 = value(t.h21(), h11.value() + h31.value() + 8 - Math.floorDiv(chi, 6), both);
            h22 = value(t.h22(), 28 + 2 * h11.value() + 2 * h31.value() + Math.floorDiv(chi, 3), both);
        }
        return new Prediction(h11, h21, h31, h22, t.product(), novelty, model.reference().configs()[neighbours[0]]);
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

    /** The tuple of the last predicted candidate, or null (another dimension than 3 and 4, or unanchored). */
    public TupleEstimate tuple() {
        return tuple;
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

    /**
     * The four-fold tuple {@code (h11, h21, h31)} satisfying {@code chi = 48 + 6(h11 - h21 + h31)}: h21
     * from the nearest voting neighbour of the winning correction that has one, h31 from the identity;
     * null when chi - 48 is not a multiple of 6, no such neighbour exists, or h31 would be negative.
     */
    private int[] consistentFourFoldTuple(int h11, long chi) {
        if ((chi - 48) % 6 != 0) {
            return null;
        }
        int k = Math.min(model.calibration().k(), found);
        for (int i = 0; i < k; i++) {
            int[] label = model.reference().hodge()[neighbours[i]];
            if (model.residualOf(neighbours[i]) != winner || label.length < 3) {
                continue;
            }
            long h31 = (chi - 48) / 6 - h11 + label[1];
            return h31 >= 0 ? new int[] {h11, label[1], Math.toIntExact(h31)} : null;
        }
        return null;
    }

    /** How the last candidate's anchor was found (first page, or the Hodge engine where it was unsettled). */
    public RefinedH11Estimator.Source estimateSource() {
        return ws.estimator.source();
    }

    /**
     * The first-page h11 estimate of the last scored candidate (the prediction before correction); 0
     * for an unanchored model, which votes on h11 directly.
     */
    public int firstPageEstimate() {
        return estimate;
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
