package org.winnow.geometry.cohomology;

import java.util.Arrays;
import org.winnow.geometry.Configuration;

/**
 * The Koszul first pages of every line bundle the tangent and cotangent sequences of a Calabi-Yau
 * complete intersection X need, tallied per total degree: {@code O_X(-J_i)} for every row i and
 * {@code O_X(-q_j)} for every column j. For each bundle and total degree t it keeps the sum of the
 * first-page dimensions {@code E1_t = sum_S h^{t+|S|}(A, B - q_S)} and the smallest and largest
 * Koszul column {@code p = |S|} of a nonzero entry, which decide whether a later differential can
 * reach degree t (see {@link #settled}). The positive bundles {@code O_X(J_i)}, {@code O_X(q_j)} follow
 * by Serre duality on X ({@code K_X} is trivial): {@code h^q(O_X(L)) = h^{d-q}(O_X(-L))}, and the dual
 * first page is the mirror image of this one, so its settled degrees are the mirrored ones.
 *
 * <p>Why a class of its own beside {@link H11Estimator}: that one reads only degrees 1 and 2 of the
 * same pages and is the model's tuned h11 anchor, whose values must not move; this one reads every
 * degree, which costs a few more products per leaf. The search is the same: a summand of a negative
 * bundle is nonzero only when every row of its degree is 0 or at most {@code -n_r - 1}, so the pruned
 * depth-first search over column subsets of {@link H11Estimator} (rows stuck in the gap {@code 1..n_r}
 * cut a branch unless one bundle can still lift them) visits every nonzero summand of every bundle,
 * of every total degree. Tested term by term against {@link KoszulPage}.
 *
 * <p>Also counts the blocks of the matrix (connected components of rows joined by columns), which
 * the breadth-first column order finds for free.
 *
 * <p>NOT thread-safe: it owns its buffers; one per thread. {@link #compute} allocates nothing.
 */
public final class FirstPageTally {
    /**
     * The lowest total degree tallied: two below 0, so that degree 0 can be tested for incoming maps
     * and degree -1 (which must vanish) for its own incoming maps.
     */
    public static final int MIN_DEGREE = -2;
    /** The highest total degree tallied: two above the largest dimension handled (4), for the same reason. */
    public static final int MAX_DEGREE = 6;
    private static final int SLOTS = MAX_DEGREE - MIN_DEGREE + 1;
    private static final int BUNDLES = Configuration.MAX_ROWS + Configuration.MAX_COLS;

    private final int[] sums = new int[Configuration.MAX_ROWS];
    private final int[] excluded = new int[Configuration.MAX_ROWS];
    private final int[] order = new int[Configuration.MAX_COLS];
    private final int[] supportRow = new int[Configuration.MAX_COLS * Configuration.MAX_ROWS];
    private final int[] supportDegree = new int[Configuration.MAX_COLS * Configuration.MAX_ROWS];
    private final int[] supportSize = new int[Configuration.MAX_COLS];
    private final int[] supportMask = new int[Configuration.MAX_COLS];
    private final int[] rowColumns = new int[Configuration.MAX_ROWS];
    private final int[] dims = new int[Configuration.MAX_ROWS];
    private final int[] degrees = new int[Configuration.MAX_ROWS * Configuration.MAX_COLS];
    private final int[] decided = new int[Configuration.MAX_COLS + 1];
    /** Per bundle (rows first, then columns) and slot {@code t - MIN_DEGREE}. */
    private final long[] dimension = new long[BUNDLES * SLOTS];
    private final int[] minP = new int[BUNDLES * SLOTS];
    private final int[] maxP = new int[BUNDLES * SLOTS];
    private int rows;
    private int cols;
    private int blocks;
    private int dim;

