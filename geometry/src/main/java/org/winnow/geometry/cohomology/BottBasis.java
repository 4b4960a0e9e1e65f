package org.winnow.geometry.cohomology;

import java.util.Arrays;
import org.winnow.geometry.Checks;
import org.winnow.geometry.linalg.ModP;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * The Bott representatives of {@code H^q(A, O(k))}: tuples of per-factor basis vectors, each a
 * monomial {@code x^b} ({@code b >= 0}, {@code |b| = k_r}) for a factor in degree 0 or an inverse
 * monomial {@code x^b} (all {@code b_i <= -1}, {@code |b| = k_r}) for a factor in top degree.
 *
 * <p>A basis vector is written as one flattened exponent vector over all coordinates of A, factor r
 * occupying {@code [offset(r), offset(r) + n_r + 1)}. The order is deterministic: per factor the
 * descending lexicographic order of the shifted exponents ({@code b} resp. {@code -b - 1}), and
 * mixed radix over factors with factor 0 most significant.
 *
 * <p>Multiplication by a monomial {@code x^c} adds exponents; the result is a basis vector of the
 * target if every top-degree factor still has all exponents {@code <= -1}, and 0 otherwise (the module
 * structure of top local cohomology, which agrees with the Cech cup product). No signs arise.
 */
public final class BottBasis {
    private final int[] n;
    private final int[] k;
    private final int[] offsets;
    private final int coordinates;
    private final AmbientCohomology cohomology;
    private final Compositions[] factors;
    private final boolean[] top;
    private final int[] strides;
    private final int size;

    private BottBasis(int[] n, int[] k) {
        this.n = n.clone();
        this.k = k.clone();
        this.cohomology = AmbientCohomology.of(n, k);
        int m = n.length;
        this.offsets = new int[m + 1];
        for (int r = 0; r < m; r++) {
            offsets[r + 1] = offsets[r] + n[r] + 1;
        }
        this.coordinates = offsets[m];
        this.factors = new Compositions[m];
        this.top = new boolean[m];
        this.strides = new int[m];
        if (cohomology.isZero()) {
            this.size = 0;
            return;
        }
        if (cohomology.dimension().bitLength() >= 31) { // the message is built only on failure: this runs hot
            throw new IllegalArgumentException(String.format("H^%d(O(%s)) has dimension %s, too large for an explicit basis",
                    cohomology.degree(), Arrays.toString(k), cohomology.dimension()));
        }
        for (int r = 0; r < m; r++) {
            top[r] = (cohomology.bottMask() & (1 << r)) != 0;
            factors[r] = Compositions.of(n[r] + 1, top[r] ? -k[r] - n[r] - 1 : k[r]);
        }
        long stride = 1;
        for (int r = m - 1; r >= 0; r--) {
            strides[r] = (int) stride;
            stride *= factors[r].size();
        }
        this.size = (int) stride;
    }

    /** The basis of the nonzero cohomology of {@code O(k)} on the product with dimensions {@code n}. */
    public static BottBasis of(int[] n, int[] k) {
        return new BottBasis(n, k);
    }

    /** The cohomology this basis spans (degree, dimension, Bott type). */
    public AmbientCohomology cohomology() {
        return cohomology;
    }

    public int size() {
        return size;
    }

    /** The cohomological degree q (or -1 when the cohomology vanishes). */
    public int degree() {
        return cohomology.degree();
    }

    /** The Bott type as a bitmask over factors. */
    public int bottMask() {
        return cohomology.bottMask();
    }

    /** A copy of the multi-degree k. */
    public int[] degrees() {
        return k.clone();
    }

    /** Number of coordinates of A, the length of a flattened exponent vector. */
    public int coordinates() {
        return coordinates;
    }

    /** The first flattened coordinate of factor r. */
    public int offset(int r) {
        return offsets[r];
    }

    /** The flattened exponent vector of basis vector {@code index}. */
    public int[] exponents(int index) {
        Checks.requireArgument(index >= 0 && index < size, "basis index %d out of range [0, %d)", index, size);
        int[] e = new int[coordinates];
        int rest = index;
        for (int r = 0; r < n.length; r++) {
            int rank = rest / strides[r];
            rest -= rank * strides[r];
            int[] c = factors[r].elementShared(rank);
            for (int i = 0; i <= n[r]; i++) {
                e[offsets[r] + i] = top[r] ? -c[i] - 1 : c[i];
            }
        }
        return e;
    }

