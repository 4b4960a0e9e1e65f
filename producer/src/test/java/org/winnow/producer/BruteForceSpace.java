package org.winnow.producer;

import java.util.ArrayList;
import java.util.List;
import java.util.TreeMap;
import org.winnow.geometry.Configuration;

/**
 * An independent, deliberately naive oracle for the enumeration: for every non-increasing
 * n-vector, every multiset of columns (a matrix up to column order is a multiset of columns) whose
 * rows sum to n+1, keep those passing the base rules evaluated literally (Hall conditions by
 * trying every subset of columns), canonicalise and deduplicate with a map. Flags are recomputed
 * from their definitions, Ek with subset-based Hall tests (common practice, no source).
 */
final class BruteForceSpace {
    /** A canonical matrix of the space with the data the bounds and rules filter on. */
    record Entry(String text, int rows, int cols, int maxN, int maxEntry, int flags) {}

    private BruteForceSpace() {}

    /** Every canonical matrix with at most {@code maxRows} rows and {@code maxCols} columns, keyed by text. */
    static TreeMap<String, Entry> generate(int dim, int maxRows, int maxCols) {
        TreeMap<String, Entry> out = new TreeMap<>();
        for (int m = 1; m <= maxRows; m++) {
            dims(dim, maxCols, new int[m], 0, 2 * dim + 1, out);
        }
        return out;
    }

    private static void dims(int dim, int maxCols, int[] n, int at, int max, TreeMap<String, Entry> out) {
        if (at == n.length) {
            int sum = 0;
            for (int v : n) {
                sum += v;
            }
            int k = sum - dim;
            if (k >= 1 && k <= maxCols) {
                List<int[]> columns = columns(n);
                multisets(n, k, columns, 0, new int[k][], 0, new int[n.length], out);
            }
            return;
        }
        for (int v = 1; v <= max; v++) {
            n[at] = v;
            dims(dim, maxCols, n, at + 1, v, out);
        }
    }

    /** All columns with entries 0..n_r+1 and sum at least 2 (B2). */
    private static List<int[]> columns(int[] n) {
        List<int[]> out = new ArrayList<>();
        int[] c = new int[n.length];
        while (true) {
            int s = 0;
            for (int v : c) {
                s += v;
            }
            if (s >= 2) {
                out.add(c.clone());
            }
            int r = 0;
            while (r < n.length && c[r] == n[r] + 1) {
                c[r] = 0;
                r++;
            }
            if (r == n.length) {
                return out;
            }
            c[r]++;
        }
    }

    private static void multisets(int[] n, int k, List<int[]> columns, int from, int[][] chosen, int at,
            int[] rowSum, TreeMap<String, Entry> out) {
        if (at == k) {
            for (int r = 0; r < n.length; r++) {
                if (rowSum[r] != n[r] + 1) {
                    return;
                }
            }
            consider(n, chosen, out);
            return;
        }
        int left = 0;
        for (int r = 0; r < n.length; r++) {
            left += n[r] + 1 - rowSum[r];
        }
        if (left < 2 * (k - at)) {
            return; // every column still to come takes at least 2 units
        }
        for (int i = from; i < columns.size(); i++) {
            int[] c = columns.get(i);
            boolean fits = true;
            for (int r = 0; r < n.length; r++) {
                if (rowSum[r] + c[r] > n[r] + 1) {
                    fits = false;
                }
            }
            if (!fits) {
                continue;
            }
            for (int r = 0; r < n.length; r++) {
                rowSum[r] += c[r];
            }
            chosen[at] = c;
            multisets(n, k, columns, i, chosen, at + 1, rowSum, out);
            for (int r = 0; r < n.length; r++) {
                rowSum[r] -= c[r];
            }
        }
    }

    private static void consider(int[] n, int[][] cols, TreeMap<String, Entry> out) {
        int m = n.length;
        int k = cols.length;
        if (!hall(n, cols, -1, 1)) {
            return; // B3: strict Hall
        }
        for (int[] c : cols) {
            int ones = 0;
            int other = 0;
            for (int r = 0; r < m; r++) {
                if (c[r] == 1 && n[r] == 1) {
                    ones++;
                } else if (c[r] != 0) {
                    other++;
                }
            }
            if (ones == 2 && other == 0) {
                return; // B4
            }
        }
        int[][] q = new int[m][k];
        int maxEntry = 0;
        for (int r = 0; r < m; r++) {
            for (int j = 0; j < k; j++) {
                q[r][j] = cols[j][r];
                maxEntry = Math.max(maxEntry, q[r][j]);
            }
        }
        Configuration c = Configuration.of(n, q).canonical();
        out.putIfAbsent(c.toText(), new Entry(c.toText(), m, k, n[0], maxEntry, flags(n, cols)));
    }

