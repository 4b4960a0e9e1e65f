package org.winnow.geometry.hodge;

import org.winnow.geometry.Checks;

/**
 * The Hodge tuple of a Calabi-Yau three-fold or four-fold with how each value is known.
 *
 * @param dim     3 or 4
 * @param h11     {@code h^{1,1}}
 * @param h21     {@code h^{2,1}}
 * @param h31     {@code h^{3,1}}; null for three-folds
 * @param h22     {@code h^{2,2}}; null for three-folds
 * @param product true for block-diagonal matrices (products, whose values are never proved here)
 * @param method  where the values came from, e.g. {@code first page}, {@code first page + engine (d1)},
 *                {@code estimate}; a proof step that ran out of time says so here
 */
public record TupleEstimate(int dim, KnownValue h11, KnownValue h21, KnownValue h31, KnownValue h22, boolean product,
        String method) {
    public TupleEstimate {
        Checks.requireArgument(dim == 3 || dim == 4, "tuple estimates are for three-folds and four-folds: dimension %d", dim);
        Checks.requireArgument(h11 != null && h21 != null, "h11 and h21 are required (dimension %d)", dim);
        Checks.requireArgument((h31 == null) == (dim == 3) && (h22 == null) == (dim == 3),
                "h31 and h22 are present exactly for four-folds (dimension %d)", dim);
        Checks.requireArgument(method != null, "method is required (dimension %d)", dim);
    }

    /** True iff every value of the tuple is proved. */
    public boolean allProved() {
        return h11.isProved() && h21.isProved() && (h31 == null || h31.isProved()) && (h22 == null || h22.isProved());
    }
}
