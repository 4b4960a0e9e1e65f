package org.winnow.geometry.cohomology.transfer;

import java.util.ArrayList;
import java.util.List;

/**
 * The E1 summands a cochain term may still contribute to, for the early stop of the perturbation
 * series (§8.3 of the design): a term with subset S can only end in a summand S'' contained in S
 * (the Koszul differential removes columns, the homotopy keeps them) and, since no operator turns a
 * factor back into the inverse-monomial state, only if the Bott type of S'' lies inside the set of
 * factors the term still holds in that state. Terms that reach no target are dropped, and the series
 * stops when nothing is left.
 */
final class Reach {
    private final int[] subsets;
    private final int[] types;

    private Reach(int[] subsets, int[] types) {
        this.subsets = subsets;
        this.types = types;
    }

    /** The targets: the summands of the given total degree of each page. */
    static Reach of(int totalDegree, KoszulPage... pages) {
        List<KoszulPage.Summand> all = new ArrayList<>();
        for (KoszulPage page : pages) {
            all.addAll(page.summands(totalDegree));
        }
        int[] subsets = new int[all.size()];
        int[] types = new int[all.size()];
        for (int i = 0; i < subsets.length; i++) {
            subsets[i] = all.get(i).subset();
            types[i] = all.get(i).bottType();
        }
        return new Reach(subsets, types);
    }

    boolean isEmpty() {
        return subsets.length == 0;
    }

    /**
     * True iff some target S'' has {@code S'' subset of S} (proper if {@code strict}) and Bott type
     * inside {@code topFactors}.
     */
    boolean reaches(int subset, int topFactors, boolean strict) {
        for (int i = 0; i < subsets.length; i++) {
            int s = subsets[i];
            if ((s & ~subset) == 0 && (types[i] & ~topFactors) == 0 && !(strict && s == subset)) {
                return true;
            }
        }
        return false;
    }
}
