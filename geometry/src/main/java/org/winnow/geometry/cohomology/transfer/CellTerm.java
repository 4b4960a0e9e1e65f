package org.winnow.geometry.cohomology.transfer;

/**
 * One unpacked cell of the Koszul x Cech double complex: the Koszul summand S (bitmask over the
 * columns) and per factor r either a Cech cell {@code e_sigma x^b} ({@code sigma[r] != 0}, a bitmask
 * over the coordinates of {@code P^{n_r}}) or the lifted {@code H^0} class {@code sum_i e_i x^b}
 * ({@code sigma[r] == 0}, all exponents of the factor non-negative).
 *
 * <p>Mutable scratch, reused by the hot loops; {@code exp} holds the exponents of all factors one
 * after the other, factor r at {@code offset[r] .. offset[r] + n_r}.
 */
final class CellTerm {
    /** Symbolic factor state {@code sum_i e_i x^b}; never a real Cech cell, whose sigma is nonempty. */
    static final int LIFTED = 0;

    int subset;
    final int[] sigma;
    final int[] exp;

    CellTerm(int factors, int coordinates) {
        sigma = new int[factors];
        exp = new int[coordinates];
    }

    void copyFrom(CellTerm other) {
        subset = other.subset;
        System.arraycopy(other.sigma, 0, sigma, 0, sigma.length);
        System.arraycopy(other.exp, 0, exp, 0, exp.length);
    }
}
