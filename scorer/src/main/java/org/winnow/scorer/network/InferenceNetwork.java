package org.winnow.scorer.network;

/**
 * The forward pass of {@link EmbeddingNetwork} for scoring. Each layer computes its outputs four at a
 * time, in four independent accumulators that share every load of the input, instead of one output's
 * dependent add chain after the other: the JIT keeps the four sums in registers and the additions of
 * different outputs overlap. (Axpy-shaped loops over the output index, with transposed weights, were tried
 * first: at the default widths, 12 and 24, C2 does not vectorise loops that short and they ran slower
 * than the dot products; docs/benchmarks.md, "Scorer speed".)
 *
 * <p>The arithmetic is that of the training pass operation for operation: every output starts from its
 * bias and adds {@code w_i x_i} for {@code i = 0, 1, ...} in the same order, pooling adds the nodes in the
 * same order, so the embedding equals {@link EmbeddingNetwork#forward} bit for bit (tested against it).
 * Without message-passing rounds (the default shape) no node state is stored: each node is encoded and
 * pooled at once. Immutable and thread-safe; the activations live in the caller's {@link Workspace}.
 */
public final class InferenceNetwork {
    private final Architecture arch;
    private final int h;
    private final double[] rowEnc;
    private final double[] rowEncBias;
    private final double[] colEnc;
    private final double[] colEncBias;
    private final double[][] colSelf;
    private final double[][] colMsg;
    private final double[][] colBias;
    private final double[][] rowSelf;
    private final double[][] rowMsg;
    private final double[][] rowBias;
    private final double[] read1;
    private final double[] read1Bias;
    private final double[] read2;
    private final double[] read2Bias;

    /** Copies each layer's weights out of {@code parameters}, laid out as {@code arch} says. */
    public InferenceNetwork(Architecture arch, double[] parameters) {
        this.arch = arch;
        this.h = arch.hidden();
        int f = Architecture.ROW_FEATURES;
        int g = Architecture.COL_FEATURES;
        this.rowEnc = slice(parameters, arch.rowEncW(), h * f);
        this.rowEncBias = slice(parameters, arch.rowEncB(), h);
        this.colEnc = slice(parameters, arch.colEncW(), h * g);
        this.colEncBias = slice(parameters, arch.colEncB(), h);
        int t = arch.rounds();
        colSelf = new double[t][];
        colMsg = new double[t][];
        colBias = new double[t][];
        rowSelf = new double[t][];
        rowMsg = new double[t][];
        rowBias = new double[t][];
        for (int r = 0; r < t; r++) {
            colSelf[r] = slice(parameters, arch.colSelf(r), h * h);
            colMsg[r] = slice(parameters, arch.colMsg(r), h * h);
            colBias[r] = slice(parameters, arch.colBias(r), h);
            rowSelf[r] = slice(parameters, arch.rowSelf(r), h * h);
            rowMsg[r] = slice(parameters, arch.rowMsg(r), h * h);
            rowBias[r] = slice(parameters, arch.rowBias(r), h);
        }
        this.read1 = slice(parameters, arch.readW1(), arch.readout() * arch.pooledWidth());
        this.read1Bias = slice(parameters, arch.readB1(), arch.readout());
        this.read2 = slice(parameters, arch.readW2(), arch.learnedDim() * arch.readout());
        this.read2Bias = slice(parameters, arch.readB2(), arch.learnedDim());
    }

    private static double[] slice(double[] p, int off, int len) {
        return java.util.Arrays.copyOfRange(p, off, off + len);
    }

    /** Runs the forward pass on the graph already encoded in {@code ws}; the result is {@code ws.e}. */
    public void forward(Workspace ws) {
        double[] z = ws.z;
        int rounds = arch.rounds();
        int f = Architecture.ROW_FEATURES;
        int g = Architecture.COL_FEATURES;
        if (rounds == 0) {
            encodeAndPool(rowEnc, rowEncBias, ws.xr, f, ws.rows, ws.node, z, 0);
            encodeAndPool(colEnc, colEncBias, ws.xc, g, ws.cols, ws.node, z, 2 * h);
        } else {
            for (int v = 0; v < ws.rows; v++) {
                dense(rowEnc, rowEncBias, ws.xr, v * f, f, ws.hr[0], v * h, true);
            }
            for (int v = 0; v < ws.cols; v++) {
                dense(colEnc, colEncBias, ws.xc, v * g, g, ws.hc[0], v * h, true);
            }
            for (int t = 0; t < rounds; t++) {
                aggregate(ws.colStart, ws.colEdgeNode, ws.colEdgeWeight, ws.cols, ws.hr[t], ws.ac[t]);
                update(colSelf[t], colMsg[t], colBias[t], ws.cols, ws.hc[t], ws.ac[t], ws.hc[t + 1]);
                aggregate(ws.rowStart, ws.rowEdgeNode, ws.rowEdgeWeight, ws.rows, ws.hc[t + 1], ws.ar[t]);
                update(rowSelf[t], rowMsg[t], rowBias[t], ws.rows, ws.hr[t], ws.ar[t], ws.hr[t + 1]);
            }
            pool(ws.hr[rounds], ws.rows, z, 0);
            pool(ws.hc[rounds], ws.cols, z, 2 * h);
        }
        System.arraycopy(ws.g, 0, z, 4 * h, Architecture.GLOBAL_FEATURES);
        dense(read1, read1Bias, z, 0, arch.pooledWidth(), ws.u, 0, true);
        dense(read2, read2Bias, ws.u, 0, arch.readout(), ws.e, 0, false);
        if (arch.anchored()) {
            ws.e[arch.learnedDim()] = Architecture.ANCHOR_SCALE * ws.h11Estimate;
        }
    }