    /** Hall with slack: every non-empty column subset S has capacity of N(S) minus row {@code skip} >= |S| + slack. */
    private static boolean hall(int[] n, int[][] cols, int skip, int slack) {
        int k = cols.length;
        for (int s = 1; s < (1 << k); s++) {
            int cap = 0;
            for (int r = 0; r < n.length; r++) {
                if (r == skip) {
                    continue;
                }
                for (int j = 0; j < k; j++) {
                    if ((s & (1 << j)) != 0 && cols[j][r] > 0) {
                        cap += n[r];
                        break;
                    }
                }
            }
            if (cap < Integer.bitCount(s) + slack) {
                return false;
            }
        }
        return true;
    }

    private static int flags(int[] n, int[][] cols) {
        int m = n.length;
        int flags = 0;
        for (int[] c : cols) {
            int nonZero = 0;
            int row = -1;
            for (int r = 0; r < m; r++) {
                if (c[r] != 0) {
                    nonZero++;
                    row = r;
                }
            }
            if (nonZero == 1 && c[row] == 2 && n[row] == 2) {
                flags |= Flag.C.bit();
            }
            if (nonZero == 1 && c[row] == 2 && n[row] == 3) {
                flags |= Flag.Q3S.bit();
            }
        }
        for (int a = 0; a < m; a++) {
            for (int b = a + 1; b < m; b++) {
                boolean same = n[a] == 1 && n[b] == 1;
                for (int[] c : cols) {
                    same &= c[a] == c[b];
                }
                if (same) {
                    flags |= Flag.Q3P.bit();
                }
            }
        }
        if (!connected(m, cols)) {
            flags |= Flag.BD.bit();
        }
        for (int a = 0; a < m; a++) {
            if (ineffective(n, cols, a)) {
                flags |= Flag.EK.bit();
            }
        }
        return flags;
    }

    private static boolean connected(int m, int[][] cols) {
        boolean[] seen = new boolean[m];
        seen[0] = true;
        boolean grew = true;
        while (grew) {
            grew = false;
            for (int[] c : cols) {
                boolean touches = false;
                for (int r = 0; r < m; r++) {
                    touches |= seen[r] && c[r] != 0;
                }
                for (int r = 0; r < m; r++) {
                    if (touches && c[r] != 0 && !seen[r]) {
                        seen[r] = true;
                        grew = true;
                    }
                }
            }
        }
        for (boolean s : seen) {
            if (!s) {
                return false;
            }
        }
        return true;
    }

    /** Ek(a): a 0/1 row whose every admissible 4-multiset of split columns breaks plain Hall without row a. */
    private static boolean ineffective(int[] n, int[][] cols, int a) {
        List<int[]> others = new ArrayList<>();
        List<int[]> split = new ArrayList<>();
        for (int[] c : cols) {
            if (c[a] > 1) {
                return false;
            }
            (c[a] == 1 ? split : others).add(c);
        }
        int s = split.size();
        int[] mult = new int[s];
        return everyMultisetFails(n, others, split, mult, 0, 4, a);
    }

    private static boolean everyMultisetFails(int[] n, List<int[]> others, List<int[]> split, int[] mult, int at,
            int left, int a) {
        if (left == 0) {
            List<int[]> all = new ArrayList<>(others);
            for (int i = 0; i < split.size(); i++) {
                for (int c = 0; c < mult[i]; c++) {
                    int[] restricted = split.get(i).clone();
                    restricted[a] = 0;
                    all.add(restricted);
                }
            }
            return !hall(n, all.toArray(new int[0][]), a, 0);
        }
        if (at == split.size()) {
            return true; // not a multiset of size 4: nothing to test
        }
        for (int c = 0; c <= Math.min(2, left); c++) {
            mult[at] = c;
            if (!everyMultisetFails(n, others, split, mult, at + 1, left - c, a)) {
                mult[at] = 0;
                return false;
            }
        }
        mult[at] = 0;
        return true;
    }
}
