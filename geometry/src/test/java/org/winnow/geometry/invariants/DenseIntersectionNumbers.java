package org.winnow.geometry.invariants;

import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.winnow.geometry.Configuration;

/**
 * Reference for the intersection programme: dense truncated arithmetic in {@code Z[J]/(J_r^{n_r+1})}.
 * An array indexed by mixed radix over {@code 0 <= a_r <= n_r} is multiplied K times by the linear
 * forms {@code D_j}; the degree-K slice holds {@code I(n - b)}. Cost {@code K m prod(n_r+1)}, so
 * only for small matrices.
 */
final class DenseIntersectionNumbers {
    private DenseIntersectionNumbers() {}

    static Map<List<Integer>, Long> all(Configuration c) {
        int m = c.rows();
        int[] radix = new int[m];
        int size = 1;
        for (int r = 0; r < m; r++) {
            radix[r] = size;
            size = Math.multiplyExact(size, c.n(r) + 1);
        }
        long[] poly = new long[size];
        poly[0] = 1;
        for (int j = 0; j < c.cols(); j++) {
            long[] next = new long[size];
            for (int idx = 0; idx < size; idx++) {
                if (poly[idx] == 0) {
                    continue;
                }
                for (int r = 0; r < m; r++) {
                    int a = (idx / radix[r]) % (c.n(r) + 1);
                    if (c.q(r, j) != 0 && a < c.n(r)) {
                        next[idx + radix[r]] = Math.addExact(next[idx + radix[r]], Math.multiplyExact(poly[idx], c.q(r, j)));
                    }
                }
            }
            poly = next;
        }
        Map<List<Integer>, Long> out = new TreeMap<>(DenseIntersectionNumbers::compare);
        for (int idx = 0; idx < size; idx++) {
            if (poly[idx] == 0) {
                continue;
            }
            Integer[] a = new Integer[m];
            int degree = 0;
            for (int r = 0; r < m; r++) {
                int b = (idx / radix[r]) % (c.n(r) + 1);
                degree += b;
                a[r] = c.n(r) - b;
            }
            if (degree == c.cols()) {
                out.put(List.of(a), poly[idx]);
            }
        }
        return Collections.unmodifiableMap(out);
    }

    private static int compare(List<Integer> x, List<Integer> y) {
        for (int i = 0; i < x.size(); i++) {
            int c = Integer.compare(x.get(i), y.get(i));
            if (c != 0) {
                return c;
            }
        }
        return 0;
    }
}
