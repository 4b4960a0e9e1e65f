package org.winnow.geometry.invariants;

import java.util.HashMap;
import java.util.Map;

/**
 * A polynomial in the hyperplane classes {@code J_1..J_m} of the ambient product, truncated in
 * degree ({@code <= maxDegree}) and by the relations {@code J_r^{n_r+1} = 0}. Monomials are packed
 * exponent vectors ({@code ceil(log2(n_r+1))} bits per row). Used by the generic Chern-class route,
 * which is not on the hot path, so it favours clarity over speed.
 */
final class GradedPolynomial {
    private final int[] n;
    private final int[] shift;
    private final long[] mask;
    private final int maxDegree;
    /** Homogeneous components by degree: packed exponent -> coefficient (no zero coefficients). */
    private final Map<Long, Long>[] parts;

    @SuppressWarnings("unchecked")
    GradedPolynomial(int[] n, int maxDegree) {
        this.n = n.clone();
        this.maxDegree = maxDegree;
        this.shift = new int[n.length];
        this.mask = new long[n.length];
        int bits = 0;
        for (int r = 0; r < n.length; r++) {
            int width = 32 - Integer.numberOfLeadingZeros(n[r]);
            shift[r] = bits;
            mask[r] = (1L << width) - 1;
            bits += width;
        }
        if (bits > 64) {
            throw new IllegalArgumentException("too large: exponent vectors need " + bits + " bits");
        }
        @SuppressWarnings({"rawtypes", "unchecked"}) // Java cannot create an array of a generic type directly
        Map<Long, Long>[] empty = new Map[maxDegree + 1];
        parts = empty;
        for (int k = 0; k <= maxDegree; k++) {
            parts[k] = new HashMap<>();
        }
    }

    static GradedPolynomial one(int[] n, int maxDegree) {
        GradedPolynomial p = new GradedPolynomial(n, maxDegree);
        p.add(0, 0L, 1);
        return p;
    }

    int maxDegree() {
        return maxDegree;
    }

    int rows() {
        return n.length;
    }

    /** Exponent of row r in a packed monomial. */
    int exponent(long key, int r) {
        return (int) ((key >>> shift[r]) & mask[r]);
    }

    /** Packs an exponent vector; returns -1 if some entry exceeds {@code n_r} (the monomial is 0). */
    long pack(int[] a) {
        long key = 0;
        for (int r = 0; r < n.length; r++) {
            if (a[r] < 0) {
                throw new IllegalArgumentException("negative exponent " + a[r] + " in row " + r);
            }
            if (a[r] > n[r]) {
                return -1;
            }
            key |= ((long) a[r]) << shift[r];
        }
        return key;
    }

    long coefficient(int[] a) {
        int deg = 0;
        for (int v : a) {
            deg += v;
        }
        long key = pack(a);
        if (key < 0 || deg > maxDegree) {
            return 0;
        }
        return parts[deg].getOrDefault(key, 0L);
    }

    /** The homogeneous component of degree k (read-only view semantics: do not modify). */
    Map<Long, Long> component(int k) {
        return parts[k];
    }

    void add(int degree, long key, long value) {
        if (value == 0) {
            return;
        }
        parts[degree].merge(key, value, (x, y) -> {
            long s = Math.addExact(x, y);
            return s == 0 ? null : s;
        });
    }

    /** {@code this * L} for the linear form {@code L = sum_r lin[r] J_r}, truncated. */
    GradedPolynomial timesLinear(int[] lin) {
        GradedPolynomial out = new GradedPolynomial(n, maxDegree);
        for (int k = 0; k < maxDegree; k++) {
            addTimesLinear(parts[k], lin, out, k + 1, 1);
        }
        return out;
    }

    /**
     * {@code this / (1 + L)} for the linear form L, truncated: the graded recursion
     * {@code y_0 = x_0, y_k = x_k - L y_{k-1}}.
     */
    GradedPolynomial dividedByOnePlus(int[] lin) {
        GradedPolynomial out = new GradedPolynomial(n, maxDegree);
        parts[0].forEach((key, v) -> out.add(0, key, v));
        for (int k = 1; k <= maxDegree; k++) {
            int deg = k;
            parts[k].forEach((key, v) -> out.add(deg, key, v));
            addTimesLinear(new HashMap<>(out.parts[k - 1]), lin, out, k, -1);
        }
        return out;
    }

    /** {@code this * other}, truncated at the smaller maximum degree. */
    GradedPolynomial times(GradedPolynomial other) {
        int top = Math.min(maxDegree, other.maxDegree);
        GradedPolynomial out = new GradedPolynomial(n, top);
        for (int i = 0; i <= top; i++) {
            for (Map.Entry<Long, Long> x : parts[i].entrySet()) {
                for (int j = 0; i + j <= top; j++) {
                    for (Map.Entry<Long, Long> y : other.parts[j].entrySet()) {
                        long key = addExponents(x.getKey(), y.getKey());
                        if (key >= 0) {
                            out.add(i + j, key, Math.multiplyExact(x.getValue(), y.getValue()));
                        }
                    }
                }
            }
        }
        return out;
    }

    /** {@code this * factor} for an integer scalar. */
    GradedPolynomial scaled(long factor) {
        GradedPolynomial out = new GradedPolynomial(n, maxDegree);
        for (int k = 0; k <= maxDegree; k++) {
            int deg = k;
            parts[k].forEach((key, v) -> out.add(deg, key, Math.multiplyExact(v, factor)));
        }
        return out;
    }

    /** {@code this + other} (same ring, same maximum degree). */
    GradedPolynomial plus(GradedPolynomial other) {
        GradedPolynomial out = new GradedPolynomial(n, maxDegree);
        for (int k = 0; k <= maxDegree; k++) {
            int deg = k;
            parts[k].forEach((key, v) -> out.add(deg, key, v));
            other.parts[k].forEach((key, v) -> out.add(deg, key, v));
        }
        return out;
    }

    private long addExponents(long x, long y) {
        long key = 0;
        for (int r = 0; r < n.length; r++) {
            int e = exponent(x, r) + exponent(y, r);
            if (e > n[r]) {
                return -1;
            }
            key |= ((long) e) << shift[r];
        }
        return key;
    }

    private void addTimesLinear(Map<Long, Long> source, int[] lin, GradedPolynomial out, int degree, int sign) {
        for (Map.Entry<Long, Long> e : source.entrySet()) {
            long key = e.getKey();
            for (int r = 0; r < n.length; r++) {
                if (lin[r] != 0 && exponent(key, r) < n[r]) {
                    out.add(degree, key + (1L << shift[r]), Math.multiplyExact(sign * (long) lin[r], e.getValue()));
                }
            }
        }
    }
}
