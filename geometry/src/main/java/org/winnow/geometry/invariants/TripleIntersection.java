package org.winnow.geometry.invariants;

/**
 * One nonzero triple intersection number {@code d_rst = int_X J_r J_s J_t} of a three-fold, with
 * 0-based row indices {@code r <= s <= t}.
 */
public record TripleIntersection(int r, int s, int t, long value) {
    public TripleIntersection {
        if (r < 0 || r > s || s > t) {
            throw new IllegalArgumentException("row indices must satisfy 0 <= r <= s <= t, got " + r + "," + s + "," + t);
        }
    }
}
