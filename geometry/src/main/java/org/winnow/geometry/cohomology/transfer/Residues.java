package org.winnow.geometry.cohomology.transfer;

/** Residues mod the project prime; placeholder until the shared modular arithmetic lands. */
final class Residues {
    static final long P = 2147483629L;

    private Residues() {}

    static long negate(long a) {
        return a == 0 ? 0 : P - a;
    }

    static long multiply(long a, long b) {
        return a * b % P;
    }
}
