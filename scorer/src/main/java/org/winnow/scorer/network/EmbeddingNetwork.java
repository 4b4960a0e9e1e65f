package org.winnow.scorer.network;

/**
 * Forward and backward passes of the bipartite message-passing network described in
 * {@link Architecture}, written out by hand over flat arrays. Stateless: the parameters come in as a
 * {@code double[]} laid out by the architecture, the activations live in a {@link Workspace}.
 *
 * <p>Per round t (0-based), with H-wide states and edge weights {@code w_rj = q_rj}:
 * <pre>
 *   a_j   = sum_r w_rj h_r           h_j' = relu(S_c h_j + M_c a_j + b_c)      (columns from rows)
 *   a_r   = sum_j w_rj h_j'          h_r' = relu(S_r h_r + M_r a_r + b_r)      (rows from new columns)
 * </pre>
 * then {@code z = [sum_r h_r, max_r h_r, sum_j h_j, max_j h_j, globals]},
 * {@code u = relu(W1 z + b1)}, {@code e = W2 u + b2}. Max-pooling ties go to the lowest index in both
 * passes; the value (not the index) is what reaches the output, so ties do not break invariance.
 */
public final class EmbeddingNetwork {
    private EmbeddingNetwork() {}

    /** Runs the forward pass on the graph already encoded in {@code ws}; the result is {@code ws.e}. */
    public static void forward(double[] p, Workspace ws) {
        Architecture a = ws.arch;
        int h = a.hidden();
        int rows = ws.rows;
        int cols = ws.cols;
        encode(p, a.rowEncW(), a.rowEncB(), ws.xr, Architecture.ROW_FEATURES, rows, h, ws.hr[0]);
        encode(p, a.colEncW(), a.colEncB(), ws.xc, Architecture.COL_FEATURES, cols, h, ws.hc[0]);
        for (int t = 0; t < a.rounds(); t++) {
            aggregate(ws.colStart, ws.colEdgeNode, ws.colEdgeWeight, cols, h, ws.hr[t], ws.ac[t]);
            update(p, a.colSelf(t), a.colMsg(t), a.colBias(t), cols, h, ws.hc[t], ws.ac[t], ws.hc[t + 1]);
            aggregate(ws.rowStart, ws.rowEdgeNode, ws.rowEdgeWeight, rows, h, ws.hc[t + 1], ws.ar[t]);
            update(p, a.rowSelf(t), a.rowMsg(t), a.rowBias(t), rows, h, ws.hr[t], ws.ar[t], ws.hr[t + 1]);
        }
        double[] z = ws.z;
        pool(ws.hr[a.rounds()], rows, h, z, 0, ws.argmaxRow);
        pool(ws.hc[a.rounds()], cols, h, z, 2 * h, ws.argmaxCol);
        System.arraycopy(ws.g, 0, z, 4 * h, Architecture.GLOBAL_FEATURES);
        int pw = a.pooledWidth();
        int w1 = a.readW1();
        int b1 = a.readB1();
        for (int o = 0; o < a.readout(); o++) {
            double s = p[b1 + o];
            int row = w1 + o * pw;
            for (int i = 0; i < pw; i++) {
                s += p[row + i] * z[i];
            }
            ws.u[o] = s > 0 ? s : 0;
        }
        int w2 = a.readW2();
        int b2 = a.readB2();
        int ro = a.readout();
        for (int o = 0; o < a.learnedDim(); o++) {
            double s = p[b2 + o];
            int row = w2 + o * ro;
            for (int i = 0; i < ro; i++) {
                s += p[row + i] * ws.u[i];
            }
            ws.e[o] = s;
        }
        if (a.anchored()) {
            ws.e[a.learnedDim()] = Architecture.ANCHOR_SCALE * ws.h11Estimate;
        }
    }

    private static void encode(double[] p, int w, int b, double[] x, int f, int nodes, int h, double[] out) {
        for (int v = 0; v < nodes; v++) {
            int xo = v * f;
            int oo = v * h;
            for (int k = 0; k < h; k++) {
                double s = p[b + k];
                int row = w + k * f;
                for (int i = 0; i < f; i++) {
                    s += p[row + i] * x[xo + i];
                }
                out[oo + k] = s > 0 ? s : 0;
            }
        }
    }

    private static void aggregate(int[] start, int[] node, double[] weight, int nodes, int h, double[] from,
            double[] out) {
        for (int v = 0; v < nodes; v++) {
            int oo = v * h;
            for (int k = 0; k < h; k++) {
                out[oo + k] = 0;
            }
            for (int e = start[v]; e < start[v + 1]; e++) {
                double w = weight[e];
                int fo = node[e] * h;
                for (int k = 0; k < h; k++) {
                    out[oo + k] += w * from[fo + k];
                }
            }
        }
    }

    private static void update(double[] p, int self, int msg, int bias, int nodes, int h, double[] prev,
            double[] agg, double[] out) {
        for (int v = 0; v < nodes; v++) {
            int vo = v * h;
            for (int k = 0; k < h; k++) {
                double s = p[bias + k];
                int sr = self + k * h;
                int mr = msg + k * h;
                for (int i = 0; i < h; i++) {
                    s += p[sr + i] * prev[vo + i] + p[mr + i] * agg[vo + i];
                }
                out[vo + k] = s > 0 ? s : 0;
            }
        }
    }

    private static void pool(double[] states, int nodes, int h, double[] z, int off, int[] argmax) {
        for (int k = 0; k < h; k++) {
            double sum = 0;
            double max = Double.NEGATIVE_INFINITY;
            int arg = 0;
            for (int v = 0; v < nodes; v++) {
                double x = states[v * h + k];
                sum += x;
                if (x > max) {
                    max = x;
                    arg = v;
                }
            }
            z[off + k] = sum;
            z[off + h + k] = max;
            argmax[k] = arg;
        }
    }