    /**
     * Tallies the first pages of {@code config}, which must be a Calabi-Yau configuration (every row
     * sum {@code n_r + 1}; validated by the caller).
     *
     * @throws ArithmeticException if a dimension exceeds {@code Long.MAX_VALUE}
     */
    public void compute(Configuration config) {
        int m = config.rows();
        int k = config.cols();
        rows = m;
        cols = k;
        dim = config.dimension();
        for (int r = 0; r < m; r++) {
            sums[r] = 0;
            excluded[r] = 0;
            dims[r] = config.n(r);
        }
        Arrays.fill(rowColumns, 0, m, 0);
        for (int j = 0; j < k; j++) {
            int size = 0;
            int mask = 0;
            for (int r = 0; r < m; r++) {
                int q = config.q(r, j);
                degrees[r * Configuration.MAX_COLS + j] = q;
                if (q != 0) {
                    supportRow[j * Configuration.MAX_ROWS + size] = r;
                    supportDegree[j * Configuration.MAX_ROWS + size] = q;
                    size++;
                    mask |= 1 << r;
                    rowColumns[r] |= 1 << j;
                }
            }
            supportSize[j] = size;
            supportMask[j] = mask;
        }
        orderColumns();
        Arrays.fill(dimension, 0, (m + k) * SLOTS, 0L);
        Arrays.fill(minP, 0, (m + k) * SLOTS, Integer.MAX_VALUE);
        Arrays.fill(maxP, 0, (m + k) * SLOTS, -1);
        search(0, 0, 0, 0);
    }

    private void search(int j, int subset, int size, int gapRows) {
        if (gapRows != 0 && !canStillContribute(j, subset, gapRows)) {
            return;
        }
        if (j == cols) {
            leaf(subset, size);
            return;
        }
        int col = order[j];
        int base = col * Configuration.MAX_ROWS;
        int len = supportSize[col];
        int outGap = gapRows;
        int inGap = gapRows;
        for (int x = 0; x < len; x++) {
            int r = supportRow[base + x];
            if (sums[r] > 0) {
                outGap |= 1 << r;
            }
            if (excluded[r] > 0) {
                inGap |= 1 << r;
            }
            excluded[r] += supportDegree[base + x];
        }
        search(j + 1, subset, size, outGap);
        for (int x = 0; x < len; x++) {
            int r = supportRow[base + x];
            int q = supportDegree[base + x];
            excluded[r] -= q;
            sums[r] += q;
        }
        search(j + 1, subset | 1 << col, size + 1, inGap);
        for (int x = 0; x < len; x++) {
            sums[supportRow[base + x]] -= supportDegree[base + x];
        }
    }

    /** Breadth-first column order over shared rows (as in {@link H11Estimator}); counts the blocks. */
    private void orderColumns() {
        int k = cols;
        int placed = 0;
        int seen = 0;
        blocks = 0;
        for (int start = 0; start < k; start++) {
            if ((seen & (1 << start)) != 0) {
                continue;
            }
            blocks++;
            seen |= 1 << start;
            order[placed++] = start;
            for (int head = placed - 1; head < placed; head++) {
                int from = order[head];
                for (int rs = supportMask[from]; rs != 0; rs &= rs - 1) {
                    int fresh = rowColumns[Integer.numberOfTrailingZeros(rs)] & ~seen;
                    seen |= fresh;
                    for (; fresh != 0; fresh &= fresh - 1) {
                        order[placed++] = Integer.numberOfTrailingZeros(fresh);
                    }
                }
            }
        }
        for (int j = 0; j < k; j++) {
            decided[j + 1] = decided[j] | 1 << order[j];
        }
    }

    private boolean canStillContribute(int j, int subset, int gapRows) {
        if (Integer.bitCount(gapRows) == 1 && excluded[Integer.numberOfTrailingZeros(gapRows)] <= 1) {
            return true;
        }
        int candidates = ((1 << cols) - 1) & ~(decided[j] & ~subset);
        for (int g = gapRows; g != 0; g &= g - 1) {
            candidates &= rowColumns[Integer.numberOfTrailingZeros(g)];
        }
        for (; candidates != 0; candidates &= candidates - 1) {
            int col = Integer.numberOfTrailingZeros(candidates);
            boolean lifts = true;
            for (int g = gapRows; g != 0 && lifts; g &= g - 1) {
                int r = Integer.numberOfTrailingZeros(g);
                lifts = degrees[r * Configuration.MAX_COLS + col] >= excluded[r];
            }
            if (lifts) {
                return true;
            }
        }
        return false;
    }

