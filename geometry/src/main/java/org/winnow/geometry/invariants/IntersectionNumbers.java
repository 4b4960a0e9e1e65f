package org.winnow.geometry.invariants;

import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * The intersection numbers {@code I(a) = int_X J^a} ({@code |a| = d}) of a complete intersection,
 * by a frontier dynamic programme over the columns.
 *
 * <p>{@code I(a)} is the coefficient of {@code J^{n-a}} in {@code prod_j (sum_r q[r][j] J_r)} in
 * the ring {@code Z[J]/(J_r^{n_r+1})}. Processing the columns one at a time, a state is the
 * exponent vector {@code c} collected so far (units given to each row) with an integer weight; the
 * final states {@code b} give {@code I(n - b)}. A state is dropped as soon as it cannot end with
 * total deficiency {@code |n - b| = d}: after step t row r can still receive at most {@code rem_t(r)}
 * units (the unprocessed columns touching it), so {@code gap = sum_r max(0, n_r - c_r - rem_t(r))}
 * bounds the final deficiency from below and states with {@code gap > d} cannot complete. The gap
 * is updated incrementally over the support of the column, so a transition costs
 * {@code O(|supp(j)|)}. The column order only changes the frontier size; a greedy order that closes
 * rows early keeps it small.
 *
 * <p>Exponent vectors are packed into a {@code long} with {@code ceil(log2(n_r + 1))} bits per row;
 * states live in two reusable open-addressing tables with generation stamps, so a call allocates
 * nothing once the tables have grown to the largest frontier seen.
 *
 * <p>Not thread-safe: one instance per thread. After {@link #compute(Configuration)} the result is
 * readable until the next call.
 */
public final class IntersectionNumbers {
    private static final int MAX_ROWS = Configuration.MAX_ROWS;
    private static final int MAX_COLS = Configuration.MAX_COLS;

    private final int[] n = new int[MAX_ROWS];
    private final int[] shift = new int[MAX_ROWS];
    private final long[] mask = new long[MAX_ROWS];
    private final int[] remaining = new int[MAX_ROWS];
    private final int[] order = new int[MAX_COLS];
    private final boolean[] taken = new boolean[MAX_COLS];
    /** Support of each column: rows with q > 0, and their degrees, MAX_ROWS slots per column. */
    private final int[] suppRow = new int[MAX_COLS * MAX_ROWS];
    private final int[] suppDeg = new int[MAX_COLS * MAX_ROWS];
    private final int[] suppLen = new int[MAX_COLS];
    private final int[] indicator = new int[MAX_ROWS];
    private final int[] current = new int[MAX_ROWS];
    /** Units given up front by single-row columns, per row; the start state; columns left to order. */
    private final int[] forced = new int[MAX_ROWS];
    private long startKey;
    private long startWeight;
    private boolean startEmpty;
    private int ordered;
    /** The support of the column being processed: shift, mask, n, {@code n - rem} and degree per slot. */
    private final int[] colShift = new int[MAX_ROWS];
    private final long[] colMask = new long[MAX_ROWS];
    private final int[] colN = new int[MAX_ROWS];
    private final int[] colSlack = new int[MAX_ROWS];
    private final int[] colDeg = new int[MAX_ROWS];
    /** The row owning each bit of a packed key, and the key of the exponent vector 0 (c = n). */
    private final int[] rowOfBit = new int[64];
    private long fullKey;
    /** Degree matrix, row-major with stride MAX_COLS. */
    final int[] q = new int[MAX_ROWS * MAX_COLS];
    /** Per row the set of columns touching it, as a bit mask (K <= 24 fits an int). */
    final int[] rowMask = new int[MAX_ROWS];
    /** For d <= 4: the rows of each final exponent vector with multiplicity, 4 slots per entry. */
    int[] entryRows = new int[4 * 64];

    private StateTable front = new StateTable();
    private StateTable back = new StateTable();

    private int m;
    private int k;
    private int dim;
    private boolean calabiYau;

    /**
     * Dense symmetric tables, stride m, for d = 3 (triples) and d = 4 (quartics); filled on the
     * first lookup after a computation, so callers that only need chi and c2.J never pay for them.
     */
    private long[] triple = new long[0];
    private long[] quartic = new long[0];
    private final int[] written = new int[24 * 4096];
    private int writtenCount;
    private int denseKind;

    /**
     * Runs the programme for {@code c} (any shape; the Calabi-Yau condition is not needed).
     * Returns the number of nonzero intersection numbers; a negative dimension gives 0.
     *
     * @throws IllegalArgumentException if the exponent vectors do not fit in 64 bits (only for
     *     very high-dimensional inputs)
     * @throws ArithmeticException if an intersection number overflows a long
     */
    public int compute(Configuration c) {
        load(c);
        return run();
    }

    /** Whether the last loaded input satisfies the Calabi-Yau condition (row sums n_r + 1). */
    boolean calabiYau() {
        return calabiYau;
    }

    /** Number of columns of the last input. */
    int cols() {
        return k;
    }

    /** Dimension {@code n_r} of row r of the last input. */
    int n(int r) {
        return n[r];
    }

    /** Runs the programme on the input of the last {@link #load}; see {@link #compute}. */
    int run() {
        clearDense();
        runProgramme();
        decodeEntries();
        return front.size;
    }

    /** Dimension d of the last input. */
    public int dimension() {
        return dim;
    }

    /** Number of rows of the last input. */
    public int rows() {
        return m;
    }

    /** Number of nonzero intersection numbers of the last input. */
    public int size() {
        return front.size;
    }

    /** The i-th nonzero intersection number ({@code 0 <= i < size()}), in no particular order. */
    public long value(int i) {
        return front.weight[i];
    }

    /** Exponent of row r in the exponent vector of the i-th intersection number. */
    public int exponent(int i, int r) {
        return n[r] - (int) ((front.key[i] >>> shift[r]) & mask[r]);
    }

    /**
     * Writes the rows of the i-th exponent vector with multiplicity, ascending, into {@code out}
     * (length {@code >= d}); e.g. {@code J_0 J_2^2} gives {@code 0, 2, 2}. Returns d.
     */
    public int rowsOf(int i, int[] out) {
        if (dim <= 4) {
            System.arraycopy(entryRows, 4 * i, out, 0, dim);
            return dim;
        }
        return decodeRows(front.key[i], out, 0);
    }

    private int decodeRows(long key, int[] out, int offset) {
        // c_r <= n_r in every field, so n - c has no borrows: the difference packs the exponents a_r,
        // and only the rows with a_r > 0 (at most d of them) are visited.
        long a = fullKey - key;
        int len = 0;
        while (a != 0) {
            int r = rowOfBit[Long.numberOfTrailingZeros(a)];
            int e = (int) ((a >>> shift[r]) & mask[r]);
            for (int i = 0; i < e; i++) {
                out[offset + len++] = r;
            }
            a &= ~(mask[r] << shift[r]);
        }
        return len;
    }

    private void decodeEntries() {
        if (dim > 4) {
            return;
        }
        if (entryRows.length < 4 * front.size) {
            entryRows = new int[Math.max(4 * front.size, 2 * entryRows.length)];
        }
        for (int i = 0; i < front.size; i++) {
            decodeRows(front.key[i], entryRows, 4 * i);
        }
    }

    /** {@code d_rst} of the last input, which must have dimension 3 (any index order, 0-based). */
    public long triple(int r, int s, int t) {
        if (denseKind != 3) {
            if (dim != 3) {
                throw new IllegalStateException("triple intersections need dimension 3, the last input had " + dim);
            }
            fillDense();
        }
        return triple[(r * m + s) * m + t];
    }

    /** {@code int_X J_r J_s J_t J_u} of the last input, which must have dimension 4. */
    public long quartic(int r, int s, int t, int u) {
        if (denseKind != 4) {
            if (dim != 4) {
                throw new IllegalStateException("quartic intersections need dimension 4, the last input had " + dim);
            }
            fillDense();
        }
        return quartic[((r * m + s) * m + t) * m + u];
    }

    /**
     * All nonzero intersection numbers of {@code c}, keyed by the exponent vector {@code a}
     * (length m, {@code |a| = d}), in lexicographic order. Allocates; for tests and tools.
     */
    public static Map<List<Integer>, Long> all(Configuration c) {
        IntersectionNumbers in = new IntersectionNumbers();
        in.compute(c);
        return in.asMap();
    }

    /** The result of the last call as a map; see {@link #all(Configuration)}. */
    public Map<List<Integer>, Long> asMap() {
        Map<List<Integer>, Long> map = new TreeMap<>(IntersectionNumbers::compareLex);
        for (int i = 0; i < front.size; i++) {
            Integer[] a = new Integer[m];
            for (int r = 0; r < m; r++) {
                a[r] = exponent(i, r);
            }
            map.put(List.of(a), front.weight[i]);
        }
        return Collections.unmodifiableMap(map);
    }

    private static int compareLex(List<Integer> x, List<Integer> y) {
        for (int i = 0; i < Math.min(x.size(), y.size()); i++) {
            int c = Integer.compare(x.get(i), y.get(i));
            if (c != 0) {
                return c;
            }
        }
        return Integer.compare(x.size(), y.size());
    }

    /** Copies {@code c} into the workspace: shape, supports, row sums and key layout, in one pass. */
    void load(Configuration c) {
        m = c.rows();
        k = c.cols();
        int bits = 0;
        int ambient = 0;
        boolean cy = true;
        long full = 0;
        for (int r = 0; r < m; r++) {
            n[r] = c.n(r);
            ambient += n[r];
            int width = 32 - Integer.numberOfLeadingZeros(n[r]);
            shift[r] = bits;
            mask[r] = (1L << width) - 1;
            for (int b = bits; b < Math.min(64, bits + width); b++) {
                rowOfBit[b] = r;
            }
            full |= (long) n[r] << bits;
            bits += width;
            remaining[r] = 0;
            rowMask[r] = 0;
        }
        fullKey = full;
        dim = ambient - k;
        if (bits > 64) {
            // Plain if: a varargs check would box its arguments on every call of the hot path.
            throw new IllegalArgumentException("too large: exponent vectors of " + c + " need " + bits + " bits");
        }
        for (int r = 0; r < m; r++) {
            int sum = 0;
            int qBase = r * MAX_COLS;
            for (int j = 0; j < k; j++) {
                int v = c.q(r, j);
                q[qBase + j] = v;
                if (v > 0) {
                    sum += v;
                    int base = j * MAX_ROWS;
                    int len = r == 0 ? 0 : suppLen[j];
                    suppRow[base + len] = r;
                    suppDeg[base + len] = v;
                    suppLen[j] = len + 1;
                    rowMask[r] |= 1 << j;
                } else if (r == 0) {
                    suppLen[j] = 0;
                }
            }
            remaining[r] = Integer.bitCount(rowMask[r]);
            cy &= sum == n[r] + 1;
        }
        calabiYau = cy;
        forceSingleRowColumns();
        chooseOrder();
    }

    /**
     * A column with a single row r gives its unit to r whatever the state: it is {@code q_rj J_r}.
     * So all such columns are applied up front: the programme starts from {@code c = t} (t_r single-row
     * columns on row r) with weight {@code prod q_rj} and runs over the other columns only. The gap
     * of the start state is what processing them first would give (each leaves the gap unchanged),
     * so the states and the final entries are those of the plain programme. If the product
     * overflows, nothing is forced and the plain programme decides (it may prune every state first).
     */
    private void forceSingleRowColumns() {
        long weight = 1;
        boolean fits = true;
        for (int j = 0; j < k && fits; j++) {
            if (suppLen[j] == 1) {
                int q1 = suppDeg[j * MAX_ROWS];
                fits = weight <= Long.MAX_VALUE / q1;
                weight *= q1;
            }
        }
        for (int r = 0; r < m; r++) {
            forced[r] = 0;
        }
        ordered = 0;
        for (int j = 0; j < k; j++) {
            boolean single = fits && suppLen[j] == 1;
            taken[j] = single;
            if (single) {
                int r = suppRow[j * MAX_ROWS];
                forced[r]++;
                remaining[r]--;
            } else {
                ordered++;
            }
        }
        startWeight = fits ? weight : 1;
        startKey = 0;
        startEmpty = false;
        for (int r = 0; r < m; r++) {
            if (forced[r] > n[r]) {
                startEmpty = true;
            } else {
                startKey += (long) forced[r] << shift[r];
            }
        }
    }

    /**
     * Greedy column order: repeatedly the unprocessed column minimising (smallest remaining count of
     * its rows, sum of those counts, index), which finishes rows early and keeps the frontier small.
     * Leaves {@code remaining} as it found it.
     */
    private void chooseOrder() {
        for (int r = 0; r < m; r++) {
            current[r] = remaining[r];
        }
        for (int t = 0; t < ordered; t++) {
            int best = -1;
            int bestMin = Integer.MAX_VALUE;
            int bestSum = Integer.MAX_VALUE;
            for (int j = 0; j < k; j++) {
                if (taken[j]) {
                    continue;
                }
                int min = Integer.MAX_VALUE;
                int sum = 0;
                int base = j * MAX_ROWS;
                for (int i = 0; i < suppLen[j]; i++) {
                    int cnt = current[suppRow[base + i]];
                    min = Math.min(min, cnt);
                    sum += cnt;
                }
                if (min < bestMin || (min == bestMin && sum < bestSum)) {
                    best = j;
                    bestMin = min;
                    bestSum = sum;
                }
            }
            taken[best] = true;
            order[t] = best;
            int base = best * MAX_ROWS;
            for (int i = 0; i < suppLen[best]; i++) {
                current[suppRow[base + i]]--;
            }
        }
    }

    private void runProgramme() {
        front.clear();
        if (dim < 0 || startEmpty) {
            return;
        }
        int gap0 = 0;
        for (int r = 0; r < m; r++) {
            gap0 += Math.max(0, n[r] - forced[r] - remaining[r]);
        }
        if (gap0 > dim) {
            return;
        }
        front.add(startKey, startWeight, gap0);
        for (int t = 0; t < ordered; t++) {
            int j = order[t];
            int base = j * MAX_ROWS;
            int len = suppLen[j];
            // The column's rows in flat per-slot arrays, so the state loop reads no per-row tables.
            for (int i = 0; i < len; i++) {
                int s = suppRow[base + i];
                colShift[i] = shift[s];
                colMask[i] = mask[s];
                colN[i] = n[s];
                colSlack[i] = n[s] - remaining[s];
                colDeg[i] = suppDeg[base + i];
            }
            StateTable next = back;
            next.clear();
            for (int e = 0; e < front.size; e++) {
                long key = front.key[e];
                long w = front.weight[e];
                int g = front.gap[e];
                // x_s = n_s - c_s - rem(s) before this column; every row of the support not chosen
                // sees its rem drop by one, so its term max(0, x_s) grows iff x_s >= 0.
                int grow = 0;
                for (int i = 0; i < len; i++) {
                    int cs = (int) ((key >>> colShift[i]) & colMask[i]);
                    current[i] = cs;
                    int ind = colSlack[i] - cs >= 0 ? 1 : 0;
                    indicator[i] = ind;
                    grow += ind;
                }
                for (int i = 0; i < len; i++) {
                    if (current[i] >= colN[i]) {
                        continue;
                    }
                    int g2 = g + grow - indicator[i];
                    if (g2 > dim) {
                        continue;
                    }
                    next.add(key + (1L << colShift[i]), Math.multiplyExact(w, colDeg[i]), g2);
                }
            }
            for (int i = 0; i < len; i++) {
                remaining[suppRow[base + i]]--;
            }
            back = front;
            front = next;
        }
    }

    private void clearDense() {
        long[] table = denseKind == 3 ? triple : quartic;
        for (int i = 0; i < writtenCount; i++) {
            table[written[i]] = 0;
        }
        writtenCount = 0;
        denseKind = 0;
    }

    private void fillDense() {
        if (dim == 3) {
            int size = m * m * m;
            if (triple.length < size) {
                triple = new long[MAX_ROWS * MAX_ROWS * MAX_ROWS];
            }
            denseKind = 3;
            int[] rows = indicator;
            for (int i = 0; i < front.size; i++) {
                rowsOf(i, rows);
                long v = front.weight[i];
                int a = rows[0];
                int b = rows[1];
                int c = rows[2];
                put3(triple, a, b, c, v);
                put3(triple, a, c, b, v);
                put3(triple, b, a, c, v);
                put3(triple, b, c, a, v);
                put3(triple, c, a, b, v);
                put3(triple, c, b, a, v);
            }
        } else if (dim == 4) {
            int size = m * m * m * m;
            if (quartic.length < size) {
                quartic = new long[MAX_ROWS * MAX_ROWS * MAX_ROWS * MAX_ROWS];
            }
            denseKind = 4;
            int[] rows = indicator;
            for (int i = 0; i < front.size; i++) {
                rowsOf(i, rows);
                putAllOrders4(rows[0], rows[1], rows[2], rows[3], front.weight[i]);
            }
        }
    }

    private void put3(long[] table, int a, int b, int c, long v) {
        int idx = (a * m + b) * m + c;
        if (table[idx] == 0) {
            written[writtenCount++] = idx;
        }
        table[idx] = v;
    }

    private void putAllOrders4(int a, int b, int c, int d, long v) {
        int[] p = {a, b, c, d};
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                if (j == i) {
                    continue;
                }
                for (int k = 0; k < 4; k++) {
                    if (k == i || k == j) {
                        continue;
                    }
                    int l = 6 - i - j - k;
                    int idx = ((p[i] * m + p[j]) * m + p[k]) * m + p[l];
                    if (quartic[idx] == 0) {
                        written[writtenCount++] = idx;
                    }
                    quartic[idx] = v;
                }
            }
        }
    }

    /**
     * Open-addressing map from packed exponent vector to (weight, gap). Entries are stored densely
     * in insertion order for fast iteration; slots hold entry indices stamped with a generation,
     * so clearing is O(1).
     */
    private static final class StateTable {
        long[] key = new long[64];
        long[] weight = new long[64];
        int[] gap = new int[64];
        int size;
        /** Per slot: generation in the high half, entry index in the low half (one load per probe). */
        private long[] slots = new long[128];
        private int slotMask = 127;
        private int generation = 1;

        void clear() {
            size = 0;
            generation++;
            if (generation == Integer.MAX_VALUE) {
                java.util.Arrays.fill(slots, 0);
                generation = 1;
            }
        }

        void add(long k, long w, int g) {
            int slot = hash(k) & slotMask;
            long s;
            while ((int) ((s = slots[slot]) >>> 32) == generation) {
                int e = (int) s;
                if (key[e] == k) {
                    weight[e] = Math.addExact(weight[e], w);
                    return;
                }
                slot = (slot + 1) & slotMask;
            }
            if (size == key.length) {
                grow();
                add(k, w, g);
                return;
            }
            int e = size++;
            key[e] = k;
            weight[e] = w;
            gap[e] = g;
            slots[slot] = (long) generation << 32 | e;
        }

        private void grow() {
            int cap = key.length * 2;
            key = java.util.Arrays.copyOf(key, cap);
            weight = java.util.Arrays.copyOf(weight, cap);
            gap = java.util.Arrays.copyOf(gap, cap);
            slots = new long[cap * 2];
            slotMask = cap * 2 - 1;
            generation = 1;
            for (int e = 0; e < size; e++) {
                int slot = hash(key[e]) & slotMask;
                while ((int) (slots[slot] >>> 32) == generation) {
                    slot = (slot + 1) & slotMask;
                }
                slots[slot] = (long) generation << 32 | e;
            }
        }

        private static int hash(long k) {
            long h = k * 0x9E3779B97F4A7C15L;
            return (int) (h ^ (h >>> 29));
        }
    }
}
