package org.winnow.scorer.network;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.hodge.RefinedTupleEstimator;
import org.winnow.geometry.hodge.TupleEstimate;

/**
 * What a model of file version 4 anchors on: for three-folds and four-folds the candidate's Hodge tuple
 * with the basis of every value ({@link RefinedTupleEstimator}), whose h11 is the anchor coordinate and
 * the value the neighbours' corrections are added to; for other dimensions, which have no tuple, the
 * h11-only anchor ({@link RefinedH11Estimator}). The two first-page terms the network also reads come
 * from {@link H11Estimator}, as before, so that the input features keep their meaning.
 *
 * <p>With {@link #deferEngine(boolean)} on, the tuple comes from
 * {@link RefinedTupleEstimator#estimateDeferred}, given the settled first-page h11: the engine is skipped
 * where the first page proves h11 or reads it settled (so the h11-only anchor's cost, and the same h11,
 * features and neighbours wherever the settled reading is right), and {@link #deferred()} says when
 * values were left wider than {@code estimate} would leave them. A scan turns it on and completes only
 * the candidates whose verdict hinges on such a value; training and evaluation leave it off.
 *
 * <p>NOT thread-safe (it owns estimators): one per workspace.
 */
public final class Anchor {
    private final RefinedTupleEstimator tuples = new RefinedTupleEstimator();
    private final H11Estimator firstPage = new H11Estimator();
    private final RefinedH11Estimator otherDimensions = new RefinedH11Estimator();
    private TupleEstimate tuple;
    private int h11;
    private boolean plainFirstPage;
    private boolean deferEngine;

    /**
     * Anchors {@code c} (exact Euler characteristic {@code chi}) and writes global features 8 to 11 at
     * {@code out[off + 8..11]}: the anchor h11, its excess over the rows, and two first-page terms.
     */
    public void compute(Configuration c, long chi, double[] out, int off) {
        int d = c.dimension();
        long eulerOne;
        long conormalExcess;
        if (d == 3 || d == 4) {
            int page = firstPage.estimate(c);
            tuple = deferEngine ? tuples.estimateDeferred(c, chi, firstPage.settled() ? page : -1)
                    : tuples.estimate(c, chi);
            h11 = Math.toIntExact(tuple.h11().value());
            plainFirstPage = firstPage.settled() && page == h11;
            eulerOne = firstPage.eulerOne();
            conormalExcess = Math.max(0, firstPage.conormalTwo() - firstPage.eulerTwo());
        } else {
            tuple = null;
            h11 = otherDimensions.estimate(c);
            plainFirstPage = otherDimensions.source() == RefinedH11Estimator.Source.FIRST_PAGE;
            eulerOne = otherDimensions.eulerOne();
            conormalExcess = Math.max(0, otherDimensions.conormalTwo() - otherDimensions.eulerTwo());
        }
        out[off + 8] = h11;
        out[off + 9] = h11 - c.rows();
        out[off + 10] = eulerOne;
        out[off + 11] = conormalExcess;
    }

    /** Turns the deferred engine on or off for the configurations anchored from now on. */
    public void deferEngine(boolean on) {
        deferEngine = on;
    }

    /** True iff the deferred engine is on. */
    public boolean deferring() {
        return deferEngine;
    }

    /**
     * True iff the engine was deferred on the last configuration and the tuple's h21, h31 or h22 may be
     * wider than the complete estimate's (see {@link RefinedTupleEstimator#lastDeferred()}).
     */
    public boolean deferred() {
        return tuple != null && deferEngine && tuples.lastDeferred();
    }

    /** The anchor h11 of the last configuration. */
    public int h11() {
        return h11;
    }

    /** The tuple of the last configuration; null for dimensions other than 3 and 4. */
    public TupleEstimate tuple() {
        return tuple;
    }

    /** True iff the last anchor h11 is a proof (a settled first page or the engine's exact value). */
    public boolean h11Proved() {
        return tuple != null ? tuple.h11().isProved()
                : otherDimensions.source() == RefinedH11Estimator.Source.ENGINE_EXACT;
    }

    /**
     * How the last anchor h11 was found, in the terms of the h11-only anchor: {@code FIRST_PAGE} when it is
     * the settled first-page reading itself (what a port that reads only the first page reproduces).
     */
    public RefinedH11Estimator.Source source() {
        if (tuple == null) {
            return otherDimensions.source();
        }
        if (plainFirstPage) {
            return RefinedH11Estimator.Source.FIRST_PAGE;
        }
        Basis b = tuple.h11().basis();
        return b == Basis.PROVED ? RefinedH11Estimator.Source.ENGINE_EXACT
                : b == Basis.BOUNDED ? RefinedH11Estimator.Source.ENGINE_BOUNDED : RefinedH11Estimator.Source.UNSETTLED;
    }
}
