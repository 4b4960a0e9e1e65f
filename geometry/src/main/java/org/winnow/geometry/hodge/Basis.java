package org.winnow.geometry.hodge;

/** How a predicted Hodge number is known. */
public enum Basis {
    /** A theorem: a settled first page with the needed ranks forced, or the Hodge engine's exact value. */
    PROVED,
    /** A proved interval; the value is the best guess inside it. */
    BOUNDED,
    /** No proof: the first-page reading as if every differential vanished and every map had maximal rank. */
    ESTIMATED;

    /** The lower-case label used in files and JSON. */
    public String label() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}
