package org.winnow.geometry.cohomology;

import java.util.List;
import java.util.SplittableRandom;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.linalg.ModP;

/**
 * One choice of the defining polynomials {@code f_1..f_K} of a configuration over F_p.
 *
 * <p>{@link #random} gives every monomial of every column an independent uniformly distributed
 * coefficient, drawn column by column in the monomial order of {@link Polynomial#monomialsOfDegree}
 * from a {@link SplittableRandom} seeded with {@code seed}, so equal seeds give equal polynomials.
 * A rank computed with these coefficients is at most the generic rank, and equal to it outside a
 * proper closed subset of the coefficient space.
 *
 * @param configuration the configuration the polynomials belong to
 * @param seed          the seed they were drawn with
 * @param polynomials   {@code f_j} for column j (0-based)
 */
public record DefiningPolynomials(Configuration configuration, long seed, List<Polynomial> polynomials) {
    public DefiningPolynomials {
        polynomials = List.copyOf(polynomials);
    }

    /** Random polynomials for {@code config}, deterministic for {@code seed}. */
    public static DefiningPolynomials random(Configuration config, long seed) {
        SplittableRandom rng = new SplittableRandom(seed);
        int[] n = config.dims();
        Polynomial[] fs = new Polynomial[config.cols()];
        for (int j = 0; j < config.cols(); j++) {
            int[] deg = new int[config.rows()];
            for (int r = 0; r < deg.length; r++) {
                deg[r] = config.q(r, j);
            }
            int[][] mons = Polynomial.monomialsOfDegree(n, deg);
            long[] coeffs = new long[mons.length];
            for (int t = 0; t < coeffs.length; t++) {
                coeffs[t] = ModP.random(rng);
            }
            fs[j] = Polynomial.of(n, deg, mons, coeffs);
        }
        return new DefiningPolynomials(config, seed, List.of(fs));
    }

    /** The polynomial of column j (0-based). */
    public Polynomial polynomial(int j) {
        return polynomials.get(j);
    }

    /** The number of polynomials K. */
    public int size() {
        return polynomials.size();
    }
}
