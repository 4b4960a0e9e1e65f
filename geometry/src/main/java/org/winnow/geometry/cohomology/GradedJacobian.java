package org.winnow.geometry.cohomology;

import java.util.List;
import java.util.Map;
import java.util.HashMap;
import java.util.TreeSet;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.KoszulPage.Position;
import org.winnow.geometry.cohomology.KoszulPage.Summand;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * The Jacobian map {@code H^t(X, V) -> H^t(X, N)} on the E2 pages, level by level: V is
 * {@code (+)_r O_X(e_r)^{n_r+1}}, N is {@code (+)_j O_X(q_j)}, and copy i of {@code O_X(e_r)} maps
 * to {@code O_X(q_j)} by multiplication with {@code df_j/dx_{r,i}}.
 *
 * <p>Multiplication by a polynomial acts on every Koszul summand S separately (same S, no sign), so
 * it is a map of Koszul complexes and induces maps on every page. At level p, with Z the d1-cycles of
 * the sources and B the d1-boundaries of the targets at position {@code (p, p+t)},
 * {@code graded rank_p = rank[Phi Z | B] - rank[B]}.
 *
 * <p>The induced map on cohomology respects the Koszul filtration: a class of level {@code p_s} maps
 * into target levels {@code <= p_s}, its component at {@code p_s} being the graded map. So the rank of
 * the true map is at least the sum of the graded ranks, and equals it when every source level is at
 * most every target level. Both statements need {@code E_infinity = E2} in degree t for every bundle
 * involved, which the caller must have proved.
 */
public final class GradedJacobian {
    /**
     * The result.
     *
     * @param gradedSum the sum of the graded ranks over all levels
     * @param exact     true iff the filtration rule proves the map's rank equals {@code gradedSum}
     * @param sourceLevels levels with nonzero E2 in the sources
     * @param targetLevels levels with nonzero E2 in the targets
     */
    public record Result(long gradedSum, boolean exact, List<Integer> sourceLevels, List<Integer> targetLevels) {
        public Result {
            sourceLevels = List.copyOf(sourceLevels);
            targetLevels = List.copyOf(targetLevels);
        }
    }

    private GradedJacobian() {}

    /**
     * The graded ranks in total degree t.
     *
     * @param polys   the polynomials all d1 objects were computed with
     * @param sources d1 of {@code O_X(e_r)}, index r
     * @param targets d1 of {@code O_X(q_j)}, index j
     */
    public static Result compute(DefiningPolynomials polys, KoszulD1[] sources, KoszulD1[] targets, int t) {
        Configuration x = polys.configuration();
        int m = x.rows();
        int cols = x.cols();
        TreeSet<Integer> srcLevels = new TreeSet<>();
        TreeSet<Integer> tgtLevels = new TreeSet<>();
        long sum = 0;
        for (int p = 0; p <= cols; p++) {
            Position pos = new Position(p, p + t);
            long srcE2 = 0;
            for (int r = 0; r < m; r++) {
                srcE2 += sources[r].e2(pos);
            }
            long tgtE2 = 0;
            for (int j = 0; j < cols; j++) {
                tgtE2 += targets[j].e2(pos);
            }
            if (srcE2 > 0) {
                srcLevels.add(p);
            }
            if (tgtE2 > 0) {
                tgtLevels.add(p);
            }
            if (srcE2 > 0 && tgtE2 > 0) {
                sum += levelRank(polys, sources, targets, pos);
            }
        }
        boolean exact = srcLevels.isEmpty() || tgtLevels.isEmpty() || srcLevels.last() <= tgtLevels.first();
        return new Result(sum, exact, List.copyOf(srcLevels), List.copyOf(tgtLevels));
    }

    private static long levelRank(DefiningPolynomials polys, KoszulD1[] sources, KoszulD1[] targets, Position pos) {
        Configuration x = polys.configuration();
        int m = x.rows();
        int cols = x.cols();
        int[] rowOffset = new int[cols + 1];
        for (int j = 0; j < cols; j++) {
            rowOffset[j + 1] = rowOffset[j] + Math.toIntExact(targets[j].page().dimension(pos));
        }
        int rows = rowOffset[cols];
        ModPMatrix boundaries = new ModPMatrix(rows, 0);
        for (int j = 0; j < cols; j++) {
            boundaries = ModPMatrix.hstack(boundaries, embed(targets[j].imageIn(pos), rowOffset[j], rows));
        }
        ModPMatrix images = new ModPMatrix(rows, 0);
        for (int r = 0; r < m; r++) {
            if (sources[r].e2(pos) == 0) {
                // every cycle is a boundary there, and boundaries map to boundaries
                continue;
            }
            ModPMatrix cycles = sources[r].kernelOut(pos);
            for (int i = 0; i <= x.n(r); i++) {
                ModPMatrix phi = new ModPMatrix(rows, Math.toIntExact(sources[r].page().dimension(pos)));
                for (int j = 0; j < cols; j++) {
                    if (x.q(r, j) == 0 || targets[j].page().dimension(pos) == 0) {
                        continue;
                    }
                    Polynomial g = polys.polynomial(j).derivative(r, i);
                    addBlocks(phi, g, sources[r], targets[j], pos, rowOffset[j]);
                }
                images = ModPMatrix.hstack(images, phi.multiply(cycles));
            }
        }
        if (images.cols() == 0) {
            return 0;
        }
        return ModPMatrix.rankOfStacked(images, boundaries) - boundaries.rank();
    }

    private static void addBlocks(ModPMatrix phi, Polynomial g, KoszulD1 src, KoszulD1 tgt, Position pos, int rowOff) {
        Map<Integer, Summand> targetBySubset = new HashMap<>();
        for (Summand s : tgt.page().summandsAt(pos)) {
            targetBySubset.put(s.subset(), s);
        }
        int colOff = 0;
        for (Summand s : src.page().summandsAt(pos)) {
            Summand t = targetBySubset.get(s.subset());
            if (t != null && t.bottMask() == s.bottMask()) {
                ModPMatrix block = src.basis(s).multiplication(g, tgt.basis(t));
                int r0 = rowOff + tgt.offset(t);
                for (int a = 0; a < block.rows(); a++) {
                    for (int b = 0; b < block.cols(); b++) {
                        long v = block.get(a, b);
                        if (v != 0) {
                            phi.add(r0 + a, colOff + b, v);
                        }
                    }
                }
            }
            colOff += (int) s.dim();
        }
    }

    private static ModPMatrix embed(ModPMatrix block, int rowOffset, int rows) {
        ModPMatrix out = new ModPMatrix(rows, block.cols());
        for (int a = 0; a < block.rows(); a++) {
            for (int b = 0; b < block.cols(); b++) {
                out.set(rowOffset + a, b, block.get(a, b));
            }
        }
        return out;
    }
}
