package org.winnow.geometry.cohomology;

import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.winnow.geometry.cohomology.KoszulPage.Position;
import org.winnow.geometry.cohomology.KoszulPage.Summand;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * The first differential {@code d1 : E1(p, q) -> E1(p-1, q)} of the Koszul spectral sequence for one
 * choice of defining polynomials, and the E2 page it leaves.
 *
 * <p>The basis of a position is the concatenation of the Bott bases of its summands in the order of
 * {@link KoszulPage#summandsAt}. The block from summand S to {@code S - {j}} is
 * {@code (-1)^{i-1} M(f_j)}, j being the i-th smallest element of S, and {@code M} the multiplication
 * of {@link BottBasis#multiplication}. Ranks are over F_p, hence at most the generic ranks.
 */
public final class KoszulD1 {
    private final KoszulPage page;
    private final DefiningPolynomials polys;
    private final Map<Integer, BottBasis> bases = new HashMap<>();
    private final Map<Position, ModPMatrix> matrices = new HashMap<>();
    private final Map<Position, Integer> rankOut = new HashMap<>();

    private KoszulD1(KoszulPage page, DefiningPolynomials polys) {
        this.page = page;
        this.polys = polys;
    }

    /** The d1 differential of {@code page} with the polynomials {@code polys}. */
    public static KoszulD1 of(KoszulPage page, DefiningPolynomials polys) {
        if (!page.configuration().equals(polys.configuration())) {
            throw new IllegalArgumentException("polynomials of " + polys.configuration() + " for a page of "
                    + page.configuration());
        }
        return new KoszulD1(page, polys);
    }

    public KoszulPage page() {
        return page;
    }

    /** The Bott basis of a summand (cached). */
    public BottBasis basis(Summand s) {
        return bases.computeIfAbsent(s.subset(), x -> BottBasis.of(page.configuration().dims(), s.degrees()));
    }

    /** The offset of summand s in the concatenated basis of its position. */
    public int offset(Summand s) {
        int off = 0;
        for (Summand t : page.summandsAt(new Position(s.p(), s.q()))) {
            if (t.subset() == s.subset()) {
                return off;
            }
            off += (int) t.dim();
        }
        throw new IllegalArgumentException("summand " + s.subset() + " is not on the page");
    }

    /** The matrix of d1 out of {@code from} (rows: basis of {@code (p-1, q)}, columns: basis of {@code from}). */
    public ModPMatrix matrix(Position from) {
        return matrices.computeIfAbsent(from, this::build);
    }

    private ModPMatrix build(Position from) {
        Position to = new Position(from.p() - 1, from.q());
        List<Summand> src = page.summandsAt(from);
        List<Summand> tgt = page.summandsAt(to);
        ModPMatrix out = new ModPMatrix(Math.toIntExact(page.dimension(to)), Math.toIntExact(page.dimension(from)));
        if (src.isEmpty() || tgt.isEmpty()) {
            return out;
        }
        Map<Integer, Integer> tgtOffset = new HashMap<>();
        Map<Integer, Summand> tgtBySubset = new HashMap<>();
        int off = 0;
        for (Summand t : tgt) {
            tgtOffset.put(t.subset(), off);
            tgtBySubset.put(t.subset(), t);
            off += (int) t.dim();
        }
        int colOff = 0;
        for (Summand s : src) {
            for (int j = 0; j < polys.size(); j++) {
                if ((s.subset() & (1 << j)) == 0) {
                    continue;
                }
                Summand t = tgtBySubset.get(s.subset() & ~(1 << j));
                if (t == null || t.bottMask() != s.bottMask()) {
                    continue;
                }
                boolean negative = (Integer.bitCount(s.subset() & ((1 << j) - 1)) & 1) == 1;
                ModPMatrix block = basis(s).multiplication(polys.polynomial(j), basis(t));
                int rowOff = tgtOffset.get(t.subset());
                for (int a = 0; a < block.rows(); a++) {
                    for (int b = 0; b < block.cols(); b++) {
                        long v = block.get(a, b);
                        if (v != 0) {
                            out.add(rowOff + a, colOff + b, negative ? -v : v);
                        }
                    }
                }
            }
            colOff += (int) s.dim();
        }
        return out;
    }

    /** The rank of d1 out of a position. */
    public int rankOut(Position from) {
        Integer r = rankOut.get(from);
        if (r == null) {
            r = page.summandsAt(new Position(from.p() - 1, from.q())).isEmpty() || page.summandsAt(from).isEmpty()
                    ? 0 : matrix(from).rank();
            rankOut.put(from, r);
        }
        return r;
    }

    /** The rank of d1 into a position. */
    public int rankIn(Position to) {
        return rankOut(new Position(to.p() + 1, to.q()));
    }

    /** {@code E2(p, q) = E1(p, q) - rank d1_out - rank d1_in}. */
    public long e2(Position x) {
        return page.dimension(x) - rankOut(x) - rankIn(x);
    }

    /** A basis of the kernel of d1 out of x, as columns over the basis of x. */
    public ModPMatrix kernelOut(Position x) {
        if (page.summandsAt(new Position(x.p() - 1, x.q())).isEmpty()) {
            return ModPMatrix.identity(Math.toIntExact(page.dimension(x)));
        }
        return matrix(x).kernelBasis();
    }

    /** A basis of the image of d1 into x, as columns over the basis of x. */
    public ModPMatrix imageIn(Position x) {
        Position from = new Position(x.p() + 1, x.q());
        if (page.summandsAt(from).isEmpty()) {
            return new ModPMatrix(Math.toIntExact(page.dimension(x)), 0);
        }
        return matrix(from).imageBasis();
    }

    /**
     * The E2 page as input for {@link SpectralBounds}: only {@code d_r} with {@code r >= 2} remain, so
     * positions of adjacent total degrees are joinable iff p drops by at least two.
     */
    public SpectralBounds.Page e2() {
        Map<Position, Long> dims = new TreeMap<>();
        for (Position x : page.positions()) {
            long v = e2(x);
            if (v < 0) {
                throw new InconsistentPageException("negative E2 dimension at " + x + ": d1 o d1 != 0");
            }
            if (v > 0) {
                dims.put(x, v);
            }
        }
        Map<Position, Long> frozen = Collections.unmodifiableMap(dims);
        int d = page.configuration().dimension();
        return new SpectralBounds.Page() {
            @Override
            public int dimension() {
                return d;
            }

            @Override
            public Map<Position, Long> dims() {
                return frozen;
            }

            @Override
            public boolean joinable(Position from, Position to) {
                return from.p() >= to.p() + 2;
            }
        };
    }
}
