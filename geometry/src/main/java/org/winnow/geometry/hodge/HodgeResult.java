package org.winnow.geometry.hodge;

import java.util.List;
import java.util.Optional;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.Interval;

/**
 * The Hodge numbers of one configuration, or the reason there are none.
 *
 * @param input   the configuration as given
 * @param dim     its dimension {@code sum n - K}
 * @param chi     the Euler characteristic, when it was computed
 * @param h11     {@code h^{1,1}} (K3, three-folds, four-folds), null when refused
 * @param h21     {@code h^{2,1}} (three-folds, four-folds), null otherwise
 * @param h31     {@code h^{3,1}} (four-folds), null otherwise
 * @param h22     {@code h^{2,2}} (four-folds), null otherwise
 * @param status  exact, bounded or refused
 * @param method  the strongest method used (null when refused before any cohomology)
 * @param reason  why the result is refused or bounded; empty for exact results
 * @param seconds wall time of the computation
 * @param diamond the whole Hodge diamond when the result is exact, else null
 * @param factors the blocks (each a configuration of its own, reduced) when the input is block-diagonal,
 *                a product of lower-dimensional Calabi-Yau manifolds; empty otherwise. A product has smaller
 *                holonomy: its {@code h^{p,0}} need not vanish and the identities of full holonomy do not hold
 */
public record HodgeResult(Configuration input, int dim, Optional<Long> chi, Interval h11, Interval h21, Interval h31,
        Interval h22, Status status, Method method, String reason, double seconds, HodgeDiamond diamond,
        List<Configuration> factors) {

    public HodgeResult {
        factors = List.copyOf(factors);
    }

    /** A refusal with a one-line reason. */
    static HodgeResult refused(Configuration input, Optional<Long> chi, String reason, Method method, double seconds) {
        return new HodgeResult(input, input.dimension(), chi, null, null, null, null, Status.REFUSED, method, reason, seconds,
                null, List.of());
    }

    /**
     * True iff the input is a product (block-diagonal), whatever the status: its holonomy is smaller than
     * SU(dim), so {@code chi = 2(h11 - h21)} (d = 3) and the four-fold identities need not hold.
     */
    public boolean isProduct() {
        return !factors.isEmpty();
    }

    /** True iff every Hodge number is determined. */
    public boolean isExact() {
        return status == Status.EXACT;
    }
}
