package org.winnow.geometry.hodge;

import org.winnow.geometry.cohomology.DefiningPolynomials;

/**
 * A method that computes line bundle cohomology and the Jacobian map with all higher differentials
 * included, for one choice of coefficients. Ranks over F_p are at most the generic ranks, so returned
 * dimensions are upper bounds of the generic ones (exact for generic coefficients), and returned
 * ranks lower bounds.
 */
public interface ExactBackend {
    /** {@code h^t(X, O_X(k))} for {@code t = 0..dim X}. */
    int[] cohomology(DefiningPolynomials f, int[] k);

    /**
     * The rank of {@code H^t(X, V) -> H^t(X, N)} induced by the Jacobian,
     * {@code V = (+)_r O_X(e_r)^{n_r+1}}, {@code N = (+)_j O_X(q_j)}.
     */
    int jacobianRank(DefiningPolynomials f, int t);
}
