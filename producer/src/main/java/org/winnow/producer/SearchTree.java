package org.winnow.producer;

import java.util.Arrays;
import java.util.function.LongPredicate;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.canonical.CanonicalSearch;

/**
 * The orderly generation of one ambient's matrices (enumeration design §6). Rows are placed top
 * down; columns that are equal in all rows so far form blocks, and a new row is non-increasing
 * within each block (canonical forms have columns in non-increasing lex order) and, within an
 * n-group, lexicographically at most the previous row. Subtrees die on a column-sum deficit or a
 * non-canonical prefix (a canonical matrix has canonical prefixes), so the leaves that survive are
 * exactly the canonical forms: each permutation class is met once, with no memory of the past.
 *
 * <p>Shards: the nodes at depth {@link #unitDepth} (or the leaves of shallower ambients) are
 * numbered in generation order across all ambients, and a shard descends only into its own.
 */
final class SearchTree {
    /** Receives every kept matrix; the arrays are the generator's and are overwritten afterwards. */
    interface Leaf {
        void accept(int[] n, int[][] q, int m, int k, int flags);
    }

    private final Bounds bounds;
    private final ExclusionSet rules;
    private final LongPredicate owns;
    private final Leaf leaf;
    /** The rule set drops Q3p, so a subtree under two equal P^1 rows has no leaf to emit. */
    private final boolean pruneEqualP1Rows;
    /** The rule set drops Ek, so a subtree whose every leaf is an ineffective split has nothing to emit. */
    private final boolean pruneSplits;
    private final SplitBound splitBound = new SplitBound();
    private final CanonicalSearch canon = new CanonicalSearch();
    private final LeafChecks checks = new LeafChecks();
    private final int[][] q = new int[Configuration.MAX_ROWS][Configuration.MAX_COLS];
    private final int[] colSum = new int[Configuration.MAX_COLS];
    /** Per column, the bit mask of the placed rows with a nonzero entry in it. */
    private final int[] colSupport = new int[Configuration.MAX_COLS];
    /** Per placed row, the bit mask of its columns with a nonzero entry. */
    private final int[] rowColumns = new int[Configuration.MAX_ROWS];
    /** Per placed row, whether all its entries are 0 or 1. */
    private final boolean[] zeroOne = new boolean[Configuration.MAX_ROWS];
    private final int[] bigSum = new int[Configuration.MAX_COLS];
    private final int[] blockStarts = new int[Configuration.MAX_ROWS + 1];
    /** Total of n+1 over rows t..m-1. */
    private final int[] capFrom = new int[Configuration.MAX_ROWS + 1];
    /** Total of n+1 over the big rows t..m-1. */
    private final int[] bigCapFrom = new int[Configuration.MAX_ROWS + 1];
    private final int[] maxEntry = new int[Configuration.MAX_ROWS];
    /** Per row being filled: how far each column is below its required sum before the row. */
    private final int[][] deficit = new int[Configuration.MAX_ROWS][Configuration.MAX_COLS];
    private int[] n;
    private int m;
    private int k;
    private int bigRows;
    private int unitDepth;
    private long unit;
    private long nodes;

    SearchTree(Bounds bounds, ExclusionSet rules, ShardSpec shard, Leaf leaf) {
        this(bounds, rules, (LongPredicate) shard::owns, leaf);
    }

    /**
     * @param owns asked once per unit, in generation order, whether to descend into it (a shard, or a
     *             worker of a parallel walk that claims units as it meets them)
     */
    SearchTree(Bounds bounds, ExclusionSet rules, LongPredicate owns, Leaf leaf) {
        this(bounds, rules, owns, leaf, true);
    }

