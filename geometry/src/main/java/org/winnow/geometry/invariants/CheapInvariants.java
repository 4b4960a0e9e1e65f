package org.winnow.geometry.invariants;

import java.util.Arrays;
import java.util.List;
import java.util.OptionalLong;

/**
 * The cheap exact invariants of one configuration, in the row order of the configuration they were
 * computed from.
 *
 * @param dim complex dimension d = sum n - K
 * @param chi Euler characteristic {@code int_X c_d}
 * @param blocks number of blocks of the reduced matrix (1 = not a product)
 * @param degree {@code int_X (J_1 + ... + J_m)^d}; 0 iff the generic X is empty
 * @param triple for d = 3 the nonzero {@code d_rst}, {@code r <= s <= t}, ordered
 *     lexicographically; empty otherwise
 * @param c2J for d = 3 {@code int_X c_2 J_r} per row; empty otherwise
 * @param c2sq for d = 4 {@code int_X c_2^2}; empty otherwise
 */
public record CheapInvariants(int dim, long chi, int blocks, long degree, List<TripleIntersection> triple,
        long[] c2J, OptionalLong c2sq) {
    public CheapInvariants {
        triple = List.copyOf(triple);
        c2J = c2J.clone();
    }

    /** A copy of the per-row {@code c2.J} values. */
    @Override
    public long[] c2J() {
        return c2J.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof CheapInvariants other
                && dim == other.dim
                && chi == other.chi
                && blocks == other.blocks
                && degree == other.degree
                && triple.equals(other.triple)
                && Arrays.equals(c2J, other.c2J)
                && c2sq.equals(other.c2sq);
    }

    @Override
    public int hashCode() {
        return ((((31 * dim + Long.hashCode(chi)) * 31 + blocks) * 31 + Long.hashCode(degree)) * 31
                + triple.hashCode()) * 31 + Arrays.hashCode(c2J) * 7 + c2sq.hashCode();
    }

    @Override
    public String toString() {
        return "CheapInvariants[dim=" + dim + ", chi=" + chi + ", blocks=" + blocks + ", degree=" + degree
                + ", triple=" + triple + ", c2J=" + Arrays.toString(c2J) + ", c2sq=" + c2sq + "]";
    }
}
