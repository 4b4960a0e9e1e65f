package org.winnow.geometry.hodge;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.InconsistentPageException;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.cohomology.KoszulD1;
import org.winnow.geometry.cohomology.KoszulPage;
import org.winnow.geometry.cohomology.KoszulPage.Position;
import org.winnow.geometry.cohomology.SpectralBounds;

/**
 * What is known about {@code h^*(X, O_X(k))} for one line bundle, refined on demand: E1 dimensions,
 * then d1 over F_p for each coefficient choice (keeping the larger rank at every position), then the
 * exact backend. Every stage intersects its proved intervals with the previous ones.
 */
final class BundleState {
    private final Configuration x;
    private final int[] k;
    private final KoszulPage page;
    private final KoszulPage dualPage;
    private Interval[] h;
    private Method method = Method.DIMENSIONS;
    private KoszulD1[] d1;
    private Map<Position, Long> e2;
    private boolean[] seedHasMaxRanks;
    private boolean ranksDisagree;

    BundleState(Configuration x, int[] k) {
        this.x = x;
        this.k = k.clone();
        this.page = KoszulPage.of(x, k);
        this.dualPage = KoszulPage.of(x, dual(x, k));
        this.h = SpectralBounds.analyse(page.e1(), dualPage.e1());
    }

    /** {@code K_X (x) L^{-1}}: {@code K_X = O_X(sum_j q_j - n - 1)} by adjunction. */
    static int[] dual(Configuration x, int[] k) {
        int[] out = new int[k.length];
        for (int r = 0; r < k.length; r++) {
            out[r] = x.rowSum(r) - x.n(r) - 1 - k[r];
        }
        return out;
    }

    int[] bundle() {
        return k.clone();
    }

    Interval h(int t) {
        return h[t];
    }

    boolean isExact() {
        for (Interval i : h) {
            if (!i.isExact()) {
                return false;
            }
        }
        return true;
    }

    Method method() {
        return method;
    }

    boolean ranksDisagree() {
        return ranksDisagree;
    }

    /** Computes d1 for every coefficient choice (idempotent) and re-analyses the E2 pages. */
    void refineWithD1(List<DefiningPolynomials> polys) {
        if (d1 != null) {
            return;
        }
        int seeds = polys.size();
        d1 = new KoszulD1[seeds];
        KoszulD1[] dualD1 = new KoszulD1[seeds];
        for (int s = 0; s < seeds; s++) {
            d1[s] = KoszulD1.of(page, polys.get(s));
            dualD1[s] = KoszulD1.of(dualPage, polys.get(s));
        }
        seedHasMaxRanks = new boolean[seeds];
        Arrays.fill(seedHasMaxRanks, true);
        e2 = maxRankE2(page, d1, seedHasMaxRanks);
        Map<Position, Long> dualE2 = maxRankE2(dualPage, dualD1, new boolean[seeds]);
        int d = x.dimension();
        SpectralBounds.Page p = SpectralBounds.page(d, e2, (a, b) -> a.p() >= b.p() + 2);
        SpectralBounds.Page q = SpectralBounds.page(d, dualE2, (a, b) -> a.p() >= b.p() + 2);
        intersect(SpectralBounds.analyse(p, q));
        method = method.max(Method.D1);
    }

    /** E2 dimensions from the largest d1 rank over the coefficient choices, position by position. */
    private Map<Position, Long> maxRankE2(KoszulPage pg, KoszulD1[] ds, boolean[] hasMax) {
        Arrays.fill(hasMax, true);
        Map<Position, Integer> rankOut = new TreeMap<>();
        for (Position from : pg.positions()) {
            int best = 0;
            int[] ranks = new int[ds.length];
            for (int s = 0; s < ds.length; s++) {
                ranks[s] = ds[s].rankOut(from);
                best = Math.max(best, ranks[s]);
            }
            for (int s = 0; s < ds.length; s++) {
                if (ranks[s] < best) {
                    hasMax[s] = false;
                    ranksDisagree = true;
                }
            }
            rankOut.put(from, best);
        }
        Map<Position, Long> out = new TreeMap<>();
        for (Position pos : pg.positions()) {
            long v = pg.dimension(pos) - rankOut.getOrDefault(pos, 0)
                    - rankOut.getOrDefault(new Position(pos.p() + 1, pos.q()), 0);
            if (v < 0) {
                throw new InconsistentPageException("negative E2 dimension at " + pos + " for O_X" + Arrays.toString(k));
            }
            if (v > 0) {
                out.put(pos, v);
            }
        }
        return out;
    }

    /** The d1 of a coefficient choice whose ranks are maximal at every position, or null. */
    KoszulD1 d1For(int seed) {
        return d1 != null && seedHasMaxRanks[seed] ? d1[seed] : null;
    }

    /** The E2 total in degree t (max ranks); requires {@link #refineWithD1}. */
    long e2Total(int t) {
        long s = 0;
        for (Map.Entry<Position, Long> e : e2.entrySet()) {
            if (e.getKey().t() == t) {
                s += e.getValue();
            }
        }
        return s;
    }

    /** True iff {@code E_infinity = E2} in degree t is proved: h^t is exact and equals the E2 total. */
    boolean e2IsFinalIn(int t) {
        return h[t].isExact() && h[t].value() == e2Total(t);
    }

    /** Sets the exact values of the backend, keeping the smallest over coefficient choices. */
    void refineExact(ExactBackend backend, List<DefiningPolynomials> polys) {
        int d = x.dimension();
        long[] best = new long[d + 1];
        Arrays.fill(best, Long.MAX_VALUE);
        boolean disagree = false;
        for (DefiningPolynomials f : polys) {
            int[] v = backend.cohomology(f, k);
            for (int t = 0; t <= d; t++) {
                if (best[t] != Long.MAX_VALUE && best[t] != v[t]) {
                    disagree = true;
                }
                best[t] = Math.min(best[t], v[t]);
            }
        }
        ranksDisagree |= disagree;
        Interval[] exact = new Interval[d + 1];
        for (int t = 0; t <= d; t++) {
            exact[t] = Interval.exact(best[t]);
        }
        intersect(exact);
        method = method.max(Method.TRANSFERRED);
    }

    private void intersect(Interval[] other) {
        for (int t = 0; t < h.length; t++) {
            try {
                h[t] = h[t].intersect(other[t]);
            } catch (IllegalStateException e) {
                throw new InconsistentPageException("h^" + t + "(O_X" + Arrays.toString(k) + "): " + e.getMessage());
            }
        }
    }
}
