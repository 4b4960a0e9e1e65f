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
 * class. Write {@code p_2 = sum_{x,y} S_xy J_x J_y} with the symmetric integer matrix
 * {@code S_xx = n_x + 1 - sum_j q_xj^2}, {@code S_xy = -sum_j q_xj q_yj}, formed once per input in
 * {@code O(m^2)} word operations. Then the coefficient of {@code J_x J_y} in {@code p_2} is a table
 * read, and that of {@code J_r0 J_r1 J_r2 J_r3} ({@code r0 <= .. <= r3}) in {@code p_2^2} is
 * {@code (w/3)(S_r0r1 S_r2r3 + S_r0r2 S_r1r3 + S_r0r3 S_r1r2)}, w = 4!/prod(multiplicities!) the
 * number of distinct orderings (the three pairings, each counted 8 times over the 24 orderings).
 * The column moments {@code sum_j prod_i q_{r_i j}} of {@code p_3} and {@code p_4} run only over
 * the columns touching every row of the monomial (an AND of per-row column masks), usually zero to
 * two. A four-fold's chi, {@code int c_2^2} and degree come out of one pass over the entries. Other
 * input (not Calabi-Yau, or another dimension) goes through the generic route of
 * {@link ChernClasses}, which allocates.
 *
 * <p>Not thread-safe: one instance per thread. The Calabi-Yau paths of {@link #chi} and
 * {@link #threefold} allocate nothing once the workspace has grown.
 */
public final class InvariantCalculator {
    private static final int MAX_ROWS = Configuration.MAX_ROWS;
    private static final int MAX_COLS = Configuration.MAX_COLS;

    /** {@code k!} for the multiplicities of monomials of degree at most four. */
    private static final long[] FACTORIAL = {1, 1, 2, 6, 24};
    /**
     * {@code 4! / prod(multiplicity!)} of four ascending rows by the code
     * {@code (r0 == r1) << 2 | (r1 == r2) << 1 | (r2 == r3)}.
     */
    private static final long[] ORDERINGS_OF_FOUR = {24, 12, 12, 4, 12, 6, 4, 1};

    private final IntersectionNumbers intersections = new IntersectionNumbers();
    private final long[] c2Sums = new long[MAX_ROWS];
    /** The matrix S of {@code p_2} (see the class comment), stride MAX_ROWS. */
    private final long[] pairs = new long[MAX_ROWS * MAX_ROWS];
    private final int[] labels = new int[MAX_ROWS];
    private final int[] scratch = new int[MAX_ROWS];
    /** Results of the last four-fold pass: {@code int p_2^2} and the degree. */
    private long p2SquaredSum;
    private long fourfoldDegree;

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
        // Counting needs no Block records; reduce returns c itself (no allocation) when no column is a hyperplane.
        int blocks = Blocks.label(Reduction.reduce(c), labels, scratch);
        List<TripleIntersection> triple = List.of();
        long[] c2J = new long[0];
        OptionalLong c2sq = OptionalLong.empty();
        long chi;
        long degree;
        intersections.load(c);
        if (closedFormApplies()) {
            intersections.run();
            chi = chiLoaded();
            degree = d == 4 ? fourfoldDegree : degree();
            if (d == 3) {
                c2J = new long[c.rows()];
                c2DotJThreefold(c2J);
                triple = triples();
            } else if (d == 4) {
                c2sq = OptionalLong.of(ExactMath.divideExactly(p2SquaredSum, 4, "int p2^2 of a four-fold"));
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
            degree = degree();
        }
        return new CheapInvariants(d, chi, blocks, degree, triple, c2J, c2sq);
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
        // Only columns touching every row of the monomial contribute.
        int[] rowMask = intersections.rowMask;
        int cols = rowMask[rs[off]];
        for (int e = 1; e < len; e++) {
            cols &= rowMask[rs[off + e]];
        }
        int[] q = intersections.q;
        long sum = 0;
        for (; cols != 0; cols &= cols - 1) {
            int j = Integer.numberOfTrailingZeros(cols);
            long p = q[rs[off] * MAX_COLS + j];
            for (int e = 1; e < len; e++) {
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
        long value = -Math.multiplyExact(multinomial(rs, off, len), columnMoment(rs, off, len));
        if (rs[off] == rs[off + len - 1]) {
            value += intersections.n(rs[off]) + 1;
        }
        return value;
    }

    /**
     * Fills {@link #pairs} for the loaded input: one pass over the row pairs sharing a column.
     * Entries of row pairs without a shared column are written too (as 0), so no stale value of an
     * earlier input is ever read.
     */
    private void loadPairs() {
        int m = intersections.rows();
        int[] q = intersections.q;
        int[] rowMask = intersections.rowMask;
        for (int x = 0; x < m; x++) {
            for (int y = x; y < m; y++) {
                long sum = 0;
                for (int cols = rowMask[x] & rowMask[y]; cols != 0; cols &= cols - 1) {
                    int j = Integer.numberOfTrailingZeros(cols);
                    sum = Math.addExact(sum, Math.multiplyExact((long) q[x * MAX_COLS + j], q[y * MAX_COLS + j]));
                }
                long value = x == y ? intersections.n(x) + 1 - sum : -sum;
                pairs[x * MAX_ROWS + y] = value;
                pairs[y * MAX_ROWS + x] = value;
            }
        }
    }

    /** Coefficient of {@code J_x J_y} in {@code p_2}; needs {@link #loadPairs}. */
    private long p2Coefficient(int x, int y) {
        long s = pairs[x * MAX_ROWS + y];
        return x == y ? s : Math.multiplyExact(2, s);
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
        loadPairs();
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

    /**
     * chi of a four-fold, {@code int (p_2^2 - 2 p_4) / 8}, in one pass that also leaves
     * {@code int p_2^2} and the degree in {@link #p2SquaredSum} and {@link #fourfoldDegree}.
     */
    private long chiFourfold() {
        loadPairs();
        int[] entryRows = intersections.entryRows;
        long p2Squared = 0;
        long p4 = 0;
        long degree = 0;
        for (int i = 0; i < intersections.size(); i++) {
            int r0 = entryRows[4 * i];
            int r1 = entryRows[4 * i + 1];
            int r2 = entryRows[4 * i + 2];
            int r3 = entryRows[4 * i + 3];
            long v = intersections.value(i);
            int code = (r0 == r1 ? 4 : 0) | (r1 == r2 ? 2 : 0) | (r2 == r3 ? 1 : 0);
            long orderings = ORDERINGS_OF_FOUR[code];
            long pairings = Math.addExact(Math.addExact(
                    Math.multiplyExact(pair(r0, r1), pair(r2, r3)),
                    Math.multiplyExact(pair(r0, r2), pair(r1, r3))),
                    Math.multiplyExact(pair(r0, r3), pair(r1, r2)));
            // Exact: orderings is 6, 12 or 24, or the three pairings coincide (3 | pairings).
            long p2SquaredCoefficient = Math.multiplyExact(orderings, pairings) / 3;
            long p4Coefficient = -Math.multiplyExact(orderings, columnMoment(entryRows, 4 * i, 4));
            if (code == 7) {
                p4Coefficient += intersections.n(r0) + 1;
            }
            p2Squared = Math.addExact(p2Squared, Math.multiplyExact(p2SquaredCoefficient, v));
            p4 = Math.addExact(p4, Math.multiplyExact(p4Coefficient, v));
            degree = Math.addExact(degree, Math.multiplyExact(orderings, v));
        }
        p2SquaredSum = p2Squared;
        fourfoldDegree = degree;
        return ExactMath.divideExactly(Math.subtractExact(p2Squared, Math.multiplyExact(2, p4)), 8,
                "int (p2^2 - 2 p4) of a four-fold");
    }

    private long pair(int x, int y) {
        return pairs[x * MAX_ROWS + y];
    }

    /** {@code len! / prod a_r!} for the ascending row list rs of a monomial of degree {@code len <= 4}. */
    private static long multinomial(int[] rs, int off, int len) {
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
        return FACTORIAL[len] / runs;
    }

    /** {@code int_X (sum_r J_r)^d = sum_a (d!/prod a_r!) I(a)} from the current intersections. */
    private long degree() {
        int d = intersections.dimension();
        long sum = 0;
        if (d <= 4) {
            int[] entryRows = intersections.entryRows;
            for (int i = 0; i < intersections.size(); i++) {
                sum = Math.addExact(sum, Math.multiplyExact(multinomial(entryRows, 4 * i, d), intersections.value(i)));
            }
            return sum;
        }
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