    /** The index of the basis vector with this flattened exponent vector, or -1 if it is none. */
    public int indexOf(int[] exponents) {
        Checks.requireArgument(exponents.length == coordinates, "expected %d exponents, got %d",
                coordinates, exponents.length);
        if (size == 0) {
            return -1;
        }
        long index = 0;
        for (int r = 0; r < n.length; r++) {
            int rank = factors[r].rank(exponents, offsets[r], top[r]);
            if (rank < 0) {
                return -1;
            }
            index += (long) rank * strides[r];
        }
        return (int) index;
    }

    /**
     * The index in {@code target} of basis vector {@code index} times the monomial {@code x^c}
     * (flattened, nonnegative), or -1 if the product is zero (it leaves the top-degree range, or
     * the Bott types differ).
     */
    public int multiply(int index, int[] monomial, BottBasis target) {
        int[] e = exponents(index);
        for (int i = 0; i < coordinates; i++) {
            e[i] += monomial[i];
        }
        if (target.size == 0 || target.bottMask() != bottMask()) {
            return -1;
        }
        return target.indexOf(e);
    }

    /**
     * The matrix ({@code target.size() x size()}) of multiplication by the polynomial {@code f}
     * from this basis to {@code target}; zero when the Bott types differ. Entry for entry what
     * {@link #multiply} gives, summed over the terms of f.
     *
     * <p>Why factor by factor: a basis vector is a tuple of per-factor compositions and a monomial
     * moves each factor independently, so the target's factor ranks come from one small table per
     * (factor, distinct factor part of a monomial) instead of an exponent vector per (vector, term);
     * the d1 maps of the Hodge engine spend most of their time here.
     *
     * @throws IllegalArgumentException if {@code target}'s degree is not this degree plus f's degree
     */
    public ModPMatrix multiplication(Polynomial f, BottBasis target) {
        int[] fd = f.degrees();
        for (int r = 0; r < n.length; r++) {
            if (target.k[r] != k[r] + fd[r]) { // the message is built only on failure: this runs hot
                throw new IllegalArgumentException(String.format("target degree %s is not %s + %s",
                        Arrays.toString(target.k), Arrays.toString(k), Arrays.toString(fd)));
            }
        }
        ModPMatrix out = new ModPMatrix(target.size, size);
        if (size == 0 || target.size == 0 || target.bottMask() != bottMask()) {
            return out;
        }
        int m = n.length;
        int terms = f.terms();
        // moved[t][r][a] = target rank in factor r of source factor rank a times term t's factor-r part,
        // or -1 where the product leaves the top-degree range; tables are shared between terms whose
        // factor-r parts agree.
        int[][][] moved = new int[terms][m][];
        int[] e = new int[coordinates];
        for (int r = 0; r < m; r++) {
            Compositions part = Compositions.of(n[r] + 1, fd[r]);
            int[][] byPart = new int[part.size()][];
            for (int t = 0; t < terms; t++) {
                int[] c = f.monomialShared(t);
                int id = part.rank(c, offsets[r]);
                if (byPart[id] == null) {
                    byPart[id] = movedTable(r, c, target, e);
                }
                moved[t][r] = byPart[id];
            }
        }
        long[] coefficients = new long[terms];
        for (int t = 0; t < terms; t++) {
            coefficients[t] = f.coefficient(t);
        }
        int[] ranks = new int[m];
        for (int s = 0; s < size; s++) {
            if (s > 0) {
                for (int r = m - 1; r >= 0; r--) { // the mixed-radix counter of factor ranks
                    if (++ranks[r] < factors[r].size()) {
                        break;
                    }
                    ranks[r] = 0;
                }
            }
            for (int t = 0; t < terms; t++) {
                long coeff = coefficients[t];
                if (coeff == 0) {
                    continue;
                }
                int[][] tables = moved[t];
                long row = 0;
                for (int r = 0; r < m; r++) {
                    int rank = tables[r][ranks[r]];
                    if (rank < 0) {
                        row = -1;
                        break;
                    }
                    row += (long) rank * target.strides[r];
                }
                if (row >= 0) {
                    int i = (int) row;
                    out.set(i, s, ModP.add(out.get(i, s), coeff));
                }
            }
        }
        return out;
    }

    /** Factor r's table for a monomial {@code c} (flattened): target factor rank per source factor rank. */
    private int[] movedTable(int r, int[] c, BottBasis target, int[] scratch) {
        Compositions source = factors[r];
        int[] table = new int[source.size()];
        int off = offsets[r];
        for (int a = 0; a < table.length; a++) {
            int[] comp = source.elementShared(a);
            for (int i = 0; i <= n[r]; i++) {
                scratch[off + i] = (top[r] ? -comp[i] - 1 : comp[i]) + c[off + i];
            }
            table[a] = target.factors[r].rank(scratch, off, top[r]);
        }
        return table;
    }
}
