package org.winnow.geometry.hodge;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.FirstPageTally;
import org.winnow.geometry.cohomology.Interval;

/**
 * The Hodge tuple of a Calabi-Yau three-fold or four-fold read off the Koszul first pages of the
 * tangent and cotangent sequences: proved intervals where the pages allow a proof, and a best guess
 * (every differential zero, every map of maximal rank) for every value. The derivation is in
 * docs/model.md ("The tuple from the first page"); in short, with {@code v^q = sum_i (n_i + 1)
 * h^q(O_X(J_i))}, {@code n^q = sum_j h^q(O_X(q_j))} (each enclosed by {@link FirstPageTally#bound}
 * through Serre duality {@code h^q(O_X(L)) = h^{d-q}(O_X(-L))}) and the Jacobian ranks
 * {@code rho_t = rank(H^t(TA|X) -> H^t(N))}, which are only known to lie in {@code [0, min(v^t, n^t)]}:
 * <ul>
 *   <li>d = 3: {@code h21 = h^1(TX) = n^0 - v^0 + m + v^1 - rho_1},
 *       {@code h11 = h^2(TX) = n^1 - rho_1 + v^2 + m - n^2} (when {@code v^3 = 0}),
 *       and {@code h11 - h21 = chi/2};</li>
 *   <li>d = 4: {@code h31 = h^1(TX) = n^0 - v^0 + m + v^1 - rho_1},
 *       {@code h21 = h^2(TX) = n^1 - rho_1 + v^2 - rho_2},
 *       {@code h11 = h^3(TX) = n^2 - rho_2 + v^3 + m - n^3} (when {@code v^4 = 0}),
 *       {@code h11 - h21 + h31 = chi/6 - 8} and {@code h22 = 12 + 2 chi/3 + 2 h21}.</li>
 * </ul>
 * The hypotheses {@code h^q(O_X) = 1, 0, ..., 0, 1} hold for a matrix of one block: the first page of
 * {@code O_X} then has only the entries {@code S = {}} and {@code S = all columns} (a row is zero or
 * full for S only if every row is, by connectedness), so it is settled and nonempty. Block-diagonal
 * matrices (products) get guesses only ({@link #applies()} is false).
 *
 * <p>NOT thread-safe (it owns a {@link FirstPageTally}); one per thread.
 */
public final class FirstPageTuple {
    private final FirstPageTally tally = new FirstPageTally();
    private final long[] vGuess = new long[5];
    private final long[] nGuess = new long[5];
    private final Interval[] v = new Interval[5];
    private final Interval[] n = new Interval[5];
    private int dim;
    private boolean applies;
    private boolean contradiction;
    private Interval h11;
    private Interval h21;
    private Interval h31;
    private Interval h22;
    private Interval tangentOne;
    private Interval rawH11;
    private long g11;
    private long g21;
    private long g31;
    private long g22;

    /**
     * Reads the tuple of {@code config} (Calabi-Yau, dimension 3 or 4, validated by the caller) whose
     * Euler characteristic is {@code chi}.
     */
    public void compute(Configuration config, long chi) {
        tally.compute(config);
        int d = config.dimension();
        int m = config.rows();
        int k = config.cols();
        dim = d;
        for (int q = 0; q <= d; q++) {
            long vg = 0;
            long ng = 0;
            Interval vi = Interval.exact(0);
            Interval ni = Interval.exact(0);
            for (int i = 0; i < m; i++) {
                long mult = config.n(i) + 1L;
                vg = Math.addExact(vg, Math.multiplyExact(mult, tally.dimension(i, d - q)));
                vi = vi.plus(tally.bound(i, d - q).times(mult));
            }
            for (int j = 0; j < k; j++) {
                ng = Math.addExact(ng, tally.dimension(m + j, d - q));
                ni = ni.plus(tally.bound(m + j, d - q));
            }
            vGuess[q] = vg;
            nGuess[q] = ng;
            v[q] = vi;
            n[q] = ni;
        }
        guess(d, m, chi);
        h11 = h21 = h31 = h22 = null;
        tangentOne = rawH11 = null;
        contradiction = false;
        applies = tally.blocks() == 1 && (d == 3 ? chi % 2 == 0 : chi % 6 == 0);
        if (!applies) {
            return;
        }
        try {
            if (d == 3) {
                Interval rho = new Interval(0, Math.max(0, Math.min(v[1].hi(), n[1].hi())));
                h21 = atLeast(n[0].minus(v[0]).plus(m).plus(v[1]).minus(rho), 0);
                h11 = v[3].isExact() && v[3].lo() == 0 ? atLeast(n[1].minus(rho).plus(v[2]).plus(m).minus(n[2]), 1) : null;
                tangentOne = h21;
                rawH11 = h11;
                Interval[] closed = close(3, chi, h11, h21, null);
                h11 = closed[0];
                h21 = closed[1];
            } else {
                Interval rho1 = new Interval(0, Math.max(0, Math.min(v[1].hi(), n[1].hi())));
                Interval rho2 = new Interval(0, Math.max(0, Math.min(v[2].hi(), n[2].hi())));
                h31 = atLeast(n[0].minus(v[0]).plus(m).plus(v[1]).minus(rho1), 0);
                h21 = atLeast(n[1].minus(rho1).plus(v[2]).minus(rho2), 0);
                h11 = v[4].isExact() && v[4].lo() == 0
                        ? atLeast(n[2].minus(rho2).plus(v[3]).plus(m).minus(n[3]), 1) : null;
                tangentOne = h31;
                rawH11 = h11;
                Interval[] closed = close(4, chi, h11, h21, h31);
                h11 = closed[0];
                h21 = closed[1];
                h31 = closed[2];
                h22 = closed[3];
            }
        } catch (IllegalStateException e) {
            // Contradictory enclosures: some hypothesis failed; prove nothing (tests assert it never happens).
            contradiction = true;
            applies = false;
            h11 = h21 = h31 = h22 = null;
            tangentOne = rawH11 = null;
        }
    }

