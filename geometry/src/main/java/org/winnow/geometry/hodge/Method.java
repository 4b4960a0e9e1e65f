package org.winnow.geometry.hodge;

/** The strongest tool a Hodge computation needed, in increasing cost. */
public enum Method {
    /** Dimensions of the Koszul E1 pages and the rigorous degeneration rules only. */
    DIMENSIONS,
    /** Explicit d1 over F_p, the E2 re-analysis and the graded Jacobian map. */
    D1,
    /** The transferred Koszul complex (all higher differentials, the exact Jacobian map). */
    TRANSFERRED,
    /**
     * A block-diagonal matrix: each block by the engine (any of the methods above), the whole diamond from the
     * blocks' by the Kunneth formula.
     */
    PRODUCT;

    /** The lower-case label used in files and JSON. */
    public String label() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }

    Method max(Method o) {
        return compareTo(o) >= 0 ? this : o;
    }
}
