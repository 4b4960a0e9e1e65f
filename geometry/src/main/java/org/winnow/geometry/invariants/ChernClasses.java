package org.winnow.geometry.invariants;

import java.util.Map;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * The total Chern class of the generic complete intersection X, by the generic route that works for
 * every input (Calabi-Yau or not): by adjunction and the Euler sequences
 * {@code c(X) = prod_r (1+J_r)^{n_r+1} / prod_j (1+D_j)} restricted to X, with
 * {@code D_j = sum_r q[r][j] J_r}. The classes are kept as polynomials in the ambient ring
 * {@code Z[J]/(J_r^{n_r+1})}, truncated at degree d = dim X; integrals over X contract them with
 * the intersection numbers {@code int_X J^a}.
 *
 * <p>This route allocates and is meant for non-Calabi-Yau input and as the reference for the closed
 * Calabi-Yau forms of {@link InvariantCalculator}.
 */
public final class ChernClasses {
    private final Configuration config;
    private final GradedPolynomial total;
    private final Map<java.util.List<Integer>, Long> intersections;

    private ChernClasses(Configuration config, GradedPolynomial total) {
        this.config = config;
        this.total = total;
        this.intersections = IntersectionNumbers.all(config);
    }

    /**
     * The Chern classes {@code c_0..c_d} of the generic complete intersection of {@code c}.
     *
     * @throws IllegalArgumentException if {@code dim X < 0} (the generic X is empty)
     */
    public static ChernClasses of(Configuration c) {
        int d = c.dimension();
        Checks.requireArgument(d >= 0, "%s has negative dimension %d: the generic complete intersection is empty", c, d);
        int m = c.rows();
        int[] n = c.dims();
        GradedPolynomial p = GradedPolynomial.one(n, d);
        int[] lin = new int[m];
        for (int r = 0; r < m; r++) {
            // (1 + J_r)^{n_r+1} = sum_k C(n_r+1, k) J_r^k, truncated by J_r^{n_r+1} = 0 and degree d.
            GradedPolynomial factor = new GradedPolynomial(n, d);
            int[] a = new int[m];
            for (int k = 0; k <= Math.min(n[r], d); k++) {
                a[r] = k;
                factor.add(k, factor.pack(a), ExactMath.binomial(n[r] + 1, k));
            }
            p = p.times(factor);
        }
        for (int j = 0; j < c.cols(); j++) {
            for (int r = 0; r < m; r++) {
                lin[r] = c.q(r, j);
            }
            p = p.dividedByOnePlus(lin);
        }
        return new ChernClasses(c, p);
    }

    /** Dimension d of X. */
    public int dimension() {
        return total.maxDegree();
    }

    /** Coefficient of {@code J^a} in {@code c_{|a|}(X)} (ambient representative). */
    public long coefficient(int... a) {
        Checks.requireArgument(a.length == config.rows(), "exponent vector of length %d for %d rows", a.length, config.rows());
        return total.coefficient(a);
    }

    /** {@code int_X c_d(X)}: the Euler characteristic. */
    public long eulerCharacteristic() {
        return integrate(component(dimension()));
    }

    /** {@code int_X c_2(X) J_t} for every row t; needs d = 3. */
    public long[] c2DotJ() {
        Checks.requireState(dimension() == 3, "c2.J needs dimension 3, got %d", dimension());
        long[] out = new long[config.rows()];
        for (int t = 0; t < out.length; t++) {
            int[] lin = new int[config.rows()];
            lin[t] = 1;
            out[t] = integrate(component(2).timesLinear(lin));
        }
        return out;
    }

    /** {@code int_X c_2(X)^2}; needs d = 4. */
    public long c2Squared() {
        Checks.requireState(dimension() == 4, "int c2^2 needs dimension 4, got %d", dimension());
        GradedPolynomial c2 = component(2);
        return integrate(c2.times(c2));
    }

    /** The degree-k part of the total Chern class, as a polynomial of maximum degree d. */
    GradedPolynomial component(int k) {
        GradedPolynomial out = new GradedPolynomial(config.dims(), dimension());
        total.component(k).forEach((key, v) -> out.add(k, key, v));
        return out;
    }

    /** {@code int_X P} = sum over the degree-d monomials of P of coefficient times {@code int_X J^a}. */
    long integrate(GradedPolynomial p) {
        int d = dimension();
        long sum = 0;
        int m = config.rows();
        for (Map.Entry<Long, Long> e : p.component(d).entrySet()) {
            Integer[] a = new Integer[m];
            for (int r = 0; r < m; r++) {
                a[r] = p.exponent(e.getKey(), r);
            }
            Long value = intersections.get(java.util.List.of(a));
            if (value != null) {
                sum = Math.addExact(sum, Math.multiplyExact(e.getValue(), value));
            }
        }
        return sum;
    }
}
