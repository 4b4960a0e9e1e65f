package org.winnow.geometry.cohomology;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.linalg.ModPMatrix;

class BottBasisTest {
    @Test
    void basisMatchesDimensionAndIndexRoundTrips() {
        int[][][] cases = {
            {{4}, {5}}, {{3, 3}, {2, -4}}, {{1, 2, 2}, {-2, 1, -3}}, {{2, 1}, {0, 0}}, {{1, 1, 1}, {-3, -2, 2}},
        };
        for (int[][] c : cases) {
            BottBasis b = BottBasis.of(c[0], c[1]);
            assertEquals(b.cohomology().dimensionExact(), b.size());
            Set<List<Integer>> seen = new HashSet<>();
            for (int i = 0; i < b.size(); i++) {
                int[] e = b.exponents(i);
                assertEquals(i, b.indexOf(e));
                List<Integer> key = new java.util.ArrayList<>();
                for (int v : e) {
                    key.add(v);
                }
                assertTrue(seen.add(key), "distinct vectors");
            }
        }
    }

    @Test
    void orderIsDescendingLexicographicPerFactor() {
        BottBasis b = BottBasis.of(new int[] {2}, new int[] {2});
        assertArrayEquals(new int[] {2, 0, 0}, b.exponents(0));
        assertArrayEquals(new int[] {1, 1, 0}, b.exponents(1));
        assertArrayEquals(new int[] {0, 0, 2}, b.exponents(5));
        BottBasis top = BottBasis.of(new int[] {1}, new int[] {-4});
        assertArrayEquals(new int[] {-1, -3}, top.exponents(2));
    }

    @Test
    void multiplicationRespectsTopDegreeExponents() {
        // P^1 with H^1(O(-3)) = <x0^-2 x1^-1, x0^-1 x1^-2>; multiplying by x0 kills the second vector.
        BottBasis src = BottBasis.of(new int[] {1}, new int[] {-3});
        BottBasis tgt = BottBasis.of(new int[] {1}, new int[] {-2});
        int a = src.indexOf(new int[] {-2, -1});
        int b = src.indexOf(new int[] {-1, -2});
        assertEquals(tgt.indexOf(new int[] {-1, -1}), src.multiply(a, new int[] {1, 0}, tgt));
        assertEquals(-1, src.multiply(b, new int[] {1, 0}, tgt));
        // Different Bott types: the map is zero.
        BottBasis h0 = BottBasis.of(new int[] {1}, new int[] {0});
        BottBasis h1 = BottBasis.of(new int[] {1}, new int[] {-2});
        assertEquals(-1, h1.multiply(0, new int[] {2, 0}, h0));
    }

    @Test
    void multiplicationMatrixComposesLikePolynomialProducts() {
        // Acting by f then g equals acting by g then f (a module over the polynomial ring): a
        // brute-force check of the rule in top degree.
        Configuration c = Configuration.parse("3:3,0,1/3:0,3,1");
        DefiningPolynomials f = DefiningPolynomials.random(c, 5);
        int[] n = c.dims();
        BottBasis s = BottBasis.of(n, new int[] {0, -9});
        BottBasis viaThird = BottBasis.of(n, new int[] {1, -8});
        BottBasis viaSecond = BottBasis.of(n, new int[] {0, -6});
        BottBasis end = BottBasis.of(n, new int[] {1, -5});
        ModPMatrix thirdThenSecond = viaThird.multiplication(f.polynomial(1), end)
                .multiply(s.multiplication(f.polynomial(2), viaThird));
        ModPMatrix secondThenThird = viaSecond.multiplication(f.polynomial(2), end)
                .multiply(s.multiplication(f.polynomial(1), viaSecond));
        assertEquals(thirdThenSecond, secondThenThird);
        assertTrue(!thirdThenSecond.isZero(), "a nontrivial composite");
    }

    /**
     * The whole matrix against its definition, entry by entry: the sum over f's terms of
     * {@link BottBasis#multiply} (which goes through exponent vectors and {@code indexOf}), on random
     * products of projective spaces, random degrees of every Bott type, random polynomials. Brute-force
     * oracle, common practice, no source.
     */
    @Test
    void multiplicationMatrixEqualsTheTermByTermProductOnRandomCases() {
        java.util.SplittableRandom rng = new java.util.SplittableRandom(20261202L);
        int checked = 0;
        int nonzero = 0;
        for (int trial = 0; trial < 600; trial++) {
            int m = 1 + rng.nextInt(3);
            int[] n = new int[m];
            int[] k = new int[m];
            int[] fd = new int[m];
            for (int r = 0; r < m; r++) {
                n[r] = 1 + rng.nextInt(3);
                // degree 0 side (k >= 0) or top side (k <= -n-1), small enough for explicit bases
                k[r] = rng.nextBoolean() ? rng.nextInt(3) : -n[r] - 1 - rng.nextInt(3) - 2;
                fd[r] = rng.nextInt(3);
            }
            BottBasis source = BottBasis.of(n, k);
            int[] kt = new int[m];
            for (int r = 0; r < m; r++) {
                kt[r] = k[r] + fd[r];
            }
            BottBasis target = BottBasis.of(n, kt);
            int[][] monomials = Polynomial.monomialsOfDegree(n, fd);
            long[] coefficients = new long[monomials.length];
            for (int t = 0; t < monomials.length; t++) {
                coefficients[t] = rng.nextInt(4) == 0 ? 0 : 1 + rng.nextLong(org.winnow.geometry.linalg.ModP.P - 1);
            }
            Polynomial f = Polynomial.of(n, fd, monomials, coefficients);
            if ((long) source.size() * f.terms() > 20_000) {
                continue; // the oracle is slow; small cases cover every code path
            }
            ModPMatrix fast = source.multiplication(f, target);
            ModPMatrix slow = new ModPMatrix(target.size(), source.size());
            for (int s = 0; s < source.size(); s++) {
                for (int t = 0; t < f.terms(); t++) {
                    int row = source.multiply(s, f.monomial(t), target);
                    if (row >= 0) {
                        slow.set(row, s, org.winnow.geometry.linalg.ModP.add(slow.get(row, s), f.coefficient(t)));
                    }
                }
            }
            assertEquals(slow, fast, () -> java.util.Arrays.toString(n) + " " + java.util.Arrays.toString(k) + " + "
                    + java.util.Arrays.toString(fd));
            checked++;
            if (!fast.isZero()) {
                nonzero++;
            }
        }
        assertTrue(checked > 300, "cases checked: " + checked);
        assertTrue(nonzero > 100, "nonzero maps: " + nonzero);
    }
}
