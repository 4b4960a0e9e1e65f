package org.winnow.geometry.invariants;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.OptionalLong;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * Computes the cheap invariants of configuration matrices with a reusable workspace.
 *
 * <p>For Calabi-Yau input of dimension 1..4 the closed forms apply ({@code p_1 = 0}, with the power
 * sums {@code p_k = sum_r (n_r+1) J_r^k - sum_j D_j^k}):
 * {@code c_2 = -p_2/2}, {@code c_3 = p_3/3}, {@code c_4 = p_2^2/8 - p_4/4}. Each integral is a sum
 * over the nonzero intersection numbers {@code I(a)} of the coefficient of {@code J^a} in the
 * class, and that coefficient is a short sum over the columns, so the cost after the intersection
 * programme is about (number of nonzero {@code I(a)}) x K. Other input (not Calabi-Yau, or another
 * dimension) goes through the generic route of {@link ChernClasses}, which allocates.
 *
 * <p>Not thread-safe: one instance per thread. The Calabi-Yau paths of {@link #chi} and
 * {@link #threefold} allocate nothing once the workspace has grown.
 */
public final class InvariantCalculator {
    private static final int MAX_ROWS = Configuration.MAX_ROWS;
    private static final int MAX_COLS = Configuration.MAX_COLS;

    private final IntersectionNumbers intersections = new IntersectionNumbers();
    private final int[] q = new int[MAX_ROWS * MAX_COLS];
    private final int[] n = new int[MAX_ROWS];
    private final int[] rows = new int[MAX_ROWS];
    private final int[] distinct = new int[4];
    private final int[] counts = new int[4];
    private final int[] sub = new int[4];
    private final long[] c2Sums = new long[MAX_ROWS];
    private final int[] labels = new int[MAX_ROWS];
    private final int[] scratch = new int[MAX_ROWS];
    private int m;
    private int k;

    /** The intersection numbers of the last computation (valid until the next call). */
    public IntersectionNumbers intersections() {
        return intersections;
    }

    /**
     * All cheap invariants of {@code c}. Any shape with {@code dim >= 0} is accepted; Calabi-Yau
     * input of dimension 1..4 takes the closed forms, everything else the generic route.
     *
     * @throws IllegalArgumentException if the dimension is negative (the generic X is empty)
     * @throws ArithmeticException on overflow or on a failed divisibility check
     */
    public CheapInvariants compute(Configuration c) {
        int d = c.dimension();
        Checks.requireArgument(d >= 0, "%s has negative dimension %d: the generic complete intersection is empty", c, d);
        int blocks = Blocks.of(Reduction.reduce(c)).count();
        List<TripleIntersection> triple = List.of();
        long[] c2J = new long[0];
        OptionalLong c2sq = OptionalLong.empty();
        long chi;
        if (closedFormApplies(c)) {
            if (d == 3) {
                c2J = new long[c.rows()];
                chi = threefold(c, c2J);
                triple = triples();
            } else {
                chi = chi(c);
                if (d == 4) {
                    c2sq = OptionalLong.of(c2SquaredCalabiYau());
                }
            }
        } else {
            ChernClasses chern = ChernClasses.of(c);
            chi = chern.eulerCharacteristic();
            intersections.compute(c);
            if (d == 3) {
                c2J = chern.c2DotJ();
                triple = triples();
            } else if (d == 4) {
                c2sq = OptionalLong.of(chern.c2Squared());
            }
        }
        return new CheapInvariants(d, chi, blocks, degree(), triple, c2J, c2sq);
    }

    /**
     * The Euler characteristic. Allocation-free for Calabi-Yau input of dimension 1..4; other input
     * takes the generic route.
     */
    public long chi(Configuration c) {
        if (!closedFormApplies(c)) {
            return ChernClasses.of(c).eulerCharacteristic();
        }
        load(c);
        intersections.compute(c);
        switch (c.dimension()) {
            case 1:
                return 0;
            case 2:
                return chiSurface();
            case 3:
                return chiThreefold();
            default:
                return chiFourfold();
        }
    }

    /**
     * Euler characteristic and {@code c2.J} of a three-fold; {@code c2JOut[r]} receives
     * {@code int_X c_2 J_r} for every row r. Afterwards {@link #intersections()} gives the triple
     * intersections ({@link IntersectionNumbers#triple}). Allocation-free for Calabi-Yau input.
     *
     * @throws IllegalArgumentException if the dimension is not 3 or {@code c2JOut} is too short
     */
    public long threefold(Configuration c, long[] c2JOut) {
        Checks.requireArgument(c.dimension() == 3, "%s has dimension %d, not 3", c, c.dimension());
        Checks.requireArgument(c2JOut.length >= c.rows(), "c2.J output of length %d for %d rows", c2JOut.length, c.rows());
        if (!closedFormApplies(c)) {
            ChernClasses chern = ChernClasses.of(c);
            long[] c2 = chern.c2DotJ();
            System.arraycopy(c2, 0, c2JOut, 0, c2.length);
            long chi = chern.eulerCharacteristic();
            intersections.compute(c);
            return chi;
        }
        load(c);
        intersections.compute(c);
        long chi = chiThreefold();
        c2DotJThreefold(c2JOut);
        return chi;
    }

    /**
     * Number of blocks of {@code c} as given (no reduction), allocation-free. {@link #compute}
     * reports the blocks of the reduced matrix, which differ only when deleting a point row
     * disconnects the matrix.
     */
    public int blockCount(Configuration c) {
        return Blocks.label(c, labels, scratch);
    }

    private static boolean closedFormApplies(Configuration c) {
        int d = c.dimension();
        return d >= 1 && d <= 4 && c.isCalabiYau();
    }

    private void load(Configuration c) {
        m = c.rows();
        k = c.cols();
        for (int r = 0; r < m; r++) {
            n[r] = c.n(r);
            for (int j = 0; j < k; j++) {
                q[r * MAX_COLS + j] = c.q(r, j);
            }
        }
    }

    /** {@code sum_j prod_i q[rows[i]][j]} over the first len entries of rows (with multiplicity). */
    private long columnMoment(int[] rs, int len) {
        long sum = 0;
        for (int j = 0; j < k; j++) {
            long p = q[rs[0] * MAX_COLS + j];
            for (int i = 1; i < len && p != 0; i++) {
                p = Math.multiplyExact(p, q[rs[i] * MAX_COLS + j]);
            }
            sum = Math.addExact(sum, p);
        }
        return sum;
    }

    /**
     * Coefficient of {@code J^a} in {@code p_len}, where a is given by the ascending row list rs:
     * {@code (n_r+1)} if a = len e_r, minus the multinomial {@code len!/prod a_r!} times the column
     * moment.
     */
    private long powerSumCoefficient(int[] rs, int len) {
        long multinomial = ExactMath.factorial(len);
        int run = 1;
        for (int i = 1; i <= len; i++) {
            if (i < len && rs[i] == rs[i - 1]) {
                run++;
            } else {
                multinomial /= ExactMath.factorial(run);
                run = 1;
            }
        }
        long value = -Math.multiplyExact(multinomial, columnMoment(rs, len));
        if (rs[0] == rs[len - 1]) {
            value += n[rs[0]] + 1;
        }
        return value;
    }

    /** Coefficient of {@code J_x J_y} in {@code p_2}. */
    private long p2Coefficient(int x, int y) {
        sub[0] = Math.min(x, y);
        sub[1] = Math.max(x, y);
        return powerSumCoefficient(sub, 2);
    }

    private long chiSurface() {
        long sum = 0;
        for (int i = 0; i < intersections.size(); i++) {
            intersections.rowsOf(i, rows);
            sum = Math.addExact(sum, Math.multiplyExact(powerSumCoefficient(rows, 2), intersections.value(i)));
        }
        return -ExactMath.divideExactly(sum, 2, "int p2 of a surface");
    }

    private long chiThreefold() {
        long sum = 0;
        for (int i = 0; i < intersections.size(); i++) {
            intersections.rowsOf(i, rows);
            sum = Math.addExact(sum, Math.multiplyExact(powerSumCoefficient(rows, 3), intersections.value(i)));
        }
        return ExactMath.divideExactly(sum, 3, "int p3 of a three-fold");
    }

    /** {@code c2.J_u = -(1/2) sum_{a: a_u > 0} coeff(p_2, a - e_u) I(a)}. */
    private void c2DotJThreefold(long[] out) {
        for (int r = 0; r < m; r++) {
            c2Sums[r] = 0;
        }
        for (int i = 0; i < intersections.size(); i++) {
            intersections.rowsOf(i, rows);
            long v = intersections.value(i);
            int a = rows[0];
            int b = rows[1];
            int c = rows[2];
            // Each distinct row u of a once, with the remaining pair a - e_u.
            c2Sums[a] = Math.addExact(c2Sums[a], Math.multiplyExact(p2Coefficient(b, c), v));
            if (b != a) {
                c2Sums[b] = Math.addExact(c2Sums[b], Math.multiplyExact(p2Coefficient(a, c), v));
            }
            if (c != b) {
                c2Sums[c] = Math.addExact(c2Sums[c], Math.multiplyExact(p2Coefficient(a, b), v));
            }
        }
        for (int r = 0; r < m; r++) {
            out[r] = -ExactMath.divideExactly(c2Sums[r], 2, "int p2 J of a three-fold");
        }
    }

    /** Coefficient of {@code J^a} in {@code p_2^2}, a given by the ascending four rows in rows[]. */
    private long p2SquaredCoefficient(int[] rs) {
        int s = 0;
        for (int i = 0; i < 4; i++) {
            if (i == 0 || rs[i] != rs[i - 1]) {
                distinct[s] = rs[i];
                counts[s] = 0;
                s++;
            }
            counts[s - 1]++;
        }
        long sum = 0;
        // Ordered splits a = b + b' with |b| = |b'| = 2, b running over the sub-multisets of a.
        for (int x = 0; x < s; x++) {
            for (int y = x; y < s; y++) {
                if (x == y && counts[x] < 2) {
                    continue;
                }
                counts[x]--;
                counts[y]--;
                int rx = -1;
                int ry = -1;
                for (int z = 0; z < s; z++) {
                    for (int e = 0; e < counts[z]; e++) {
                        if (rx < 0) {
                            rx = distinct[z];
                        } else {
                            ry = distinct[z];
                        }
                    }
                }
                counts[x]++;
                counts[y]++;
                long left = p2Coefficient(distinct[x], distinct[y]);
                long right = p2Coefficient(rx, ry);
                sum = Math.addExact(sum, Math.multiplyExact(left, right));
            }
        }
        return sum;
    }

    private long chiFourfold() {
        long sum = 0;
        for (int i = 0; i < intersections.size(); i++) {
            intersections.rowsOf(i, rows);
            long coeff = Math.subtractExact(p2SquaredCoefficient(rows), Math.multiplyExact(2, powerSumCoefficient(rows, 4)));
            sum = Math.addExact(sum, Math.multiplyExact(coeff, intersections.value(i)));
        }
        return ExactMath.divideExactly(sum, 8, "int (p2^2 - 2 p4) of a four-fold");
    }

    /** {@code int c_2^2 = (1/4) int p_2^2} for a Calabi-Yau four-fold; needs the state of {@link #chi}. */
    private long c2SquaredCalabiYau() {
        long sum = 0;
        for (int i = 0; i < intersections.size(); i++) {
            intersections.rowsOf(i, rows);
            sum = Math.addExact(sum, Math.multiplyExact(p2SquaredCoefficient(rows), intersections.value(i)));
        }
        return ExactMath.divideExactly(sum, 4, "int p2^2 of a four-fold");
    }

    /** {@code int_X (sum_r J_r)^d = sum_a (d!/prod a_r!) I(a)} from the current intersections. */
    private long degree() {
        int d = intersections.dimension();
        long sum = 0;
        for (int i = 0; i < intersections.size(); i++) {
            long multinomial = ExactMath.factorial(d);
            for (int r = 0; r < intersections.rows(); r++) {
                multinomial /= ExactMath.factorial(intersections.exponent(i, r));
            }
            sum = Math.addExact(sum, Math.multiplyExact(multinomial, intersections.value(i)));
        }
        return sum;
    }

    private List<TripleIntersection> triples() {
        List<TripleIntersection> out = new ArrayList<>(intersections.size());
        int[] rs = new int[3];
        for (int i = 0; i < intersections.size(); i++) {
            intersections.rowsOf(i, rs);
            out.add(new TripleIntersection(rs[0], rs[1], rs[2], intersections.value(i)));
        }
        out.sort(Comparator.comparingInt(TripleIntersection::r)
                .thenComparingInt(TripleIntersection::s)
                .thenComparingInt(TripleIntersection::t));
        return out;
    }
}
