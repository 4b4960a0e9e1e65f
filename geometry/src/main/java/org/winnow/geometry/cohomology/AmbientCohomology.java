package org.winnow.geometry.cohomology;

import java.math.BigInteger;
import org.winnow.geometry.Checks;

/**
 * The cohomology of {@code O(k)} on {@code A = P^{n_1} x ... x P^{n_m}}: by Kunneth it lives in at
 * most one degree.
 *
 * <p>Per factor, {@code h^0(P^n, O(k)) = C(n+k, n)} for {@code k >= 0}, {@code h^n(P^n, O(k)) =
 * C(-k-1, n)} for {@code k <= -n-1}, and everything vanishes for {@code -n <= k <= -1}. The Bott
 * type {@code R} is the set of factors in top degree, as a bitmask over rows (bit r for row r).
 *
 * @param degree    the only degree with nonzero cohomology ({@code sum_{r in R} n_r}), or -1 if
 *                  all cohomology vanishes
 * @param dimension the dimension in that degree (0 iff it vanishes); exact, it can exceed 2^63
 * @param bottMask  the Bott type R (0 when it vanishes)
 */
public record AmbientCohomology(int degree, BigInteger dimension, int bottMask) {
    /** The vanishing cohomology. */
    public static final AmbientCohomology ZERO = new AmbientCohomology(-1, BigInteger.ZERO, 0);

    public AmbientCohomology {
        Checks.requireArgument(dimension.signum() >= 0, "dimension must be nonnegative: %s", dimension);
        Checks.requireArgument((degree < 0) == (dimension.signum() == 0),
                "degree %d and dimension %s disagree about vanishing", degree, dimension);
    }

    /**
     * The cohomology of {@code O(k)} on the product with factor dimensions {@code n}.
     *
     * @throws IllegalArgumentException if the lengths differ or some {@code n_r < 1}
     */
    public static AmbientCohomology of(int[] n, int[] k) {
        Checks.requireArgument(n.length == k.length, "%d factors but %d degrees", n.length, k.length);
        Checks.requireArgument(n.length <= 31, "too many factors for a bitmask: %d", n.length);
        int degree = 0;
        int mask = 0;
        BigInteger dim = BigInteger.ONE;
        for (int r = 0; r < n.length; r++) {
            Checks.requireArgument(n[r] >= 1, "factor %d has dimension %d, expected >= 1", r, n[r]);
            if (k[r] >= 0) {
                dim = dim.multiply(binomial(n[r] + k[r], n[r]));
            } else if (k[r] <= -n[r] - 1) {
                dim = dim.multiply(binomial(-k[r] - 1, n[r]));
                degree += n[r];
                mask |= 1 << r;
            } else {
                return ZERO;
            }
        }
        return new AmbientCohomology(degree, dim, mask);
    }

    /** The nonzero degree of {@code O(k)} on {@code P^n}: 0, n, or -1 when it vanishes. */
    public static int factorDegree(int n, int k) {
        if (k >= 0) {
            return 0;
        }
        return k <= -n - 1 ? n : -1;
    }

    /** The dimension of the nonzero cohomology of {@code O(k)} on {@code P^n} (0 when it vanishes). */
    public static BigInteger factorDimension(int n, int k) {
        if (k >= 0) {
            return binomial(n + k, n);
        }
        return k <= -n - 1 ? binomial(-k - 1, n) : BigInteger.ZERO;
    }

    /** True iff all cohomology vanishes. */
    public boolean isZero() {
        return degree < 0;
    }

    /** The dimension as a long; throws {@link ArithmeticException} if it does not fit. */
    public long dimensionExact() {
        return dimension.longValueExact();
    }

    /** {@code h^q(A, O(k))} for the given q. */
    public BigInteger dimensionInDegree(int q) {
        return q == degree ? dimension : BigInteger.ZERO;
    }

    static BigInteger binomial(int top, int bottom) {
        if (bottom < 0 || top < bottom) {
            return BigInteger.ZERO;
        }
        int b = Math.min(bottom, top - bottom);
        BigInteger result = BigInteger.ONE;
        for (int i = 1; i <= b; i++) {
            result = result.multiply(BigInteger.valueOf(top - b + i)).divide(BigInteger.valueOf(i));
        }
        return result;
    }
}
