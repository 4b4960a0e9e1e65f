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

    /** {@code len! / prod(run!)} for the multiplicity patterns of up to four rows, by pattern code. */
    private static final long[] FACTORIAL = {1, 1, 2, 6, 24};

    private final IntersectionNumbers intersections = new IntersectionNumbers();
    private final int[] rows = new int[MAX_ROWS];
    private final int[] distinct = new int[4];
    private final int[] counts = new int[4];
    private final int[] sub = new int[4];
    private final long[] c2Sums = new long[MAX_ROWS];
    private final int[] labels = new int[MAX_ROWS];
    private final int[] scratch = new int[MAX_ROWS];

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
        intersections.load(c);
        if (closedFormApplies()) {
            intersections.run();
            chi = chiLoaded();
            if (d == 3) {
                c2J = new long[c.rows()];
                c2DotJThreefold(c2J);
                triple = triples();
            } else if (d == 4) {
                c2sq = OptionalLong.of(c2SquaredCalabiYau());
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
        intersections.load(c);
        if (!closedFormApplies()) {
            return ChernClasses.of(c).eulerCharacteristic();
        }
        intersections.run();
        return chiLoaded();
    }

    /** chi by the closed form for the dimension of the loaded input (1..4, Calabi-Yau). */
    private long chiLoaded() {
        switch (intersections.dimension()) {
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
        // Plain ifs: varargs checks would box their arguments on every call of the hot path.
        if (c2JOut.length < c.rows()) {
            throw new IllegalArgumentException("c2.J output of length " + c2JOut.length + " for " + c.rows() + " rows");
        }
        intersections.load(c);
        if (intersections.dimension() != 3) {
            throw new IllegalArgumentException(c + " has dimension " + intersections.dimension() + ", not 3");
        }
        if (!closedFormApplies()) {
            ChernClasses chern = ChernClasses.of(c);
            long[] c2 = chern.c2DotJ();
            System.arraycopy(c2, 0, c2JOut, 0, c2.length);
            long chi = chern.eulerCharacteristic();
            intersections.compute(c);
            return chi;
        }
        intersections.run();
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

    /** Whether the loaded input takes the closed Calabi-Yau forms. */
    private boolean closedFormApplies() {
        int d = intersections.dimension();
        return d >= 1 && d <= 4 && intersections.calabiYau();
    }

    /** {@code sum_j prod_i q[rows[i]][j]} over the first len entries of rows (with multiplicity). */
    private long columnMoment(int[] rs, int off, int len) {
        // Only columns touching rs[0] contribute; walk that row's column list.
        int[] q = intersections.q;
        int[] cols = intersections.rowCols;
        int base = rs[off] * MAX_COLS;
        int count = intersections.rowColLen[rs[off]];
        long sum = 0;
        for (int i = 0; i < count; i++) {
            int j = cols[base + i];
            long p = q[base + j];
            for (int e = 1; e < len && p != 0; e++) {
                p = Math.multiplyExact(p, q[rs[off + e] * MAX_COLS + j]);
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
    private long powerSumCoefficient(int[] rs, int off, int len) {
        long runs = 1;
        int run = 1;
        for (int i = off + 1; i < off + len; i++) {
            if (rs[i] == rs[i - 1]) {
                run++;
            } else {
                runs *= FACTORIAL[run];
                run = 1;
            }
        }
        runs *= FACTORIAL[run];
        long multinomial = FACTORIAL[len] / runs;
        long value = -Math.multiplyExact(multinomial, columnMoment(rs, off, len));
        if (rs[off] == rs[off + len - 1]) {
            value += intersections.n(rs[off]) + 1;
        }
        return value;
    }

    /** Coefficient of {@code J_x J_y} in {@code p_2}. */
    private long p2Coefficient(int x, int y) {
        sub[0] = Math.min(x, y);
        sub[1] = Math.max(x, y);
        return powerSumCoefficient(sub, 0, 2);
    }

    private long chiSurface() {
        long sum = 0;
        int[] entryRows = intersections.entryRows;
        for (int i = 0; i < intersections.size(); i++) {
            sum = Math.addExact(sum, Math.multiplyExact(powerSumCoefficient(entryRows, 4 * i, 2), intersections.value(i)));
        }
        return -ExactMath.divideExactly(sum, 2, "int p2 of a surface");
    }

    private long chiThreefold() {
        long sum = 0;
        int[] entryRows = intersections.entryRows;
        for (int i = 0; i < intersections.size(); i++) {
            sum = Math.addExact(sum, Math.multiplyExact(powerSumCoefficient(entryRows, 4 * i, 3), intersections.value(i)));
        }
        return ExactMath.divideExactly(sum, 3, "int p3 of a three-fold");
    }

    /** {@code c2.J_u = -(1/2) sum_{a: a_u > 0} coeff(p_2, a - e_u) I(a)}. */
    private void c2DotJThreefold(long[] out) {
        int m = intersections.rows();
        for (int r = 0; r < m; r++) {
            c2Sums[r] = 0;
        }
        int[] entryRows = intersections.entryRows;
        for (int i = 0; i < intersections.size(); i++) {
            long v = intersections.value(i);
            int a = entryRows[4 * i];
            int b = entryRows[4 * i + 1];
            int c = entryRows[4 * i + 2];
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
            long coeff = Math.subtractExact(p2SquaredCoefficient(rows), Math.multiplyExact(2, powerSumCoefficient(rows, 0, 4)));
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
