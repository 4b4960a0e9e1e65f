package org.winnow.geometry.cohomology;

import java.util.Map;
import java.util.TreeMap;
import org.winnow.geometry.cohomology.KoszulPage.Position;

/**
 * Rigorous bounds on {@code h^t(X, L)} from the dimensions of one page of a spectral sequence that
 * converges to {@code H^*(X, L)}, X of dimension d.
 *
 * <p>Write {@code E_t} for the page's total dimension in total degree t and {@code k_t} for the
 * total rank of all later differentials from degree t to t+1; then {@code h^t = E_t - k_t - k_{t-1}}.
 * The constraints used, all proved:
 * <ul>
 *   <li>{@code h^t = 0} outside {@code [0, d]}, which fixes {@code k_t} for {@code t < 0} (solving
 *       upwards from the lowest degree) and for {@code t >= d} (solving downwards from the top);</li>
 *   <li>{@code 0 <= k_t <= cap_t}, the cap being the smaller of the total dimensions of the positions
 *       in degree t that the page lets join some position in degree t+1, and of those targets (each
 *       position loses at most its own dimension over all pages); no joinable pair means
 *       {@code k_t = 0};</li>
 *   <li>{@code h^t >= 0};</li>
 *   <li>Serre duality {@code h^t(L) = h^{d-t}(K_X (x) L^{-1})} when the dual page is given.</li>
 * </ul>
 * The feasible set of these integer constraints is projected exactly onto each {@code h^t} by
 * enumerating the free ranks of one side (the other side's ranks are then determined) when that is
 * small, and otherwise bounded by interval propagation to a fixed point. The Euler characteristic
 * {@code sum (-1)^t h^t = sum (-1)^t E_t} holds identically in this parametrisation.
 */
public final class SpectralBounds {
    /** Largest number of rank tuples enumerated for the exact projection. */
    static final long ENUMERATION_LIMIT = 200_000;

    /** One page: its nonzero dimensions and which pairs of positions its differentials may join. */
    public interface Page {
        /** The dimension d of X. */
        int dimension();

        /** The nonzero dimensions by position. */
        Map<Position, Long> dims();

        /**
         * True unless it is proved that no differential of this or a later page joins {@code from}
         * (total degree t) to {@code to} (total degree t+1).
         */
        boolean joinable(Position from, Position to);
    }

    /** A page from given dimensions and a joinability rule. */
    public static Page page(int dimension, Map<Position, Long> dims, java.util.function.BiPredicate<Position, Position> joinable) {
        Map<Position, Long> frozen = java.util.Collections.unmodifiableMap(new TreeMap<>(dims));
        return new Page() {
            @Override
            public int dimension() {
                return dimension;
            }

            @Override
            public Map<Position, Long> dims() {
                return frozen;
            }

            @Override
            public boolean joinable(Position from, Position to) {
                return joinable.test(from, to);
            }
        };
    }

    /** The forced and free ranks of one page. */
    record Chain(int d, long[] e, long kBelow, long kTop, long[] cap) {
        /** {@code E_t} for {@code t = 0..d}. */
        long e(int t) {
            return e[t];
        }
    }

    private SpectralBounds() {}

    /** Bounds on {@code h^0..h^d} from one page. */
    public static Interval[] analyse(Page page) {
        return analyse(page, null);
    }

    /**
     * Bounds on {@code h^0..h^d} from a page of L and (optionally, may be null) a page of
     * {@code K_X (x) L^{-1}}.
     *
     * @throws InconsistentPageException if the constraints have no solution
     */
    public static Interval[] analyse(Page primal, Page dual) {
        Chain a = chain(primal);
        Chain b = dual == null ? null : chain(dual);
        if (b != null && b.d != a.d) {
            throw new IllegalArgumentException("pages of different dimension: " + a.d + " and " + b.d);
        }
        long boxA = box(a);
        long boxB = b == null ? Long.MAX_VALUE : box(b);
        if (boxA <= ENUMERATION_LIMIT && (b == null || boxA <= boxB)) {
            return enumerate(a, b);
        }
        if (b != null && boxB <= ENUMERATION_LIMIT) {
            return mirror(enumerate(b, a));
        }
        return propagate(a, b);
    }