    /**
     * {@code out[oo + o] = b[o] + sum_i w[o][i] x[xo + i]} ({@code w} row-major, {@code n} inputs, one row
     * per bias), each sum taken with {@code i} ascending; then the ReLU if {@code relu}.
     */
    private static void dense(double[] w, double[] bias, double[] x, int xo, int n, double[] out, int oo,
            boolean relu) {
        int outputs = bias.length;
        int o = 0;
        for (; o + 4 <= outputs; o += 4) {
            double s0 = bias[o];
            double s1 = bias[o + 1];
            double s2 = bias[o + 2];
            double s3 = bias[o + 3];
            int r = o * n;
            for (int i = 0; i < n; i++) {
                double xi = x[xo + i];
                int ri = r + i;
                s0 += w[ri] * xi;
                s1 += w[ri + n] * xi;
                s2 += w[ri + 2 * n] * xi;
                s3 += w[ri + 3 * n] * xi;
            }
            out[oo + o] = s0;
            out[oo + o + 1] = s1;
            out[oo + o + 2] = s2;
            out[oo + o + 3] = s3;
        }
        for (; o < outputs; o++) {
            double s = bias[o];
            int r = o * n;
            for (int i = 0; i < n; i++) {
                s += w[r + i] * x[xo + i];
            }
            out[oo + o] = s;
        }
        if (relu) {
            for (o = 0; o < outputs; o++) {
                out[oo + o] = out[oo + o] > 0 ? out[oo + o] : 0;
            }
        }
    }

    /**
     * Encodes each node into {@code node} and pools it at once: sums into {@code z[off..off+h)}, maxima into
     * {@code z[off+h..off+2h)}, nodes in index order as {@link EmbeddingNetwork}'s pooling adds them.
     */
    private void encodeAndPool(double[] w, double[] bias, double[] x, int f, int nodes, double[] node, double[] z,
            int off) {
        int maxOff = off + h;
        for (int k = 0; k < h; k++) {
            z[off + k] = 0;
            z[maxOff + k] = Double.NEGATIVE_INFINITY;
        }
        for (int v = 0; v < nodes; v++) {
            dense(w, bias, x, v * f, f, node, 0, true);
            for (int k = 0; k < h; k++) {
                // ReLU outputs are +0.0 or positive, so Math.max picks what a strict comparison picks.
                double y = node[k];
                z[off + k] += y;
                z[maxOff + k] = Math.max(z[maxOff + k], y);
            }
        }
    }

    private void aggregate(int[] start, int[] node, double[] weight, int nodes, double[] from, double[] out) {
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

    /** {@code out_v = relu(b + sum_i (S[k][i] prev_v[i] + M[k][i] agg_v[i]))}, each pair added first. */
    private void update(double[] self, double[] msg, double[] bias, int nodes, double[] prev, double[] agg,
            double[] out) {
        for (int v = 0; v < nodes; v++) {
            int vo = v * h;
            int k = 0;
            for (; k + 2 <= h; k += 2) {
                double s0 = bias[k];
                double s1 = bias[k + 1];
                int r0 = k * h;
                int r1 = r0 + h;
                for (int i = 0; i < h; i++) {
                    double p = prev[vo + i];
                    double a = agg[vo + i];
                    s0 += self[r0 + i] * p + msg[r0 + i] * a;
                    s1 += self[r1 + i] * p + msg[r1 + i] * a;
                }
                out[vo + k] = s0 > 0 ? s0 : 0;
                out[vo + k + 1] = s1 > 0 ? s1 : 0;
            }
            for (; k < h; k++) {
                double s = bias[k];
                int r = k * h;
                for (int i = 0; i < h; i++) {
                    s += self[r + i] * prev[vo + i] + msg[r + i] * agg[vo + i];
                }
                out[vo + k] = s > 0 ? s : 0;
            }
        }
    }

    private void pool(double[] states, int nodes, double[] z, int off) {
        int maxOff = off + h;
        for (int k = 0; k < h; k++) {
            z[off + k] = 0;
            z[maxOff + k] = Double.NEGATIVE_INFINITY;
        }
        for (int v = 0; v < nodes; v++) {
            int so = v * h;
            for (int k = 0; k < h; k++) {
                double y = states[so + k];
                z[off + k] += y;
                z[maxOff + k] = Math.max(z[maxOff + k], y);
            }
        }
    }
}
