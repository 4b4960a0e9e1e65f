package org.winnow.geometry.hodge;

/** How far a Hodge computation got. */
public enum Status {
    /** Every Hodge number is determined. */
    EXACT,
    /** Proved intervals; some value is not determined. */
    BOUNDED,
    /** The input is outside what the engine handles (with a reason). */
    REFUSED;

    /** The lower-case label used in files and JSON. */
    public String label() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}
