/**
 * The exact method for line-bundle cohomology on a complete intersection: the Koszul x Cech double
 * complex transferred, by the perturbation lemma for strong deformation retracts, onto the Koszul
 * E1 page in Bott coordinates.
 *
 * <p>The spectral sequence of the double complex leaves higher differentials and the filtration of
 * induced maps undecided; the transferred complex {@code (V, d_inf)} has the exact cohomology
 * {@code H^*(X, O_X(k))}, and transferred chain maps induce the exact maps on cohomology. Entry
 * point: {@link org.winnow.geometry.cohomology.transfer.TransferredKoszul}.
 *
 * <p>Internals: cochains of the double complex are sparse maps from packed cells to residues mod p
 * ({@code Cochain}, {@code CellLayout}); {@code CechModel} holds the explicit Cech homotopy. A factor
 * in the lifted {@code H^0} state {@code sum_i e_i x^b} is kept as one symbolic state, because every
 * operator of the method maps that sum to a multiple of itself or to zero; this keeps a Bott vector
 * one term instead of {@code prod (n_r + 1)} cells.
 */
package org.winnow.geometry.cohomology.transfer;
