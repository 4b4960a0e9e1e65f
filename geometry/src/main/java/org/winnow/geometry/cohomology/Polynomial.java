package org.winnow.geometry.cohomology;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.winnow.geometry.Checks;
import org.winnow.geometry.linalg.ModP;

/**
 * A multi-homogeneous polynomial over F_p on {@code P^{n_1} x ... x P^{n_m}}: a list of monomials
 * (flattened exponent vectors, as in {@link BottBasis}) with residues as coefficients. Immutable.
 */
public final class Polynomial {
    private final int[] n;
    private final int[] degrees;
    private final int[][] monomials;
    private final long[] coefficients;

    private Polynomial(int[] n, int[] degrees, int[][] monomials, long[] coefficients) {
        this.n = n;
        this.degrees = degrees;
        this.monomials = monomials;
        this.coefficients = coefficients;
    }

    /**
     * Builds a polynomial from its monomials and coefficients (reduced mod p).
     *
     * @throws IllegalArgumentException if a monomial has the wrong length, a negative exponent or the
     *                                  wrong multi-degree
     */
    public static Polynomial of(int[] n, int[] degrees, int[][] monomials, long[] coefficients) {
        Checks.requireArgument(n.length == degrees.length, "%d factors but %d degrees", n.length, degrees.length);
        Checks.requireArgument(monomials.length == coefficients.length, "%d monomials but %d coefficients",
                monomials.length, coefficients.length);
        int coords = 0;
        for (int v : n) {
            coords += v + 1;
        }
        int[][] mons = new int[monomials.length][];
        long[] coeffs = new long[coefficients.length];
        // Plain ifs, not Checks: its varargs would box on every term, and the Hodge engine builds
        // every defining polynomial of every configuration through here.
        for (int t = 0; t < monomials.length; t++) {
            if (monomials[t].length != coords) {
                throw new IllegalArgumentException(String.format("monomial %d has %d exponents, expected %d",
                        t, monomials[t].length, coords));
            }
            int off = 0;
            for (int r = 0; r < n.length; r++) {
                int deg = 0;
                for (int i = 0; i <= n[r]; i++) {
                    if (monomials[t][off + i] < 0) {
                        throw new IllegalArgumentException("monomial " + t + " has a negative exponent");
                    }
                    deg += monomials[t][off + i];
                }
                if (deg != degrees[r]) {
                    throw new IllegalArgumentException(String.format(
                            "monomial %d has degree %d in factor %d, expected %d", t, deg, r, degrees[r]));
                }
                off += n[r] + 1;
            }
            mons[t] = monomials[t].clone();
            coeffs[t] = ModP.reduce(coefficients[t]);
        }
        return new Polynomial(n.clone(), degrees.clone(), mons, coeffs);
    }

    /**
     * All monomials of multi-degree {@code degrees} in the deterministic order of {@link BottBasis}
     * (per factor descending lexicographic, factor 0 most significant).
     */
    public static int[][] monomialsOfDegree(int[] n, int[] degrees) {
        BottBasis basis = BottBasis.of(n, degrees);
        if (basis.bottMask() != 0 || basis.degree() != 0) {
            throw new IllegalArgumentException("monomials need nonnegative degrees: " + Arrays.toString(degrees));
        }
        int[][] out = new int[basis.size()][];
        for (int i = 0; i < out.length; i++) {
            out[i] = basis.exponents(i);
        }
        return out;
    }

    /** A copy of the multi-degree. */
    public int[] degrees() {
        return degrees.clone();
    }

    /** Number of stored terms (zero coefficients included). */
    public int terms() {
        return monomials.length;
    }

    /** A copy of the exponent vector of term t. */
    public int[] monomial(int t) {
        return monomials[t].clone();
    }

    int[] monomialShared(int t) {
        return monomials[t];
    }

    /** The coefficient of term t, a residue. */
    public long coefficient(int t) {
        return coefficients[t];
    }

    /**
     * The partial derivative with respect to coordinate {@code i} of factor {@code r}, of multi-degree
     * {@code degrees - e_r}.
     *
     * @throws IllegalArgumentException if the degree in factor r is 0
     */
    public Polynomial derivative(int r, int i) {
        Checks.requireArgument(degrees[r] > 0, "derivative in factor %d of a polynomial of degree 0 there", r);
        Checks.requireArgument(i >= 0 && i <= n[r], "coordinate %d out of range for P^%d", i, n[r]);
        int off = 0;
        for (int s = 0; s < r; s++) {
            off += n[s] + 1;
        }
        int at = off + i;
        List<int[]> mons = new ArrayList<>();
        List<Long> coeffs = new ArrayList<>();
        for (int t = 0; t < monomials.length; t++) {
            int e = monomials[t][at];
            if (e == 0 || coefficients[t] == 0) {
                continue;
            }
            int[] m = monomials[t].clone();
            m[at]--;
            mons.add(m);
            coeffs.add(ModP.mul(coefficients[t], e));
        }
        int[] deg = degrees.clone();
        deg[r]--;
        long[] c = new long[coeffs.size()];
        for (int t = 0; t < c.length; t++) {
            c[t] = coeffs.get(t);
        }
        return new Polynomial(n, deg, mons.toArray(new int[0][]), c);
    }
}
