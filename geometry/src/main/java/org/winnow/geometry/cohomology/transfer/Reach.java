package org.winnow.geometry.cohomology.transfer;

import java.util.ArrayList;
import java.util.List;

/**
 * The E1 summands a cochain term may still contribute to, for the early stop of the perturbation
 * series (§8.3 of the design). Every operator of the series only removes columns from S, only
 * raises exponents, and never turns a factor back into the inverse-monomial state, so a term at
 * subset S' can end in a target summand S'' only if
 * <ul>
 *   <li>{@code S'' subset of S'} (proper when another Koszul step must follow);
 *   <li>every factor of top degree in S'' is in the inverse-monomial state in the term, and the
 *       {@code u_r = |b_r(S'')| - |b_r(term)|} units still to be multiplied in do not push any exponent
 *       of that factor above -1: {@code sum_i (-1 - b_{r,i}) >= u_r};
 *   <li>every factor of degree 0 in S'' can still lose its negative exponents:
 *       {@code sum_i max(0, -b_{r,i}) <= u_r}.
 * </ul>
 * Terms that reach no target are dropped, and a series stops when nothing is left. These are only
 * necessary conditions; they never drop a term that could contribute.
 */
final class Reach {
    private final int[] subsets;
    private final int[] types;
    /** {@code |b_r|} of the target, i.e. the residual degree {@code (k - q_{S''})_r}, per target and row. */
    private final int[][] totals;

    private Reach(int[] subsets, int[] types, int[][] totals) {
        this.subsets = subsets;
        this.types = types;
        this.totals = totals;
    }

    /** The targets: the summands of the given total degree of each page. */
    static Reach of(int totalDegree, BottPage... pages) {
        List<BottPage.Summand> all = new ArrayList<>();
        List<int[]> degrees = new ArrayList<>();
        for (BottPage page : pages) {
            for (BottPage.Summand s : page.summands(totalDegree)) {
                all.add(s);
                degrees.add(s.basis().degrees());
            }
        }
        int[] subsets = new int[all.size()];
        int[] types = new int[all.size()];
        for (int i = 0; i < subsets.length; i++) {
            subsets[i] = all.get(i).subset();
            types[i] = all.get(i).bottType();
        }
        return new Reach(subsets, types, degrees.toArray(new int[0][]));
    }

    boolean isEmpty() {
        return subsets.length == 0;
    }

    /**
     * True iff some target satisfies the conditions above for a term with subset {@code subset},
     * inverse-monomial factors {@code topFactors}, and per row the exponent sum {@code total[r]}, the
     * negative part {@code deficit[r] = sum_i max(0, -b_{r,i})} and the room
     * {@code room[r] = sum_i (-1 - b_{r,i})} (used only for top factors).
     */
    boolean reaches(int subset, int topFactors, int[] total, int[] deficit, int[] room, boolean strict) {
        for (int i = 0; i < subsets.length; i++) {
            int s = subsets[i];
            if ((s & ~subset) != 0 || (types[i] & ~topFactors) != 0 || (strict && s == subset)) {
                continue;
            }
            if (fits(types[i], totals[i], total, deficit, room)) {
                return true;
            }
        }
        return false;
    }

    private static boolean fits(int type, int[] target, int[] total, int[] deficit, int[] room) {
        for (int r = 0; r < target.length; r++) {
            int units = target[r] - total[r];
            if (units < 0) {
                return false;
            }
            if ((type & (1 << r)) != 0 ? room[r] < units : deficit[r] > units) {
                return false;
            }
        }
        return true;
    }
}
