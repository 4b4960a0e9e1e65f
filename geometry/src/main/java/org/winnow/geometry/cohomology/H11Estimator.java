package org.winnow.geometry.cohomology;

import org.winnow.geometry.Configuration;

/**
 * A cheap estimate of {@code h^{1,1}} of the complete intersection X of a configuration, read off the
 * first pages of the Koszul spectral sequences as if every differential vanished. It is a feature for
 * the similarity model, never a label: it is not a proof, and where a differential does not vanish it
 * is wrong.
 *
 * <p>Why this estimate. The conormal sequence {@code 0 -> N* -> Omega_A|X -> Omega_X -> 0} and the
 * restricted Euler sequence {@code 0 -> Omega_A|X -> (+)_i O_X(-J_i)^{n_i+1} -> O_X^m -> 0} give, when
 * {@code H^0(O_X(-J_i)) = 0} and {@code H^1(N*) = 0},
 * <pre>
 *   h^1(Omega_A|X) = m + sum_i (n_i + 1) h^1(O_X(-J_i))
 *   h^{1,1}(X)     = h^1(Omega_A|X) + dim ker(H^2(N*) -> H^2(Omega_A|X)),
 * </pre>
 * and the kernel is {@code max(0, h^2(N*) - sum_i (n_i + 1) h^2(O_X(-J_i)))} when that map has maximal
 * rank. Each {@code h^q(X, L)} is then replaced by its first-page value
 * {@code sum_k h^{q+k}(A, L (x) wedge^k N*) = sum_S h^{q+|S|}(A, L - q_S)} (Bott's formula per factor,
 * Kunneth over the product). So
 * {@code estimate = m + eulerOne + max(0, conormalTwo - eulerTwo)} with
 * {@code eulerOne = sum_i (n_i+1) E1 h^1(O_X(-J_i))}, {@code eulerTwo = sum_i (n_i+1) E1 h^2(O_X(-J_i))},
 * {@code conormalTwo = sum_j E1 h^2(O_X(-q_j))}. It equals m for a favourable configuration whose
 * first pages are empty there. On the 9,103 non-product three-folds of the lossless enumeration it
 * equals the exact h11 of the Hodge engine for all but 7 (docs/model.md).
 *
 * <p>How it is fast. A factor P^n contributes to {@code O(-a)} only when {@code a = 0} (degree 0) or
 * {@code a >= n + 1} (degree n). Column subsets S are searched depth first, keeping the row sums
 * {@code s_r = sum_{j in S} q_rj} and the excluded masses; for a Calabi-Yau row ({@code sum_j q_rj =
 * n_r + 1}) a row with both is stuck in the gap, and a branch whose stuck rows no single bundle can lift
 * is cut (see {@link #search}), so a connected configuration visits few of its {@code 2^K} subsets. At a
 * leaf, the counts of gap rows and the degrees of the full rows decide in O(1) whether any bundle can
 * reach the wanted cohomological degree, and only then is a product of binomials formed. The bundles
 * {@code O(-q_j - q_S)} with {@code j} outside S are the subsets {@code T = S + j}, so each subset T
 * counts {@code |T|} times for them. NOT thread-safe: it owns its buffers, one per thread; {@link
 * #estimate} allocates nothing.
 */
public final class H11Estimator {
    private final int[] sums = new int[Configuration.MAX_ROWS];
    private final int[] excluded = new int[Configuration.MAX_ROWS];
    private final int[] order = new int[Configuration.MAX_COLS];
    /** Per column: the rows of its support, their degrees (both at {@code col * MAX_ROWS}), and its row mask. */
    private final int[] supportRow = new int[Configuration.MAX_COLS * Configuration.MAX_ROWS];
    private final int[] supportDegree = new int[Configuration.MAX_COLS * Configuration.MAX_ROWS];
    private final int[] supportSize = new int[Configuration.MAX_COLS];
    private final int[] supportMask = new int[Configuration.MAX_COLS];
    /** Per row: the mask of the columns where it has a nonzero degree. */
    private final int[] rowColumns = new int[Configuration.MAX_ROWS];
    /** The input copied into flat arrays: {@code n_r}, and the degrees row-major with stride MAX_COLS. */
    private final int[] dims = new int[Configuration.MAX_ROWS];
    private final int[] degrees = new int[Configuration.MAX_ROWS * Configuration.MAX_COLS];
    /** {@code decided[j]}: the mask of the columns the search has placed in or out of S at depth j. */
    private final int[] decided = new int[Configuration.MAX_COLS + 1];
    private int rows;
    private int cols;
    /** Per bundle and total degree 0..3: the smallest and largest Koszul column p of a nonzero entry. */
    private final int[] minP = new int[(Configuration.MAX_ROWS + Configuration.MAX_COLS) * 4];
    private final int[] maxP = new int[(Configuration.MAX_ROWS + Configuration.MAX_COLS) * 4];
    private boolean settled;
    private long eulerOne;
    private long eulerTwo;
    private long conormalTwo;

