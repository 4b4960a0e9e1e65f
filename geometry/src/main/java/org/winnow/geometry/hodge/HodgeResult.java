package org.winnow.geometry.hodge;

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
 */
public record HodgeResult(Configuration input, int dim, Optional<Long> chi, Interval h11, Interval h21, Interval h31,
        Interval h22, Status status, Method method, String reason, double seconds) {

    /** A refusal with a one-line reason. */
    static HodgeResult refused(Configuration input, Optional<Long> chi, String reason, Method method, double seconds) {
        return new HodgeResult(input, input.dimension(), chi, null, null, null, null, Status.REFUSED, method, reason, seconds);
    }

    /** True iff every Hodge number is determined. */
    public boolean isExact() {
        return status == Status.EXACT;
    }
}
