package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import edu.jas.arith.BigInteger;
import edu.jas.poly.GenPolynomial;
import edu.jas.poly.GenPolynomialRing;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/**
 * chi and the intersection numbers against a general-purpose computer algebra library (JAS, the
 * Java Algebra System), which expands
 * {@code prod_r (1 + t J_r)^{n_r+1} prod_j (sum_{k<=d} (-t D_j)^k) prod_j D_j} as an exact sparse
 * polynomial, with no truncation, and reads chi off as the coefficient of {@code t^d J^n}, and
 * {@code I(a)} as the coefficient of {@code J^{n-a}} in {@code prod_j D_j}, and for three-folds
 * {@code c2.J_r} as the coefficient of {@code t^2 J^n} after one more factor {@code J_r}. Nothing of our
 * programme or Chern-class code is used on that side (common practice, no source).
 */
class InvariantsAgainstComputerAlgebraTest {
    @Test
    void chiAndIntersectionNumbersAgreeWithDirectExpansion() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(512L));
        InvariantCalculator calc = new InvariantCalculator();
        int compared = 0;
        int nonzeroChi = 0;
        for (int i = 0; compared < 60; i++) {
            int dim = 1 + i % 4;
            Configuration c = i % 3 == 2 ? gen.arbitrary(dim, 3, 3, 2) : gen.calabiYau(dim, 4, 3);
            if (c.ambientDimension() > 8) {
                continue; // keeps the untruncated expansion small
            }
            GenPolynomialRing<BigInteger> ring = ring(c);
            long chi = casChi(ring, c, -1);
            CheapInvariants inv = calc.compute(c);
            assertEquals(chi, inv.chi(), c::toText);
            if (dim == 3 && c.ambientDimension() <= 7) {
                // c2.J_r: the coefficient of t^2 J^n in the same expansion times J_r.
                for (int r = 0; r < c.rows(); r++) {
                    assertEquals(casChi(ring, c, r), inv.c2J()[r], c::toText);
                }
            }
            casIntersections(ring, c, IntersectionNumbers.all(c));
            compared++;
            if (chi != 0) {
                nonzeroChi++;
            }
        }
        assertTrue(nonzeroChi > 30, "too few cases with chi != 0: " + nonzeroChi);
    }

    private static GenPolynomialRing<BigInteger> ring(Configuration c) {
        String[] vars = new String[c.rows() + 1];
        vars[0] = "t";
        for (int r = 0; r < c.rows(); r++) {
            vars[r + 1] = variable(r);
        }
        return new GenPolynomialRing<>(new BigInteger(), vars);
    }

    private static String variable(int r) {
        return "x" + (r + 1);
    }

    private static String linearForm(Configuration c, int j) {
        StringBuilder sb = new StringBuilder("(0");
        for (int r = 0; r < c.rows(); r++) {
            if (c.q(r, j) != 0) {
                sb.append('+').append(c.q(r, j)).append('*').append(variable(r));
            }
        }
        return sb.append(')').toString();
    }

    private static String classOfX(Configuration c) {
        StringBuilder mu = new StringBuilder("1");
        for (int j = 0; j < c.cols(); j++) {
            mu.append('*').append(linearForm(c, j));
        }
        return mu.toString();
    }

    /** The monomial {@code t^tPower x^e} as a one-term polynomial (avoids JAS's variable order). */
    private static GenPolynomial<BigInteger> monomial(GenPolynomialRing<BigInteger> ring, int tPower, int[] e) {
        StringBuilder sb = new StringBuilder("t^").append(tPower);
        for (int r = 0; r < e.length; r++) {
            sb.append('*').append(variable(r)).append('^').append(e[r]);
        }
        return ring.parse(sb.toString());
    }

    private static long coefficient(GenPolynomial<BigInteger> p, GenPolynomial<BigInteger> mono) {
        return p.coefficient(mono.leadingExpVector()).getVal().longValueExact();
    }

    /**
     * chi when {@code timesRow < 0}; otherwise {@code int_X c_{d-1} J_timesRow} (for d = 3 that is
     * c2.J of that row).
     */
    private static long casChi(GenPolynomialRing<BigInteger> ring, Configuration c, int timesRow) {
        int d = c.dimension();
        StringBuilder poly = new StringBuilder();
        for (int r = 0; r < c.rows(); r++) {
            poly.append("(1+t*").append(variable(r)).append(")^").append(c.n(r) + 1).append('*');
        }
        for (int j = 0; j < c.cols(); j++) {
            poly.append("(1");
            for (int k = 1; k <= d; k++) {
                poly.append(k % 2 == 1 ? '-' : '+').append("t^").append(k).append('*').append(linearForm(c, j))
                        .append('^').append(k);
            }
            poly.append(")*");
        }
        poly.append(classOfX(c));
        if (timesRow >= 0) {
            poly.append('*').append(variable(timesRow));
        }
        return coefficient(ring.parse(poly.toString()), monomial(ring, timesRow >= 0 ? d - 1 : d, c.dims()));
    }

    private static void casIntersections(GenPolynomialRing<BigInteger> ring, Configuration c,
            Map<List<Integer>, Long> ours) {
        GenPolynomial<BigInteger> mu = ring.parse(classOfX(c));
        int m = c.rows();
        int[] a = new int[m];
        int[] count = {0};
        forEachExponent(c, a, 0, c.dimension(), () -> {
            int[] b = new int[m];
            Integer[] key = new Integer[m];
            for (int r = 0; r < m; r++) {
                b[r] = c.n(r) - a[r];
                key[r] = a[r];
            }
            long expected = coefficient(mu, monomial(ring, 0, b));
            assertEquals(expected, ours.getOrDefault(List.of(key), 0L), () -> c.toText() + " at " + List.of(key));
            if (expected != 0) {
                count[0]++;
            }
        });
        assertEquals(ours.size(), count[0], c::toText);
    }

    /** Visits every exponent vector {@code 0 <= a <= n} with {@code |a| = left + sum a[0..r)}. */
    private static void forEachExponent(Configuration c, int[] a, int r, int left, Runnable visit) {
        if (r == c.rows()) {
            if (left == 0) {
                visit.run();
            }
            return;
        }
        for (int e = 0; e <= Math.min(left, c.n(r)); e++) {
            a[r] = e;
            forEachExponent(c, a, r + 1, left - e, visit);
        }
        a[r] = 0;
    }
}
