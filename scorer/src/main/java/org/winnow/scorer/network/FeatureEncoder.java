package org.winnow.scorer.network;

import org.winnow.geometry.Configuration;

/**
 * Turns a configuration (and its exact chi) into the network's input graph: normalised row, column and
 * global features and, for networks with message-passing rounds, the edge lists in both directions.
 * Writes into a {@link Workspace}; allocates nothing.
 */
public final class FeatureEncoder {
    private FeatureEncoder() {}

    public static void encode(Configuration c, long chi, Normalisation norm, Workspace ws) {
        int m = c.rows();
        int k = c.cols();
        ws.rows = m;
        ws.cols = k;
        for (int r = 0; r < m; r++) {
            int off = r * Architecture.ROW_FEATURES;
            rowFeatures(c, r, ws.xr, off);
            normalise(ws.xr, off, norm.rowMean(), norm.rowScale());
        }
        for (int j = 0; j < k; j++) {
            int off = j * Architecture.COL_FEATURES;
            colFeatures(c, j, ws.xc, off);
            normalise(ws.xc, off, norm.colMean(), norm.colScale());
        }
        ws.h11Estimate = globalFeatures(c, chi, ws.anchor, ws.g, 0);
        normalise(ws.g, 0, norm.globalMean(), norm.globalScale());
        if (ws.arch.rounds() == 0) {
            return; // only message passing reads the edges
        }
        // Edges grouped by column (for row -> column messages) and by row (for column -> row messages).
        int e = 0;
        for (int j = 0; j < k; j++) {
            ws.colStart[j] = e;
            for (int r = 0; r < m; r++) {
                int q = c.q(r, j);
                if (q != 0) {
                    ws.colEdgeNode[e] = r;
                    ws.colEdgeWeight[e] = q;
                    e++;
                }
            }
        }
        ws.colStart[k] = e;
        e = 0;
        for (int r = 0; r < m; r++) {
            ws.rowStart[r] = e;
            for (int j = 0; j < k; j++) {
                int q = c.q(r, j);
                if (q != 0) {
                    ws.rowEdgeNode[e] = j;
                    ws.rowEdgeWeight[e] = q;
                    e++;
                }
            }
        }
        ws.rowStart[m] = e;
    }

    private static void normalise(double[] x, int off, double[] mean, double[] scale) {
        for (int i = 0; i < mean.length; i++) {
            x[off + i] = (x[off + i] - mean[i]) * scale[i];
        }
    }

    static void rowFeatures(Configuration c, int r, double[] out, int off) {
        int sum = 0;
        int support = 0;
        int max = 0;
        int big = 0;
        for (int j = 0; j < c.cols(); j++) {
            int q = c.q(r, j);
            sum += q;
            support += q != 0 ? 1 : 0;
            max = Math.max(max, q);
            big += q >= 2 ? 1 : 0;
        }
        out[off] = c.n(r);
        out[off + 1] = sum;
        out[off + 2] = support;
        out[off + 3] = max;
        out[off + 4] = big;
    }

    static void colFeatures(Configuration c, int j, double[] out, int off) {
        int sum = 0;
        int support = 0;
        int max = 0;
        int weighted = 0;
        for (int r = 0; r < c.rows(); r++) {
            int q = c.q(r, j);
            sum += q;
            support += q != 0 ? 1 : 0;
            max = Math.max(max, q);
            weighted += q * c.n(r);
        }
        out[off] = sum;
        out[off + 1] = support;
        out[off + 2] = max;
        out[off + 3] = weighted;
    }

    /** Writes the raw global features and returns the anchor h11 ({@link Anchor}). */
    static int globalFeatures(Configuration c, long chi, Anchor anchor, double[] out, int off) {
        int nnz = 0;
        int big = 0;
        int sumN = 0;
        int ones = 0;
        for (int r = 0; r < c.rows(); r++) {
            sumN += c.n(r);
            ones += c.n(r) == 1 ? 1 : 0;
            for (int j = 0; j < c.cols(); j++) {
                int q = c.q(r, j);
                nnz += q != 0 ? 1 : 0;
                big += q >= 2 ? 1 : 0;
            }
        }
        out[off] = c.rows();
        out[off + 1] = c.cols();
        out[off + 2] = chi;
        out[off + 3] = nnz;
        out[off + 4] = big;
        out[off + 5] = sumN;
        out[off + 6] = ones;
        out[off + 7] = sumN - c.cols();
        anchor.compute(c, chi, out, off);
        return anchor.h11();
    }
}