    static Chain chain(Page page) {
        int d = page.dimension();
        Map<Integer, Long> e = new TreeMap<>();
        int tmin = 0;
        int tmax = d;
        for (Map.Entry<Position, Long> x : page.dims().entrySet()) {
            if (x.getValue() <= 0) {
                continue;
            }
            int t = x.getKey().t();
            e.merge(t, x.getValue(), Math::addExact);
            tmin = Math.min(tmin, t);
            tmax = Math.max(tmax, t);
        }
        long kPrev = 0;
        for (int t = tmin; t <= -1; t++) {
            long kt = e.getOrDefault(t, 0L) - kPrev;
            requireRank(page, t, kt);
            kPrev = kt;
        }
        long kBelow = kPrev;
        long kNext = 0;
        for (int t = tmax; t >= d + 1; t--) {
            long k = e.getOrDefault(t, 0L) - kNext;
            requireRank(page, t - 1, k);
            kNext = k;
        }
        long kTop = kNext;
        long[] cap = new long[d];
        for (int t = 0; t < d; t++) {
            cap[t] = cap(page, t);
        }
        long[] et = new long[d + 1];
        for (int t = 0; t <= d; t++) {
            et[t] = e.getOrDefault(t, 0L);
        }
        return new Chain(d, et, kBelow, kTop, cap);
    }

    private static void requireRank(Page page, int t, long k) {
        if (k < 0 || k > cap(page, t)) {
            throw new InconsistentPageException(String.format(
                    "forced rank %d from total degree %d is impossible (cap %d): X is not of dimension %d",
                    k, t, cap(page, t), page.dimension()));
        }
    }

    /** The cap on the total rank of the differentials from degree t to t+1. */
    static long cap(Page page, int t) {
        long src = 0;
        long tgt = 0;
        Map<Position, Long> dims = page.dims();
        for (Map.Entry<Position, Long> x : dims.entrySet()) {
            if (x.getKey().t() != t || x.getValue() <= 0) {
                continue;
            }
            for (Map.Entry<Position, Long> y : dims.entrySet()) {
                if (y.getKey().t() == t + 1 && y.getValue() > 0 && page.joinable(x.getKey(), y.getKey())) {
                    src = Math.addExact(src, x.getValue());
                    break;
                }
            }
        }
        for (Map.Entry<Position, Long> y : dims.entrySet()) {
            if (y.getKey().t() != t + 1 || y.getValue() <= 0) {
                continue;
            }
            for (Map.Entry<Position, Long> x : dims.entrySet()) {
                if (x.getKey().t() == t && x.getValue() > 0 && page.joinable(x.getKey(), y.getKey())) {
                    tgt = Math.addExact(tgt, y.getValue());
                    break;
                }
            }
        }
        return Math.min(src, tgt);
    }

    private static long box(Chain c) {
        long size = 1;
        for (long v : c.cap) {
            if (v >= ENUMERATION_LIMIT) {
                return Long.MAX_VALUE;
            }
            size *= v + 1;
            if (size > ENUMERATION_LIMIT) {
                return Long.MAX_VALUE;
            }
        }
        return size;
    }

    private static Interval[] mirror(Interval[] h) {
        Interval[] out = new Interval[h.length];
        for (int t = 0; t < h.length; t++) {
            out[t] = h[h.length - 1 - t];
        }
        return out;
    }

    /** Exact projection: enumerate the free ranks of {@code a}, determine and check those of {@code b}. */
    private static Interval[] enumerate(Chain a, Chain b) {
        int d = a.d;
        long[] lo = new long[d + 1];
        long[] hi = new long[d + 1];
        java.util.Arrays.fill(lo, Long.MAX_VALUE);
        java.util.Arrays.fill(hi, Long.MIN_VALUE);
        long[] k = new long[d];
        long[] h = new long[d + 1];
        boolean any = false;
        while (true) {
            if (evaluate(a, k, h) && (b == null || dualFeasible(b, h))) {
                any = true;
                for (int t = 0; t <= d; t++) {
                    lo[t] = Math.min(lo[t], h[t]);
                    hi[t] = Math.max(hi[t], h[t]);
                }
            }
            int i = 0;
            while (i < d && k[i] == a.cap[i]) {
                k[i] = 0;
                i++;
            }
            if (i == d) {
                break;
            }
            k[i]++;
        }
        if (!any) {
            throw new InconsistentPageException("no ranks satisfy the page, duality and positivity constraints");
        }
        Interval[] out = new Interval[d + 1];
        for (int t = 0; t <= d; t++) {
            out[t] = new Interval(lo[t], hi[t]);
        }
        return out;
    }