    /**
     * Computes the estimate of {@code config}, which must be a Calabi-Yau configuration (validated at
     * the boundary by the caller: the search relies on every row sum being {@code n_r + 1}). Returns the
     * estimated h11; the terms are then readable through the accessors.
     */
    public int estimate(Configuration config) {
        int m = config.rows();
        int k = config.cols();
        rows = m;
        cols = k;
        eulerOne = 0;
        eulerTwo = 0;
        conormalTwo = 0;
        for (int r = 0; r < m; r++) {
            sums[r] = 0;
            excluded[r] = 0;
            dims[r] = config.n(r);
        }
        java.util.Arrays.fill(rowColumns, 0, m, 0);
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
        java.util.Arrays.fill(minP, 0, (m + k) * 4, Integer.MAX_VALUE);
        java.util.Arrays.fill(maxP, 0, (m + k) * 4, -1);
        search(0, 0, 0, 0);
        settled = settledPages(m, k);
        long kernel = Math.max(0, conormalTwo - eulerTwo);
        return Math.toIntExact(m + eulerOne + kernel);
    }

    /**
     * Decides column {@code j} in or out of S, then recurses. {@code gapRows} has a bit for every row with
     * both an included and an excluded column: such a row ends in the gap {@code 1..n_r}, whatever the
     * remaining columns do. A leaf can contribute only if those rows are one row missing a single unit
     * (for the {@code O(-J_i)} terms) or are all lifted past {@code n_r} by one column of S (the doubled
     * terms); since included and excluded masses only grow, a branch failing both is cut.
     */
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

