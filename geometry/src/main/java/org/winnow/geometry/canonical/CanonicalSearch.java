package org.winnow.geometry.canonical;

import java.util.Arrays;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * The search behind {@link CanonicalForm}, with all working memory kept between calls so that a
 * generator can test millions of prefixes without allocating. Not thread-safe: one instance per
 * thread.
 *
 * <p>Definition (normative). Over every row permutation that sorts n descending and every column
 * permutation, take the row-major word of the permuted matrix; the canonical form is the permuted
 * matrix with the lexicographically largest word.
 *
 * <p>The prefix session ({@link #startPrefix}, {@link #pushRow}) keeps its own state, so the
 * one-shot methods may be called in between.
 *
 * <p>Algorithm: rows are fixed level by level. A search state is the set of rows used so far and
 * an ordered partition of the columns into cells (columns that are equal in all rows fixed so far
 * and may still be permuted among themselves). For a state and a candidate row the best string
 * that row can contribute is each cell's values sorted descending, cell after cell; the level's
 * output is the largest such string, and only states reaching it survive, each with its cells
 * split by the new row's values (larger values first). Rows that are identical (same n, same
 * degrees) are interchangeable, so only the first unused one of each kind is tried; states are
 * merged when they agree on (used rows, cell partition), which keeps the state count small. Ties
 * are never broken arbitrarily, so the result is the exact maximum.
 *
 * <p>The test {@link #isCanonical} runs the same levels against the matrix's own rows: the matrix
 * itself is always among the candidates, so a candidate string above its row t proves it is not
 * canonical at once, and candidates below it are dropped immediately.
 */
public final class CanonicalSearch {
    private static final int MAX_M = Configuration.MAX_ROWS;
    private static final int MAX_K = Configuration.MAX_COLS;

    private int k;
    private final int[] ns = new int[MAX_M];
    /** Bit mask of the earlier rows identical to row r (same n, same degrees). */
    private final int[] earlierTwins = new int[MAX_M];

    private States cur = new States();
    private States[][] delta;
    private int prefixCols;
    private final int[] prefixTwins = new int[MAX_M];
    private States root;
    private States next = new States();

    private final int[] candOrder = new int[MAX_K];
    private final int[] candVals = new int[MAX_K];
    private int candStarts;
    private final int[] best = new int[MAX_K];
    private int largestStateSet;

    /**
     * True iff the first {@code rows} rows of {@code q} (with dimensions {@code n}), restricted to
     * the first {@code cols} columns, are in canonical form. Rows must come with non-increasing n,
     * otherwise the answer is false. By the prefix property a canonical matrix has canonical
     * prefixes, so this is the pruning test of an orderly generator.
     */
    public boolean isCanonical(int[] n, int[][] q, int rows, int cols) {
        bind(n, q, rows, cols);
        for (int r = 1; r < rows; r++) {
            if (n[r] > n[r - 1]) {
                return false;
            }
        }
        System.arraycopy(n, 0, ns, 0, rows);
        cur.clear();
        cur.addIdentity(cols);
        for (int t = 0; t < rows; t++) {
            next.clear();
            int[] target = q[t];
            for (int s = 0; s < cur.size; s++) {
                int used = cur.used[s];
                for (int r = t; r < rows && n[r] == ns[t]; r++) {
                    // rows above the group of level t are all used, rows before t in the group may be unused
                    if (!isCandidate(used, r, earlierTwins)) {
                        continue;
                    }
                    int cmp = buildCandidate(cur, s, q[r], target, false);
                    if (cmp > 0) {
                        return false;
                    }
                    if (cmp == 0) {
                        next.add(used | (1 << r), candStarts, candOrder, cols);
                    }
                }
                for (int r = t - 1; r >= 0 && n[r] == ns[t]; r--) {
                    if (!isCandidate(used, r, earlierTwins)) {
                        continue;
                    }
                    int cmp = buildCandidate(cur, s, q[r], target, false);
                    if (cmp > 0) {
                        return false;
                    }
                    if (cmp == 0) {
                        next.add(used | (1 << r), candStarts, candOrder, cols);
                    }
                }
            }
            swap();
        }
        return true;
    }

    /**
     * Writes the canonical form of the given matrix into {@code outN} (length at least rows) and
     * {@code outQ} (at least rows arrays of at least cols entries). The input is not modified.
     */
    public void canonicalize(int[] n, int[][] q, int rows, int cols, int[] outN, int[][] outQ) {
        bind(n, q, rows, cols);
        System.arraycopy(n, 0, ns, 0, rows);
        Arrays.sort(ns, 0, rows);
        for (int i = 0, j = rows - 1; i < j; i++, j--) {
            int tmp = ns[i];
            ns[i] = ns[j];
            ns[j] = tmp;
        }
        cur.clear();
        cur.addIdentity(cols);
        for (int t = 0; t < rows; t++) {
            next.clear();
            boolean haveBest = false;
            for (int s = 0; s < cur.size; s++) {
                int used = cur.used[s];
                for (int r = 0; r < rows; r++) {
                    if (n[r] != ns[t] || !isCandidate(used, r, earlierTwins)) {
                        continue;
                    }
                    int cmp = buildCandidate(cur, s, q[r], best, !haveBest);
                    if (cmp < 0) {
                        continue;
                    }
                    if (cmp > 0) {
                        System.arraycopy(candVals, 0, best, 0, cols);
                        haveBest = true;
                        next.clear();
                    }
                    next.add(used | (1 << r), candStarts, candOrder, cols);
                }
            }
            outN[t] = ns[t];
            System.arraycopy(best, 0, outQ[t], 0, cols);
            swap();
        }
    }

    /**
     * Starts an incremental prefix test for matrices with {@code cols} columns: the generator then
     * calls {@link #pushRow} for rows 0, 1, 2, ... as it places them, and again for a row when it
     * replaces it or backtracks to it.
     *
     * <p>Only the work that involves the new row is done. The states of a level are kept split by
     * the highest row of the current n-group they use ({@code delta[r][i]}: level i, highest row r);
     * the states that do not use the new row t are exactly those of the previous push and were
     * already checked against the target rows, so a push of row t only extends states that use t
     * (by any row) and states that do not (by row t).
     */
    public void startPrefix(int cols) {
        Checks.requireArgument(cols >= 1 && cols <= MAX_K, "columns out of range: %d", cols);
        this.prefixCols = cols;
        if (delta == null) {
            delta = new States[MAX_M][MAX_M];
            root = new States();
        }
        root.clear();
        root.addIdentity(cols);
    }

    /**
     * True iff rows 0..t of {@code q} are in canonical form, given that each of rows 0..t-1 is
     * unchanged since its last push, which succeeded. Rows must have non-increasing n.
     * Allocation-free once the state storage has grown.
     */
    public boolean pushRow(int[] n, int[][] q, int t) {
        this.k = prefixCols;
        if (t > 0 && n[t] > n[t - 1]) {
            return false;
        }
        int twins = 0;
        int g = t;
        while (g > 0 && n[g - 1] == n[t]) {
            g--;
            if (Arrays.equals(q[g], 0, k, q[t], 0, k)) {
                twins |= 1 << g;
            }
        }
        prefixTwins[t] = twins;
        int[] rowT = q[t];
        for (int i = g; i <= t; i++) {
            States out = level(t, i);
            out.clear();
            int[] target = q[i];
            if (i > g) {
                // states that already use row t, extended by an earlier row of the group
                States from = delta[t][i - 1];
                for (int s = 0; s < from.size; s++) {
                    int used = from.used[s];
                    for (int r = g; r < t; r++) {
                        if (!isCandidate(used, r, prefixTwins)) {
                            continue;
                        }
                        int cmp = buildCandidate(from, s, q[r], target, false);
                        if (cmp > 0) {
                            return false;
                        }
                        if (cmp == 0) {
                            out.add(used | (1 << r), candStarts, candOrder, k);
                        }
                    }
                }
                for (int r = i - 1; r < t; r++) {
                    if (!extendByRow(delta[r][i - 1], t, rowT, target, out)) {
                        return false;
                    }
                }
            } else if (g == 0) {
                if (!extendByRow(root, t, rowT, target, out)) {
                    return false;
                }
            } else if (!extendByRow(delta[g - 1][g - 1], t, rowT, target, out)) {
                // the states of level g-1 use the whole previous group, so their highest row is g-1
                return false;
            }
            if (out.size > largestStateSet) {
                largestStateSet = out.size;
            }
        }
        return true;
    }

    /** Extends every state of {@code from} by row t; false as soon as one beats the target. */
    private boolean extendByRow(States from, int t, int[] rowT, int[] target, States out) {
        for (int s = 0; s < from.size; s++) {
            int used = from.used[s];
            if (!isCandidate(used, t, prefixTwins)) {
                continue;
            }
            int cmp = buildCandidate(from, s, rowT, target, false);
            if (cmp > 0) {
                return false;
            }
            if (cmp == 0) {
                out.add(used | (1 << t), candStarts, candOrder, k);
            }
        }
        return true;
    }

    private States level(int r, int i) {
        States st = delta[r][i];
        if (st == null) {
            st = new States();
            delta[r][i] = st;
        }
        return st;
    }

    /** The largest number of search states held at one level since this instance was created. */
    public int largestStateSet() {
        return largestStateSet;
    }

    private void bind(int[] n, int[][] q, int rows, int cols) {
        Checks.requireArgument(rows >= 1 && rows <= MAX_M, "rows out of range: %d", rows);
        Checks.requireArgument(cols >= 1 && cols <= MAX_K, "columns out of range: %d", cols);
        this.k = cols;
        for (int r = 0; r < rows; r++) {
            int mask = 0;
            for (int p = 0; p < r; p++) {
                if (n[p] == n[r] && Arrays.equals(q[p], 0, cols, q[r], 0, cols)) {
                    mask |= 1 << p;
                }
            }
            earlierTwins[r] = mask;
        }
    }

    /** Row r is unused and is the first unused row of its kind. */
    private static boolean isCandidate(int used, int r, int[] twins) {
        return (used & (1 << r)) == 0 && (used & twins[r]) == twins[r];
    }

    /**
     * Builds the string and the refined cells that row {@code row} gives in state {@code s}, and
     * compares the string with {@code target}: negative if smaller (the build may stop early
     * then), zero if equal, positive if larger. With {@code beatsAll} the comparison is skipped
     * and the result is positive.
     */
    private int buildCandidate(States from, int s, int[] row, int[] target, boolean beatsAll) {
        byte[] ord = from.order;
        int base = s * MAX_K;
        int starts = from.starts[s];
        int cmp = beatsAll ? 1 : 0;
        int newStarts = starts;
        int a = 0;
        while (a < k) {
            int b = a + 1;
            while (b < k && (starts & (1 << b)) == 0) {
                b++;
            }
            // insertion sort of the cell by value descending; the cell is stored in ascending
            // column order and the sort is stable, so equal values stay in ascending column order
            for (int p = a; p < b; p++) {
                int c = ord[base + p];
                int v = row[c];
                int i = p;
                while (i > a && candVals[i - 1] < v) {
                    candVals[i] = candVals[i - 1];
                    candOrder[i] = candOrder[i - 1];
                    i--;
                }
                candVals[i] = v;
                candOrder[i] = c;
            }
            for (int p = a; p < b; p++) {
                if (p > a && candVals[p] != candVals[p - 1]) {
                    newStarts |= 1 << p;
                }
                if (cmp == 0 && candVals[p] != target[p]) {
                    cmp = candVals[p] > target[p] ? 1 : -1;
                }
            }
            if (cmp < 0) {
                return cmp;
            }
            a = b;
        }
        candStarts = newStarts;
        return cmp;
    }

    private void swap() {
        States t = cur;
        cur = next;
        next = t;
        if (cur.size > largestStateSet) {
            largestStateSet = cur.size;
        }
    }

    /** A set of search states with open-addressing dedup; storage grows but is never freed. */
    private static final class States {
        int size;
        int[] used = new int[16];
        int[] starts = new int[16];
        byte[] order = new byte[16 * MAX_K];
        long[] hash = new long[16];
        private int[] table = new int[64];
        private int[] stamp = new int[64];
        private int generation = 1;

        void clear() {
            size = 0;
            generation++;
            if (generation == Integer.MAX_VALUE) {
                Arrays.fill(stamp, 0);
                generation = 1;
            }
        }

        void addIdentity(int cols) {
            int[] identity = new int[MAX_K];
            for (int c = 0; c < cols; c++) {
                identity[c] = c;
            }
            add(0, 1, identity, cols);
        }

        void add(int u, int st, int[] ord, int cols) {
            long h = (u * 0x9E3779B97F4A7C15L) ^ (st * 0xC2B2AE3D27D4EB4FL);
            for (int p = 0; p < cols; p++) {
                h = (h ^ ord[p]) * 0x100000001B3L;
            }
            h ^= h >>> 29;
            if (2 * (size + 1) > table.length) {
                grow();
            }
            int mask = table.length - 1;
            int i = (int) h & mask;
            while (stamp[i] == generation) {
                int s = table[i];
                if (hash[s] == h && used[s] == u && starts[s] == st && sameOrder(s, ord, cols)) {
                    return;
                }
                i = (i + 1) & mask;
            }
            if (size == used.length) {
                int cap = 2 * size;
                used = Arrays.copyOf(used, cap);
                starts = Arrays.copyOf(starts, cap);
                hash = Arrays.copyOf(hash, cap);
                order = Arrays.copyOf(order, cap * MAX_K);
            }
            stamp[i] = generation;
            table[i] = size;
            used[size] = u;
            starts[size] = st;
            hash[size] = h;
            int base = size * MAX_K;
            for (int p = 0; p < cols; p++) {
                order[base + p] = (byte) ord[p];
            }
            size++;
        }

        private boolean sameOrder(int s, int[] ord, int cols) {
            int base = s * MAX_K;
            for (int p = 0; p < cols; p++) {
                if (order[base + p] != ord[p]) {
                    return false;
                }
            }
            return true;
        }

        private void grow() {
            int len = table.length * 2;
            table = new int[len];
            stamp = new int[len];
            generation = 1;
            int mask = len - 1;
            for (int s = 0; s < size; s++) {
                int i = (int) hash[s] & mask;
                while (stamp[i] == generation) {
                    i = (i + 1) & mask;
                }
                stamp[i] = generation;
                table[i] = s;
            }
        }
    }
}