    private static boolean evaluate(Chain a, long[] k, long[] h) {
        int d = a.d;
        for (int t = 0; t <= d; t++) {
            long below = t == 0 ? a.kBelow : k[t - 1];
            long above = t == d ? a.kTop : k[t];
            h[t] = a.e(t) - above - below;
            if (h[t] < 0) {
                return false;
            }
        }
        return true;
    }

    /** Given {@code h^t(L)}, the dual's ranks are determined degree by degree; check them. */
    private static boolean dualFeasible(Chain b, long[] h) {
        int d = b.d;
        long prev = b.kBelow;
        for (int s = 0; s < d; s++) {
            long ks = b.e(s) - h[d - s] - prev;
            if (ks < 0 || ks > b.cap[s]) {
                return false;
            }
            prev = ks;
        }
        return b.e(d) - h[0] - prev == b.kTop;
    }

    /** Sound bounds by interval propagation when the rank boxes are too large to enumerate. */
    static Interval[] propagate(Chain a, Chain b) {
        int d = a.d;
        long[] hLo = new long[d + 1];
        long[] hHi = new long[d + 1];
        long[][] kLo = {new long[d + 2], new long[d + 2]};
        long[][] kHi = {new long[d + 2], new long[d + 2]};
        Chain[] chains = {a, b};
        for (int c = 0; c < 2; c++) {
            Chain ch = chains[c];
            if (ch == null) {
                continue;
            }
            // index t+1 holds k_t for t = -1..d
            kLo[c][0] = kHi[c][0] = ch.kBelow;
            kLo[c][d + 1] = kHi[c][d + 1] = ch.kTop;
            for (int t = 0; t < d; t++) {
                kLo[c][t + 1] = 0;
                kHi[c][t + 1] = ch.cap[t];
            }
        }
        for (int t = 0; t <= d; t++) {
            hLo[t] = 0;
            hHi[t] = Long.MAX_VALUE / 4;
        }
        boolean changed = true;
        for (int iter = 0; iter < 200 && changed; iter++) {
            changed = false;
            for (int c = 0; c < 2; c++) {
                Chain ch = chains[c];
                if (ch == null) {
                    continue;
                }
                for (int t = 0; t <= d; t++) {
                    int ht = c == 0 ? t : d - t;
                    // h = E_t - k_t - k_{t-1}
                    long lo = ch.e(t) - kHi[c][t + 1] - kHi[c][t];
                    long hi = ch.e(t) - kLo[c][t + 1] - kLo[c][t];
                    if (lo > hLo[ht]) {
                        hLo[ht] = lo;
                        changed = true;
                    }
                    if (hi < hHi[ht]) {
                        hHi[ht] = hi;
                        changed = true;
                    }
                    if (hLo[ht] > hHi[ht]) {
                        throw new InconsistentPageException("interval propagation found no solution in degree " + ht);
                    }
                    // k_t = E_t - h - k_{t-1}, k_{t-1} = E_t - h - k_t
                    changed |= tighten(kLo[c], kHi[c], t + 1, ch.e(t) - hHi[ht] - kHi[c][t], ch.e(t) - hLo[ht] - kLo[c][t]);
                    changed |= tighten(kLo[c], kHi[c], t, ch.e(t) - hHi[ht] - kHi[c][t + 1], ch.e(t) - hLo[ht] - kLo[c][t + 1]);
                }
            }
        }
        Interval[] out = new Interval[d + 1];
        for (int t = 0; t <= d; t++) {
            out[t] = new Interval(hLo[t], hHi[t]);
        }
        return out;
    }

    private static boolean tighten(long[] lo, long[] hi, int i, long newLo, long newHi) {
        boolean changed = false;
        if (newLo > lo[i]) {
            lo[i] = newLo;
            changed = true;
        }
        if (newHi < hi[i]) {
            hi[i] = newHi;
            changed = true;
        }
        if (lo[i] > hi[i]) {
            throw new InconsistentPageException("interval propagation found no feasible rank");
        }
        return changed;
    }
}
