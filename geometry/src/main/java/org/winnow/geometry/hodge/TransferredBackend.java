package org.winnow.geometry.hodge;

import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.transfer.TransferredKoszul;

/** The exact backend by the transferred Koszul complex. Stateless, so it may be shared. */
public final class TransferredBackend implements ExactBackend {
    @Override
    public int[] cohomology(DefiningPolynomials f, int[] k) {
        return TransferredKoszul.of(f).cohomology(k);
    }

    @Override
    public int jacobianRank(DefiningPolynomials f, int t) {
        return TransferredKoszul.of(f).jacobianRank(t);
    }
}
