package org.winnow.scorer.network;

import org.winnow.geometry.Configuration;

/**
 * Every buffer one forward (and backward) pass needs, sized for the largest configuration, so the hot
 * loop allocates nothing. Not thread-safe: one per thread.
 */
public final class Workspace {
    private static final int MAX_R = Configuration.MAX_ROWS;
    private static final int MAX_C = Configuration.MAX_COLS;
    private static final int MAX_E = MAX_R * MAX_C;

    final Architecture arch;
    int rows;
    int cols;
    final double[] xr = new double[MAX_R * Architecture.ROW_FEATURES];
    final double[] xc = new double[MAX_C * Architecture.COL_FEATURES];
    final double[] g = new double[Architecture.GLOBAL_FEATURES];
    public final Anchor anchor = new Anchor();
    /** The anchor h11 of the encoded configuration ({@link Anchor}). */
    public int h11Estimate;
    final int[] colStart = new int[MAX_C + 1];
    final int[] colEdgeNode = new int[MAX_E];
    final double[] colEdgeWeight = new double[MAX_E];
    final int[] rowStart = new int[MAX_R + 1];
    final int[] rowEdgeNode = new int[MAX_E];
    final double[] rowEdgeWeight = new double[MAX_E];

    /** Node states after stage t (0 = encoders), rows then columns. */
    final double[][] hr;
    final double[][] hc;
    /** Aggregated messages of round t. */
    final double[][] ar;
    final double[][] ac;
    final double[] z;
    /** One node's state while the inference pass encodes and pools it. */
    final double[] node;
    final int[] argmaxRow;
    final int[] argmaxCol;
    public final double[] u;
    public final double[] e;

    // Backward buffers.
    final double[] dhr;
    final double[] dhc;
    final double[] dhrPrev;
    final double[] dhcPrev;
    final double[] dpre;
    final double[] dmsg;
    final double[] dz;
    final double[] du;

    public Workspace(Architecture arch) {
        this.arch = arch;
        int h = arch.hidden();
        hr = new double[arch.rounds() + 1][MAX_R * h];
        hc = new double[arch.rounds() + 1][MAX_C * h];
        ar = new double[Math.max(1, arch.rounds())][MAX_R * h];
        ac = new double[Math.max(1, arch.rounds())][MAX_C * h];
        z = new double[arch.pooledWidth()];
        node = new double[h];
        argmaxRow = new int[h];
        argmaxCol = new int[h];
        u = new double[arch.readout()];
        e = new double[arch.dim()];
        dhr = new double[MAX_R * h];
        dhc = new double[MAX_C * h];
        dhrPrev = new double[MAX_R * h];
        dhcPrev = new double[MAX_C * h];
        dpre = new double[Math.max(MAX_R, MAX_C) * h];
        dmsg = new double[Math.max(MAX_R, MAX_C) * h];
        dz = new double[arch.pooledWidth()];
        du = new double[arch.readout()];
    }
}
