package org.winnow.geometry.cohomology.transfer;

import java.util.ArrayList;
import java.util.List;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.Polynomial;
import org.winnow.geometry.linalg.ModP;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * Exact line-bundle cohomology and the exact Jacobian map on cohomology for a complete intersection,
 * by the transferred Koszul complex (§8 of the exact-invariants design).
 *
 * <p>The Koszul x Cech double complex of {@code O_X(k)} is contracted column by column onto its E1
 * page by an explicit Cech homotopy, and the perturbation lemma turns the Koszul differential into
 * {@code d_inf} on the E1 page; {@code H(V, d_inf) = H^*(X, O_X(k))} with all higher differentials of
 * the spectral sequence included. Chain maps of double complexes transfer to
 * {@code Pi_inf phi iota_inf}, which induce the true maps on cohomology (filtration mixing included).
 *
 * <p><b>Probabilistic nature.</b> Ranks are computed mod p for the given coefficients. A computed rank
 * never exceeds the generic rank, so the returned {@code h^t} are upper bounds of the generic values
 * and {@link #jacobianRank} is a lower bound of the generic rank; both are exact outside a proper
 * closed set of coefficients (probability of a miss about {@code 10^-5} per rank). Callers wanting
 * more certainty run two seeds and keep the larger ranks.
 *
 * <p>The input need not be Calabi-Yau; it must be such that the generic complete intersection is
 * smooth of the expected dimension (all degrees non-negative, as {@link Configuration} ensures).
 * Not thread-safe; use one instance per thread.
 */
public final class TransferredKoszul {
    private final Configuration x;
    private final DefiningPolynomials f;

    private TransferredKoszul(DefiningPolynomials f) {
        this.x = f.configuration();
        this.f = f;
    }

    /** The method for the configuration and the coefficients of {@code f}. */
    public static TransferredKoszul of(DefiningPolynomials f) {
        Checks.requireArgument(f.size() == f.configuration().cols(), "%d polynomials for %d columns", f.size(),
                f.configuration().cols());
        return new TransferredKoszul(f);
    }

    public Configuration configuration() {
        return x;
    }

    /** The transferred complex of {@code O_X(k)}; its differentials are computed on demand. */
    public TransferredComplex complex(int[] k) {
        Checks.requireArgument(k.length == x.rows(), "twist has %d entries for %d rows", k.length, x.rows());
        BottPage page = BottPage.of(x, k);
        return new TransferredComplex(page, new Transfer(x, f, CellLayout.of(x, k)));
    }

    /** {@code h^t(X, O_X(k))} for {@code t = 0..d}, {@code d = dim X}. */
    public int[] cohomology(int[] k) {
        TransferredComplex c = complex(k);
        int d = x.dimension();
        int[] h = new int[d + 1];
        for (int t = 0; t <= d; t++) {
            h[t] = c.cohomology(t);
        }
        return h;
    }

    /**
     * The rank of the map {@code H^t(X, V) -> H^t(X, N)} induced by the Jacobian, where
     * {@code V = (+)_r O_X(e_r)^{n_r + 1}}, {@code N = (+)_j O_X(q_j)} and the map is
     * {@code (s_{r,i}) -> (sum_{r,i} s_{r,i} df_j/dx_{r,i})_j}.
     *
     * <p>For a Calabi-Yau three-fold, {@code t = 1} gives rho of the normal sequence
     * {@code H^1(TA|_X) -> H^1(N)} ({@code H^1(V) -> H^1(TA|_X)} is an isomorphism when
     * {@code h^1(O_X) = h^2(O_X) = 0}); other t serve K3 surfaces and four-folds.
     *
     * <p>Computed as {@code rank[phi_inf Z | B] - rank[B]} with Z the cocycles of the sources, B the
     * coboundaries of the targets and {@code phi_inf = Pi_inf phi iota_inf}.
     */
    public int jacobianRank(int t) {
        int m = x.rows();
        int cols = x.cols();
        int[][] twists = new int[m + cols][];
        for (int r = 0; r < m; r++) {
            twists[r] = unit(m, r);
        }
        for (int j = 0; j < cols; j++) {
            twists[m + j] = column(j);
        }
        Transfer transfer = new Transfer(x, f, CellLayout.of(x, twists));
        BottPage[] sources = new BottPage[m];
        TransferredComplex[] sourceComplexes = new TransferredComplex[m];
        int sourceCocycles = 0;
        for (int r = 0; r < m; r++) {
            sources[r] = BottPage.of(x, twists[r]);
            sourceComplexes[r] = new TransferredComplex(sources[r], transfer);
            if (sources[r].dimension(t) > 0) {
                sourceCocycles += (x.n(r) + 1) * sourceComplexes[r].cocycles(t).cols();
            }
        }
        BottPage[] targets = new BottPage[cols];
        ModPMatrix[] boundaries = new ModPMatrix[cols];
        int[] rowOffset = new int[cols + 1];
        int boundaryCols = 0;
        for (int j = 0; j < cols; j++) {
            targets[j] = BottPage.of(x, twists[m + j]);
            rowOffset[j + 1] = rowOffset[j] + targets[j].dimension(t);
            boundaries[j] = targets[j].dimension(t) == 0 ? new ModPMatrix(0, 0)
                    : new TransferredComplex(targets[j], transfer).coboundaries(t);
            boundaryCols += boundaries[j].cols();
        }
        int rows = rowOffset[cols];
        if (sourceCocycles == 0 || rows == 0) {
            return 0;
        }
        ModPMatrix stacked = new ModPMatrix(rows, sourceCocycles + boundaryCols);
        ModPMatrix boundary = new ModPMatrix(rows, boundaryCols);
        int at = sourceCocycles;
        for (int j = 0; j < cols; j++) {
            copyBlock(boundaries[j], stacked, rowOffset[j], at);
            copyBlock(boundaries[j], boundary, rowOffset[j], at - sourceCocycles);
            at += boundaries[j].cols();
        }
        Reach reach = Reach.of(t, targets);
        int colAt = 0;
        for (int r = 0; r < m; r++) {
            if (sources[r].dimension(t) == 0) {
                continue;
            }
            ModPMatrix z = sourceComplexes[r].cocycles(t);
            if (z.cols() == 0) {
                continue;
            }
            List<Cochain> lifts = new ArrayList<>();
            for (BottPage.Summand s : sources[r].summands(t)) {
                for (int v = 0; v < s.basis().size(); v++) {
                    lifts.add(transfer.lift(s, v, reach));
                }
            }
            for (int i = 0; i <= x.n(r); i++) {
                for (int j = 0; j < cols; j++) {
                    if (x.q(r, j) == 0 || targets[j].dimension(t) == 0) {
                        continue;
                    }
                    Polynomial g = f.polynomial(j).derivative(r, i);
                    Transfer.PackedPolynomial packed = transfer.pack(g);
                    ModPMatrix block = new ModPMatrix(targets[j].dimension(t), lifts.size());
                    for (int v = 0; v < lifts.size(); v++) {
                        long[] image = transfer.project(transfer.multiply(lifts.get(v), packed), targets[j], t);
                        for (int w = 0; w < image.length; w++) {
                            block.set(w, v, image[w]);
                        }
                    }
                    copyBlock(block.multiply(z), stacked, rowOffset[j], colAt);
                }
                colAt += z.cols();
            }
        }
        return stacked.rank() - boundary.rank();
    }

    private static void copyBlock(ModPMatrix block, ModPMatrix into, int row, int col) {
        for (int i = 0; i < block.rows(); i++) {
            for (int j = 0; j < block.cols(); j++) {
                long v = block.get(i, j);
                if (v != 0) {
                    into.set(row + i, col + j, ModP.add(into.get(row + i, col + j), v));
                }
            }
        }
    }

    private int[] column(int j) {
        int[] q = new int[x.rows()];
        for (int r = 0; r < q.length; r++) {
            q[r] = x.q(r, j);
        }
        return q;
    }

    private static int[] unit(int m, int r) {
        int[] e = new int[m];
        e[r] = 1;
        return e;
    }
}
