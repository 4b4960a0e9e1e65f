package org.winnow.producer;

/**
 * Identity flags of a configuration: each marks a pattern for which a different configuration
 * describes the same manifold, so a rule set may drop the matrix (see the README's rule table).
 */
public enum Flag {
    /** A column that is a single 2 in a P^2 row: a conic, which is a P^1. */
    C("C"),
    /** A column that is a single 2 in a P^3 row: a quadric surface, which is P^1 x P^1. */
    Q3S("Q3s"),
    /** Two identical P^1 rows: the quadric surface written as P^1 x P^1. */
    Q3P("Q3p"),
    /** An ineffective split: some 0/1 row can be contracted without changing the manifold. */
    EK("Ek"),
    /** Block diagonal: the row-column graph is disconnected, the manifold is a product. */
    BD("BD");

    private final String label;

    Flag(String label) {
        this.label = label;
    }

    /** The short name used in output annotations and documentation. */
    public String label() {
        return label;
    }

    /** Bit of this flag in a flag mask. */
    public int bit() {
        return 1 << ordinal();
    }
}