    /**
     * The summands at the leaf S (row sums {@code s_r}): a row is zero ({@code s_r = 0}), full
     * ({@code s_r = n_r + 1}, all its columns in S) or in the gap. Every nonzero summand lives in
     * top degree on each factor where its degree is nonzero.
     */
    private void leaf(int subset, int size) {
        int m = rows;
        int gap = 0;
        int gapRow = -1;
        int gapDegree = 0;
        int fullDegree = 0;
        for (int r = 0; r < m; r++) {
            int n = dims[r];
            int s = sums[r];
            if (s > n) {
                fullDegree += n;
            } else if (s > 0) {
                gap++;
                gapRow = r;
                gapDegree += n;
            }
        }
        // O(-J_i - q_S) at (|S|, q): row i needs s_i >= n_i, every other row zero or full.
        if (gap == 0) {
            int t = fullDegree - size;
            if (t >= MIN_DEGREE && t <= MAX_DEGREE) {
                for (int i = 0; i < m; i++) {
                    if (sums[i] > dims[i]) {
                        record(i, t, size, fullProductExcept(i) * binomial(sums[i], dims[i]));
                    }
                }
            }
        } else if (gap == 1 && sums[gapRow] == dims[gapRow]) {
            int t = fullDegree + gapDegree - size;
            if (t >= MIN_DEGREE && t <= MAX_DEGREE) {
                record(gapRow, t, size, fullProductExcept(gapRow));
            }
        }
        // O(-q_T) with T = S, once for every j in T: the bundle O(-q_j) at (|T| - 1, q).
        if (gap == 0 && size > 0) {
            int t = fullDegree - size + 1;
            if (t >= MIN_DEGREE && t <= MAX_DEGREE) {
                long dim = fullProductExcept(-1);
                for (int s = subset; s != 0; s &= s - 1) {
                    record(m + Integer.numberOfTrailingZeros(s), t, size - 1, dim);
                }
            }
        }
        // O(-q_j - q_S) with j in S at (|S|, q): column j must push every gap row past n_r.
        int t = fullDegree + gapDegree - size;
        if (size > 0 && t >= MIN_DEGREE && t <= MAX_DEGREE) {
            for (int s = subset; s != 0; s &= s - 1) {
                int j = Integer.numberOfTrailingZeros(s);
                long dim = doubledColumn(j);
                if (dim != 0) {
                    record(m + j, t, size, dim);
                }
            }
        }
    }

    private void record(int b, int t, int p, long dim) {
        int x = b * SLOTS + t - MIN_DEGREE;
        dimension[x] = Math.addExact(dimension[x], dim);
        minP[x] = Math.min(minP[x], p);
        maxP[x] = Math.max(maxP[x], p);
    }

    private long doubledColumn(int j) {
        long dim = 1;
        for (int r = 0; r < rows; r++) {
            int a = sums[r] + degrees[r * Configuration.MAX_COLS + j];
            if (a == 0) {
                continue;
            }
            int n = dims[r];
            if (a <= n) {
                return 0;
            }
            dim = Math.multiplyExact(dim, binomial(a - 1, n));
        }
        return dim;
    }

    private long fullProductExcept(int skip) {
        long dim = 1;
        for (int r = 0; r < rows; r++) {
            int n = dims[r];
            if (r != skip && sums[r] >= n + 1) {
                dim = Math.multiplyExact(dim, binomial(sums[r] - 1, n));
            }
        }
        return dim;
    }

    private static final long[][] SMALL_BINOMIALS = smallBinomials(2 * Configuration.MAX_N + 3, Configuration.MAX_N + 1);

    private static long[][] smallBinomials(int tops, int bottoms) {
        long[][] t = new long[tops][bottoms];
        for (int a = 0; a < tops; a++) {
            for (int b = 0; b < bottoms && b <= a; b++) {
                t[a][b] = b == 0 || b == a ? 1 : Math.addExact(t[a - 1][b - 1], b < a ? t[a - 1][b] : 0);
            }
        }
        return t;
    }

