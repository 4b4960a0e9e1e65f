/**
 * Linear algebra over the prime field F_p with p = {@link org.winnow.geometry.linalg.ModP#P}: the
 * ranks, kernels and images that decide the differentials of the Koszul spectral sequence.
 *
 * <p>Every rank computed here is the rank of one specialisation of a generic matrix, so it can only
 * be smaller than the generic rank; callers compensate by repeating with independent coefficients.
 */
package org.winnow.geometry.linalg;