    /**
     * @param splitBound whether to skip subtrees whose every leaf is proved an ineffective split (when the
     *                   rules drop Ek); off only to test that the skipping changes nothing
     */
    SearchTree(Bounds bounds, ExclusionSet rules, LongPredicate owns, Leaf leaf, boolean splitBound) {
        this.bounds = bounds;
        this.rules = rules;
        this.owns = owns;
        this.leaf = leaf;
        this.pruneEqualP1Rows = rules.drops(Flag.Q3P.bit());
        this.pruneSplits = splitBound && rules.drops(Flag.EK.bit());
    }

    /** Rows placed and accepted so far (tree nodes below the ambient roots), for statistics. */
    long nodes() {
        return nodes;
    }

    void run(int[] dims) {
        n = dims;
        m = dims.length;
        int sum = 0;
        bigRows = 0;
        for (int v : dims) {
            sum += v;
            if (v >= 2) {
                bigRows++;
            }
        }
        k = sum - bounds.dim();
        capFrom[m] = 0;
        bigCapFrom[m] = 0;
        for (int r = m - 1; r >= 0; r--) {
            capFrom[r] = capFrom[r + 1] + n[r] + 1;
            bigCapFrom[r] = bigCapFrom[r + 1] + (n[r] >= 2 ? n[r] + 1 : 0);
            maxEntry[r] = Math.min(bounds.maxEntry(), n[r] + 1);
        }
        for (int j = 0; j < k; j++) {
            colSum[j] = 0;
            bigSum[j] = 0;
            colSupport[j] = 0;
        }
        blockStarts[0] = 1;
        unitDepth = unitDepth(m);
        canon.startPrefix(k);
        descend(0);
    }

    /**
     * Depth of the shard units. Deeper cuts give more, smaller units (better balance) but every
     * shard walks the tree above the cut; the P^1-heavy ambients with many rows hold most of the
     * work and have few nodes near the root, so they are cut deeper.
     */
    static int unitDepth(int rows) {
        return Math.min(rows, Math.max(1, rows / 2));
    }

    private void descend(int t) {
        if (t == unitDepth) {
            long u = unit++;
            if (!owns.test(u)) {
                return;
            }
        }
        if (t == m) {
            atLeaf();
            return;
        }
        // the deficit this row must remove so that the rows after it can still cover the rest
        int[] def = deficit[t];
        int total = 0;
        for (int j = 0; j < k; j++) {
            int need = t >= bigRows && bigSum[j] == 0 ? 3 : 2;
            def[j] = Math.max(0, need - colSum[j]);
            total += def[j];
        }
        fillRow(t, 0, n[t] + 1, t > 0 && n[t] == n[t - 1], 0, total - capFrom[t + 1]);
    }

    /**
     * Chooses q[t][j..k-1] summing to {@code remaining}, values descending so that siblings come
     * in lex-descending order. {@code tight}: row t equals row t-1 (same n) on positions 0..j-1,
     * so position j may not exceed the previous row's value. Each unit placed removes at most one
     * unit of column deficit, so a row that has removed {@code removed} and has {@code remaining}
     * units left cannot reach {@code mustRemove} if their sum falls short.
     */
    private void fillRow(int t, int j, int remaining, boolean tight, int removed, int mustRemove) {
        if (removed + remaining < mustRemove) {
            return;
        }
        int[] row = q[t];
        if (remaining == 0) {
            // zeros satisfy every upper bound, so the rest of the row is forced
            for (int p = j; p < k; p++) {
                row[p] = 0;
            }
            rowDone(t);
            return;
        }
        if (j == k) {
            return;
        }
        int starts = blockStarts[t];
        int hi = Math.min(remaining, maxEntry[t]);
        if ((starts & (1 << j)) == 0) {
            hi = Math.min(hi, row[j - 1]);
        }
        if (tight) {
            hi = Math.min(hi, q[t - 1][j]);
        }
        int rest = starts & ~((2 << j) - 1);
        int blockEnd = rest == 0 ? k : Integer.numberOfTrailingZeros(rest);
        int afterBlock = (k - blockEnd) * maxEntry[t];
        for (int v = hi; v >= 0; v--) {
            // what positions j+1.. can still hold: at most v inside this block, maxEntry after it
            if (remaining - v > (blockEnd - j - 1) * v + afterBlock) {
                break;
            }
            row[j] = v;
            fillRow(t, j + 1, remaining - v, tight && v == q[t - 1][j], removed + Math.min(v, deficit[t][j]), mustRemove);
        }
    }

