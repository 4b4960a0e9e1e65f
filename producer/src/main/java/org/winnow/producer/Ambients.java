package org.winnow.producer;

import java.util.ArrayList;
import java.util.List;

/**
 * The products of projective spaces that can carry a matrix within the bounds, as non-increasing
 * n-vectors, ordered by number of rows, then lexicographically descending.
 *
 * <p>Necessary conditions under the base rules (B2-B4), with {@code N = sum n},
 * {@code E = sum (n-1)}, {@code b} the number of rows with {@code n >= 2} and {@code m1} the number
 * of P^1 rows: {@code K = N - d >= 1}; every column has sum at least 2, so {@code 2K <= N + m}
 * (equivalently {@code E <= 2d}); and {@code m1 <= 3d - E + b}, because a P^1 unit in a sum-2
 * column must be paired with a unit of a bigger row.
 */
final class Ambients {
    private Ambients() {}

    static List<int[]> list(Bounds b) {
        List<int[]> out = new ArrayList<>();
        for (int m = b.minRows(); m <= b.maxRows(); m++) {
            fill(b, new int[m], 0, Math.min(b.maxN(), 2 * b.dim() + 1), out);
        }
        return out;
    }

    private static void fill(Bounds b, int[] n, int at, int max, List<int[]> out) {
        if (at == n.length) {
            if (admissible(b, n)) {
                out.add(n.clone());
            }
            return;
        }
        int excess = 0;
        for (int r = 0; r < at; r++) {
            excess += n[r] - 1;
        }
        for (int v = max; v >= 1; v--) {
            if (excess + v - 1 > 2 * b.dim()) {
                continue;
            }
            n[at] = v;
            fill(b, n, at + 1, v, out);
        }
    }

    static boolean admissible(Bounds b, int[] n) {
        int d = b.dim();
        int m = n.length;
        int sum = 0;
        int big = 0;
        for (int v : n) {
            sum += v;
            if (v >= 2) {
                big++;
            }
        }
        int k = sum - d;
        int excess = sum - m;
        int ones = m - big;
        return k >= 1 && k <= b.maxCols() && 2 * k <= sum + m && excess <= 2 * d && ones <= 3 * d - excess + big;
    }
}