    private static long binomial(int top, int bottom) {
        if (top >= 0 && top < SMALL_BINOMIALS.length && bottom >= 0 && bottom < SMALL_BINOMIALS[0].length) {
            return bottom > top ? 0 : SMALL_BINOMIALS[top][bottom];
        }
        long r = 1;
        for (int i = 1; i <= bottom; i++) {
            r = Math.multiplyExact(r, top - bottom + i) / i;
        }
        return r;
    }

    private int slot(int bundle, int t) {
        if (bundle < 0 || bundle >= rows + cols) {
            throw new IllegalArgumentException("bundle " + bundle + " outside 0.." + (rows + cols - 1));
        }
        if (t < MIN_DEGREE || t > MAX_DEGREE) {
            throw new IllegalArgumentException("total degree " + t + " outside " + MIN_DEGREE + ".." + MAX_DEGREE);
        }
        return bundle * SLOTS + t - MIN_DEGREE;
    }

    /** The number of rows m of the last configuration; bundles {@code 0..m-1} are {@code O_X(-J_i)}. */
    public int rows() {
        return rows;
    }

    /** The number of columns K; bundle {@code m + j} is {@code O_X(-q_j)}. */
    public int cols() {
        return cols;
    }

    /** The number of blocks of the last matrix as given (1 = not block-diagonal). */
    public int blocks() {
        return blocks;
    }

    /** {@code E1_t}: the sum of the first-page dimensions of {@code bundle} at total degree t. */
    public long dimension(int bundle, int t) {
        return dimension[slot(bundle, t)];
    }

    /**
     * Whether a differential {@code d_r: (p, q) -> (p - r, q - r + 1)} (it raises the total degree by one
     * and lowers p) can have a nonzero entry of degree t as source or target: it needs an entry at t + 1
     * with a smaller p than one at t, or an entry at t - 1 with a larger p than one at t.
     */
    private boolean outgoing(int bundle, int t) {
        if (t + 1 > MAX_DEGREE) {
            throw new IllegalArgumentException("degree " + t + " has no tallied successor");
        }
        int x = slot(bundle, t);
        return maxP[x] >= 0 && minP[x + 1] < maxP[x];
    }

    private boolean incoming(int bundle, int t) {
        if (t - 1 < MIN_DEGREE) {
            throw new IllegalArgumentException("degree " + t + " has no tallied predecessor");
        }
        int x = slot(bundle, t);
        return maxP[x] >= 0 && maxP[x - 1] > minP[x];
    }

    /**
     * True iff no differential can touch the entries of total degree t of {@code bundle}; then
     * {@code h^t(X, O_X(bundle)) = E1_t} exactly. Defined for {@code MIN_DEGREE < t < MAX_DEGREE}.
     */
    public boolean settled(int bundle, int t) {
        return !outgoing(bundle, t) && !incoming(bundle, t);
    }

    /**
     * A proved enclosure of {@code h^t(X, O_X(bundle))}, for {@code MIN_DEGREE + 1 < t < MAX_DEGREE - 1}.
     * {@code E_infinity} is a subquotient of {@code E1}, so {@code E1_t} bounds it above; the
     * differentials out of degree t together kill at most {@code E1_{t+1}} (each dimension there dies at
     * most once), those into it at most {@code E1_{t-1}}, and only those that can exist count. Where the
     * neighbour degree lies outside {@code 0..dim X}, everything there must die; when it cannot die
     * through its own further neighbour, it dies entirely against degree t, so the kill is exactly its
     * {@code E1}. Exact when {@link #settled}.
     */
    public Interval bound(int bundle, int t) {
        long e = dimension(bundle, t);
        long killLo = 0;
        long killHi = 0;
        if (outgoing(bundle, t)) {
            long above = dimension(bundle, t + 1);
            killHi += above;
            if (t + 1 > dim && !outgoing(bundle, t + 1)) {
                killLo += above;
            }
        }
        if (incoming(bundle, t)) {
            long below = dimension(bundle, t - 1);
            killHi += below;
            if (t - 1 < 0 && !incoming(bundle, t - 1)) {
                killLo += below;
            }
        }
        return new Interval(Math.max(0, e - killHi), Math.max(0, e - killLo));
    }
}