    /**
     * Adds the gradient of {@code sum_o de[o] * e[o]} with respect to the parameters to {@code grad}.
     * Requires that {@link #forward} ran last on this workspace with the same parameters.
     */
    public static void backward(double[] p, Workspace ws, double[] de, double[] grad) {
        Architecture a = ws.arch;
        int h = a.hidden();
        int rows = ws.rows;
        int cols = ws.cols;
        int ro = a.readout();
        int pw = a.pooledWidth();
        int w2 = a.readW2();
        int b2 = a.readB2();
        double[] u = ws.u;
        double[] du = ws.du;
        java.util.Arrays.fill(du, 0);
        for (int o = 0; o < a.learnedDim(); o++) { // the anchor coordinate has no parameters
            double g = de[o];
            grad[b2 + o] += g;
            int row = w2 + o * ro;
            for (int i = 0; i < ro; i++) {
                grad[row + i] += g * u[i];
                du[i] += p[row + i] * g;
            }
        }
        int w1 = a.readW1();
        int b1 = a.readB1();
        double[] z = ws.z;
        double[] dz = ws.dz;
        java.util.Arrays.fill(dz, 0);
        for (int o = 0; o < ro; o++) {
            if (u[o] <= 0) {
                continue;
            }
            double g = du[o];
            grad[b1 + o] += g;
            int row = w1 + o * pw;
            for (int i = 0; i < pw; i++) {
                grad[row + i] += g * z[i];
                dz[i] += p[row + i] * g;
            }
        }
        double[] dhr = ws.dhr;
        double[] dhc = ws.dhc;
        double[] dhrPrev = ws.dhrPrev;
        double[] dhcPrev = ws.dhcPrev;
        for (int r = 0; r < rows; r++) {
            for (int k = 0; k < h; k++) {
                dhr[r * h + k] = dz[k] + (ws.argmaxRow[k] == r ? dz[h + k] : 0);
            }
        }
        for (int c = 0; c < cols; c++) {
            for (int k = 0; k < h; k++) {
                dhc[c * h + k] = dz[2 * h + k] + (ws.argmaxCol[k] == c ? dz[3 * h + k] : 0);
            }
        }
        for (int t = a.rounds() - 1; t >= 0; t--) {
            java.util.Arrays.fill(dhrPrev, 0, rows * h, 0);
            backUpdate(p, a.rowSelf(t), a.rowMsg(t), a.rowBias(t), rows, h, ws.hr[t], ws.ar[t], ws.hr[t + 1],
                    dhr, dhrPrev, ws.dpre, ws.dmsg, grad);
            scatter(ws.rowStart, ws.rowEdgeNode, ws.rowEdgeWeight, rows, h, ws.dmsg, dhc);
            java.util.Arrays.fill(dhcPrev, 0, cols * h, 0);
            backUpdate(p, a.colSelf(t), a.colMsg(t), a.colBias(t), cols, h, ws.hc[t], ws.ac[t], ws.hc[t + 1],
                    dhc, dhcPrev, ws.dpre, ws.dmsg, grad);
            scatter(ws.colStart, ws.colEdgeNode, ws.colEdgeWeight, cols, h, ws.dmsg, dhrPrev);
            double[] s = dhr;
            dhr = dhrPrev;
            dhrPrev = s;
            s = dhc;
            dhc = dhcPrev;
            dhcPrev = s;
        }
        backEncode(a.rowEncW(), a.rowEncB(), ws.xr, Architecture.ROW_FEATURES, rows, h, ws.hr[0], dhr, grad);
        backEncode(a.colEncW(), a.colEncB(), ws.xc, Architecture.COL_FEATURES, cols, h, ws.hc[0], dhc, grad);
    }

    private static void backUpdate(double[] p, int self, int msg, int bias, int nodes, int h, double[] prev,
            double[] agg, double[] out, double[] dout, double[] dprev, double[] dpre, double[] dmsg,
            double[] grad) {
        for (int v = 0; v < nodes; v++) {
            int vo = v * h;
            for (int i = 0; i < h; i++) {
                dmsg[vo + i] = 0;
            }
            for (int k = 0; k < h; k++) {
                double g = out[vo + k] > 0 ? dout[vo + k] : 0;
                if (g == 0) {
                    continue;
                }
                grad[bias + k] += g;
                int sr = self + k * h;
                int mr = msg + k * h;
                for (int i = 0; i < h; i++) {
                    grad[sr + i] += g * prev[vo + i];
                    grad[mr + i] += g * agg[vo + i];
                    dprev[vo + i] += p[sr + i] * g;
                    dmsg[vo + i] += p[mr + i] * g;
                }
            }
        }
    }

    private static void scatter(int[] start, int[] node, double[] weight, int nodes, int h, double[] dmsg,
            double[] dfrom) {
        for (int v = 0; v < nodes; v++) {
            int vo = v * h;
            for (int e = start[v]; e < start[v + 1]; e++) {
                double w = weight[e];
                int fo = node[e] * h;
                for (int k = 0; k < h; k++) {
                    dfrom[fo + k] += w * dmsg[vo + k];
                }
            }
        }
    }

    private static void backEncode(int w, int b, double[] x, int f, int nodes, int h, double[] out, double[] dout,
            double[] grad) {
        for (int v = 0; v < nodes; v++) {
            for (int k = 0; k < h; k++) {
                double g = out[v * h + k] > 0 ? dout[v * h + k] : 0;
                if (g == 0) {
                    continue;
                }
                grad[b + k] += g;
                int row = w + k * f;
                for (int i = 0; i < f; i++) {
                    grad[row + i] += g * x[v * f + i];
                }
            }
        }
    }
}