    /** The first-page guesses: every differential zero, every Jacobian map of maximal rank. */
    private void guess(int d, int m, long chi) {
        if (d == 3) {
            long rho = Math.min(vGuess[1], nGuess[1]);
            g11 = Math.max(1, m + vGuess[2] + nGuess[1] - rho - nGuess[2]);
            g21 = Math.max(0, g11 - chi / 2);
            g31 = -1;
            g22 = -1;
        } else {
            long rho1 = Math.min(vGuess[1], nGuess[1]);
            long rho2 = Math.min(vGuess[2], nGuess[2]);
            g31 = Math.max(0, nGuess[0] - vGuess[0] + m + vGuess[1] - rho1);
            g11 = Math.max(1, m + vGuess[3] + nGuess[2] - rho2 - nGuess[3]);
            g21 = Math.max(0, g11 + g31 + 8 - chi / 6);
            g22 = Math.max(0, 12 + 4 * (chi / 6) + 2 * g21);
        }
    }

    /**
     * Applies the identities of a Calabi-Yau of full holonomy to proved enclosures (null = nothing
     * proved), returning {h11, h21, h31, h22} (the last two null for three-folds).
     *
     * @throws IllegalStateException when the enclosures contradict each other
     */
    static Interval[] close(int d, long chi, Interval h11, Interval h21, Interval h31) {
        if (d == 3) {
            h11 = meet(h11, h21 == null ? null : h21.plus(chi / 2));
            h21 = meet(h21, h11 == null ? null : h11.plus(-chi / 2));
            return new Interval[] {h11, h21, null, null};
        }
        long c = chi / 6 - 8;
        for (int iter = 0; iter < 3; iter++) {
            h11 = meet(h11, h21 != null && h31 != null ? h21.minus(h31).plus(c) : null);
            h21 = meet(h21, h11 != null && h31 != null ? h11.plus(h31).plus(-c) : null);
            h31 = meet(h31, h21 != null && h11 != null ? h21.minus(h11).plus(c) : null);
        }
        Interval h22 = h21 == null ? null : h21.times(2).plus(12 + 4 * (chi / 6));
        return new Interval[] {h11, h21, h31, h22};
    }

    private static Interval meet(Interval a, Interval b) {
        return a == null ? b : b == null ? a : a.intersect(b);
    }

    private static Interval atLeast(Interval i, long floor) {
        return i.intersect(new Interval(floor, Math.max(floor, i.hi())));
    }

    /** True iff the derivation's hypotheses hold (one block, chi consistent) and the enclosures agree. */
    public boolean applies() {
        return applies;
    }

    /** True iff the last reading's enclosures contradicted each other (a failed hypothesis or a bug). */
    public boolean contradiction() {
        return contradiction;
    }

    /** The blocks of the last matrix as given. */
    public int blocks() {
        return tally.blocks();
    }

    /** The tally of the last reading. */
    public FirstPageTally tally() {
        return tally;
    }

    /** The proved enclosure of h11, or null when nothing is proved. */
    public Interval h11() {
        return h11;
    }

    /** The proved enclosure of h21, or null. */
    public Interval h21() {
        return h21;
    }

    /** The proved enclosure of h31 (four-folds), or null. */
    public Interval h31() {
        return h31;
    }

    /** The proved enclosure of h22 (four-folds), or null. */
    public Interval h22() {
        return h22;
    }

    /**
     * The enclosure of {@code h^1(TX)} from the tangent sequences alone, before the identities with chi
     * are applied (h21 of a three-fold, h31 of a four-fold); null when nothing is proved.
     */
    public Interval tangentOne() {
        return tangentOne;
    }

    /** The enclosure of h11 from the sequences alone, before the identities with chi; null when none. */
    public Interval rawH11() {
        return rawH11;
    }

    /** The guess for h11 (see {@link #guess}). */
    public long guess11() {
        return g11;
    }

    /** The guess for h21. */
    public long guess21() {
        return g21;
    }

    /** The guess for h31 (four-folds; -1 otherwise). */
    public long guess31() {
        return g31;
    }

    /** The guess for h22 (four-folds; -1 otherwise). */
    public long guess22() {
        return g22;
    }

    /** The dimension of the last configuration. */
    public int dimension() {
        return dim;
    }
}
