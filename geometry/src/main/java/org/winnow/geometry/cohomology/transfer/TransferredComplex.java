package org.winnow.geometry.cohomology.transfer;

import java.util.HashMap;
import java.util.Map;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * The finite complex {@code (V, d_inf)} of one line bundle {@code O_X(k)}: V is the Koszul E1 page in
 * Bott coordinates ({@link #page()}), and its cohomology is {@code H^*(X, O_X(k))} exactly (for the
 * chosen coefficients, see {@link TransferredKoszul}).
 *
 * <p>Differentials are computed on first use and cached. Not thread-safe.
 */
public final class TransferredComplex {
    private final BottPage page;
    private final Transfer transfer;
    private final Map<Integer, ModPMatrix> differentials = new HashMap<>();
    private final Map<Integer, Integer> ranks = new HashMap<>();

    TransferredComplex(BottPage page, Transfer transfer) {
        this.page = page;
        this.transfer = transfer;
    }

    /** The E1 page, i.e. the graded vector space V with its Bott bases. */
    public BottPage page() {
        return page;
    }

    /** {@code dim V^t}. */
    public int dimension(int t) {
        return page.dimension(t);
    }

    /** The matrix of {@code d_inf : V^t -> V^{t+1}} ({@code dim V^{t+1}} rows, {@code dim V^t} columns). */
    public ModPMatrix differential(int t) {
        return differentials.computeIfAbsent(t, key -> transfer.differential(page, key));
    }

    /** {@code rank d_inf^t}. */
    public int rank(int t) {
        return ranks.computeIfAbsent(t, key -> differential(key).rank());
    }

    /** {@code h^t(X, O_X(k)) = dim V^t - rank d_inf^t - rank d_inf^{t-1}}. */
    public int cohomology(int t) {
        return dimension(t) - rank(t) - rank(t - 1);
    }

    /** A basis of the cocycles {@code ker d_inf^t}, as columns. */
    public ModPMatrix cocycles(int t) {
        return differential(t).kernelBasis();
    }

    /** A basis of the coboundaries {@code im d_inf^{t-1}} inside {@code V^t}, as columns. */
    public ModPMatrix coboundaries(int t) {
        return differential(t - 1).imageBasis();
    }
}