    /**
     * Breadth-first column order over shared rows: a row then gets both an included and an excluded
     * column soon after it is first touched, so stuck rows, and cut branches, appear near the root.
     */
    private void orderColumns() {
        int k = cols;
        int placed = 0;
        int seen = 0;
        for (int start = 0; start < k; start++) {
            if ((seen & (1 << start)) != 0) {
                continue;
            }
            seen |= 1 << start;
            order[placed++] = start;
            for (int head = placed - 1; head < placed; head++) {
                int from = order[head];
                for (int rows = supportMask[from]; rows != 0; rows &= rows - 1) {
                    int fresh = rowColumns[Integer.numberOfTrailingZeros(rows)] & ~seen;
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
        // Only a column covering every stuck row and not excluded already can lift them.
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

    private void leaf(int subset, int size) {
        int gap = 0;
        int gapDegree = 0;
        int fullDegree = 0;
        for (int r = 0; r < rows; r++) {
            int n = dims[r];
            int s = sums[r];
            if (s > n) {
                fullDegree += n;
            } else if (s > 0) {
                gap++;
                gapDegree += n;
            }
        }
        visit(subset, size, gap, gapDegree, fullDegree);
    }

    private void visit(int subset, int size, int gap, int gapDegree, int fullDegree) {
        int m = rows;
        // O(-J_i - q_S) at position (|S|, q): row i needs s_i >= n_i; every other row must be zero or full.
        if (gap == 0) {
            int t = fullDegree - size;
            if (t >= 0 && t <= 3) {
                for (int i = 0; i < m; i++) {
                    int n = dims[i];
                    if (sums[i] >= n + 1) {
                        seen(i, t, size);
                        if (t == 1 || t == 2) {
                            add(t, (n + 1) * fullProductExcept(i) * binomial(sums[i], n));
                        }
                    }
                }
            }
        } else if (gap == 1) {
            int t = fullDegree + gapDegree - size;
            if (t >= 0 && t <= 3) {
                for (int i = 0; i < m; i++) {
                    int n = dims[i];
                    if (sums[i] == n) { // the one gap row, lifted to degree -n-1 by the -J_i
                        seen(i, t, size);
                        if (t == 1 || t == 2) {
                            add(t, (n + 1) * fullProductExcept(i));
                        }
                        break;
                    }
                    if (sums[i] >= 1 && sums[i] < n) {
                        break; // the gap row cannot be lifted by a single -J_i
                    }
                }
            }
        }
        // O(-q_T) with T = S, once per element j of T: the bundle O(-q_j) at position (|T| - 1, q), total
        // degree fullDegree - |T| + 1; it counts for h^2 at total degree 2.
        if (gap == 0 && size > 0) {
            int t = fullDegree - size + 1;
            if (t >= 1 && t <= 3) {
                for (int s = subset; s != 0; s &= s - 1) {
                    seen(m + Integer.numberOfTrailingZeros(s), t, size - 1);
                }
                if (t == 2) {
                    conormalTwo += size * fullProductExcept(-1);
                }
            }
        }
        // O(-q_j - q_S) with j in S at position (|S|, q): rows in the gap must be pushed past n_r by q_rj.
        int t = fullDegree + gapDegree - size;
        if (size > 0 && t >= 1 && t <= 3) {
            for (int s = subset; s != 0; s &= s - 1) {
                int j = Integer.numberOfTrailingZeros(s);
                long dim = doubledColumn(j);
                if (dim != 0) {
                    seen(m + j, t, size);
                    if (t == 2) {
                        conormalTwo += dim;
                    }
                }
            }
        }
    }

    /** Records a nonzero first-page entry of bundle b (rows first, then columns) at total degree t, column p. */
    private void seen(int b, int t, int p) {
        int x = b * 4 + t;
        minP[x] = Math.min(minP[x], p);
        maxP[x] = Math.max(maxP[x], p);
    }

    /**
     * True unless some later differential {@code d_r : (p, q) -> (p - r, q - r + 1)} could join two
     * nonzero entries of a bundle in the degrees the estimate reads (from t to t + 1 needs an entry at
     * t + 1 with a smaller p than one at t), or an entry sits where the derivation assumes none
     * ({@code H^0(O_X(-J_i))}, {@code H^1(N*)}).
     */
    private boolean settledPages(int m, int k) {
        for (int b = 0; b < m + k; b++) {
            boolean euler = b < m;
            if (maxP[b * 4 + (euler ? 0 : 1)] >= 0) {
                return false;
            }
            for (int t = euler ? 0 : 1; t < 3; t++) {
                if (maxP[b * 4 + t] >= 0 && minP[b * 4 + t + 1] < maxP[b * 4 + t]) {
                    return false;
                }
            }
        }
        return true;
    }

    /** {@code h^top(A, O(-q_S - q_j))} when every non-zero row sum is full after adding column j; else 0. */
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

    /** Product of {@code C(s_r - 1, n_r)} over the full rows other than {@code skip}. */
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

    private void add(int t, long dim) {
        if (t == 1) {
            eulerOne = Math.addExact(eulerOne, dim);
        } else {
            eulerTwo = Math.addExact(eulerTwo, dim);
        }
    }

    /** {@code C(top, bottom)} for the small arguments a Calabi-Yau row gives ({@code top <= 2 MAX_N + 2}). */
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

    /**
     * Whether the last estimate's first pages are settled: no differential can change the entries it
     * reads, and none sits where the derivation assumes zero. Then every line bundle number it uses is
     * exact, and only the maximal rank of {@code H^2(N*) -> H^2(Omega_A|X)} is still assumed. On the
     * 9,103 labelled three-folds exactly the 7 wrong estimates are unsettled (docs/model.md).
     */
    public boolean settled() {
        return settled;
    }

    /** {@code sum_i (n_i + 1) E1 h^1(O_X(-J_i))} of the last estimate. */
    public long eulerOne() {
        return eulerOne;
    }

    /** {@code sum_i (n_i + 1) E1 h^2(O_X(-J_i))} of the last estimate. */
    public long eulerTwo() {
        return eulerTwo;
    }

    /** {@code sum_j E1 h^2(O_X(-q_j))} of the last estimate. */
    public long conormalTwo() {
        return conormalTwo;
    }
}