    private void rowDone(int t) {
        int[] row = q[t];
        if (pruneEqualP1Rows && n[t] == 1 && t > 0 && n[t - 1] == 1 && Arrays.equals(row, 0, k, q[t - 1], 0, k)) {
            // Rows of one n are non-increasing, so equal P^1 rows are adjacent in every leaf below: all Q3p.
            return;
        }
        boolean big = n[t] >= 2;
        boolean zeroOneRow = true;
        int columns = 0;
        for (int j = 0; j < k; j++) {
            colSum[j] += row[j];
            if (big) {
                bigSum[j] += row[j];
            }
            if (row[j] != 0) {
                colSupport[j] |= 1 << t;
                columns |= 1 << j;
                zeroOneRow &= row[j] == 1;
            }
        }
        zeroOne[t] = zeroOneRow;
        rowColumns[t] = columns;
        if (deficitAllows(t) && !everyLeafSplits(t) && canon.pushRow(n, q, t)) {
            nodes++;
            int starts = blockStarts[t];
            for (int j = 1; j < k; j++) {
                if (row[j] != row[j - 1]) {
                    starts |= 1 << j;
                }
            }
            blockStarts[t + 1] = starts;
            descend(t + 1);
        }
        for (int j = 0; j < k; j++) {
            colSum[j] -= row[j];
            if (big) {
                bigSum[j] -= row[j];
            }
            colSupport[j] &= ~(1 << t);
        }
    }

    /**
     * Whether every leaf below rows 0..t is proved an ineffective split. Asked only below the shard units,
     * so that skipping never changes which units exist (their numbers are the shards' and the parallel
     * walk's contract); above them the subtrees are few and the slack too large for a proof anyway.
     */
    private boolean everyLeafSplits(int t) {
        if (!pruneSplits || t < unitDepth || t + 1 >= m) {
            return false;
        }
        // sum of n over rows t+1..m-1: capFrom counts n+1 per row
        int slack = capFrom[t + 1] - (m - t - 1);
        return splitBound.everyLeafSplits(n, colSupport, rowColumns, zeroOne, t, k, slack);
    }

    /**
     * Column sums must reach 2 (B2); a column without an entry in a big row must reach 3, since
     * (2) on a P^1 row breaks strict Hall and (1,1) on two P^1 rows is excluded by B4.
     */
    private boolean deficitAllows(int t) {
        int cap = capFrom[t + 1];
        int deficit = 0;
        if (t + 1 < bigRows) {
            int zero = 0;
            for (int j = 0; j < k; j++) {
                int c = colSum[j];
                if (c < 2) {
                    deficit += 2 - c;
                    if (c == 0) {
                        zero++;
                    }
                }
            }
            int ones = m - bigRows;
            return deficit <= cap && 3 * Math.max(0, zero - bigCapFrom[t + 1]) <= 2 * ones;
        }
        for (int j = 0; j < k; j++) {
            int need = bigSum[j] == 0 ? 3 : 2;
            if (colSum[j] < need) {
                deficit += need - colSum[j];
            }
        }
        return deficit <= cap;
    }

    private void atLeaf() {
        for (int j = 0; j < k; j++) {
            // B4 and the point case of B3: sum 2 with no big row is (1,1) on two P^1 rows or a 2 on one
            if (colSum[j] == 2 && bigSum[j] == 0) {
                return;
            }
        }
        if (!checks.strictHall(n, q, m, k)) {
            return;
        }
        int flags = checks.flags(n, q, m, k, rules.excludedMask());
        if (!rules.drops(flags)) {
            leaf.accept(n, q, m, k, flags);
        }
    }
}
