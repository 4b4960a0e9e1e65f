package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.winnow.geometry.Configuration;

/**
 * Property tests of what the docs promise about a configuration's canonical form and cheap invariants,
 * on random Calabi-Yau configurations drawn from jqwik's seeds: none of them depends on the order of
 * rows and columns, and chi and int c2^2 satisfy the Riemann-Roch identities, checked against an
 * independent Koszul count of chi(O_X).
 */
class InvariantPropertiesTest {
    @Property(tries = 200)
    void canonicalFormIgnoresRowAndColumnOrder(@ForAll long seed, @ForAll @IntRange(min = 3, max = 4) int dim) {
        SplittableRandom rng = new SplittableRandom(seed);
        Configuration c = new RandomConfigurations(rng.split()).calabiYau(dim, 4, 3);
        Configuration shuffled = permute(c, rng);
        assertEquals(c.canonicalText(), shuffled.canonicalText(), () -> c + " vs " + shuffled);
        assertEquals(c.canonical(), c.canonical().canonical(), c::toString);
    }

    @Property(tries = 200)
    void cheapInvariantsIgnoreRowAndColumnOrder(@ForAll long seed, @ForAll @IntRange(min = 3, max = 4) int dim) {
        SplittableRandom rng = new SplittableRandom(seed);
        Configuration c = new RandomConfigurations(rng.split()).calabiYau(dim, 4, 3);
        Configuration shuffled = permute(c, rng);
        InvariantCalculator calc = new InvariantCalculator();
        CheapInvariants a = calc.compute(c);
        CheapInvariants b = calc.compute(shuffled);
        assertEquals(a.dim(), b.dim());
        assertEquals(a.chi(), b.chi(), () -> c + " vs " + shuffled);
        assertEquals(a.blocks(), b.blocks(), () -> c + " vs " + shuffled);
        assertEquals(a.degree(), b.degree(), () -> c + " vs " + shuffled);
        assertEquals(a.c2sq(), b.c2sq(), () -> c + " vs " + shuffled);
        long[] ca = a.c2J();
        long[] cb = b.c2J();
        Arrays.sort(ca);
        Arrays.sort(cb);
        assertArrayEquals(ca, cb, () -> c + " vs " + shuffled);
    }

    /**
     * Hirzebruch-Riemann-Roch with c1 = 0: chi(O_X) = int td(X) is 0 for a three-fold (td_3 = c1 c2 / 24)
     * and (3 int c2^2 - chi) / 720 for a four-fold ("Topological Methods in Algebraic Geometry",
     * Springer Grundlehren 131, 1966; from memory). The left side is counted here independently, as the
     * alternating sum over the Koszul complex of chi(P^n, O(k)) = C(n + k, n); the identity is formal, so
     * it holds for every configuration with c1 = 0, whatever its geometry.
     */
    @Property(tries = 200)
    void chiAndC2SquaredSatisfyRiemannRoch(@ForAll long seed, @ForAll @IntRange(min = 3, max = 4) int dim) {
        Configuration c = new RandomConfigurations(new SplittableRandom(seed)).calabiYau(dim, 4, 3);
        CheapInvariants inv = new InvariantCalculator().compute(c);
        long structureSheaf = koszulChiO(c);
        if (dim == 3) {
            assertEquals(0, structureSheaf, c::toString);
        } else {
            assertEquals(720 * structureSheaf, 3 * inv.c2sq().orElseThrow() - inv.chi(), c::toString);
        }
    }

    /** sum over column subsets S of (-1)^|S| prod_r chi(P^{n_r}, O(-sum_{j in S} q_rj)). */
    private static long koszulChiO(Configuration c) {
        long total = 0;
        for (int mask = 0; mask < 1 << c.cols(); mask++) {
            long term = Integer.bitCount(mask) % 2 == 0 ? 1 : -1;
            for (int r = 0; r < c.rows(); r++) {
                int k = 0;
                for (int j = 0; j < c.cols(); j++) {
                    if ((mask >> j & 1) != 0) {
                        k -= c.q(r, j);
                    }
                }
                term *= chiProjective(c.n(r), k);
            }
            total += term;
        }
        return total;
    }

    /** chi(P^n, O(k)) = (k+1)(k+2)...(k+n) / n!, the binomial C(n + k, n) as a polynomial in k. */
    private static long chiProjective(int n, int k) {
        long num = 1;
        long den = 1;
        for (int i = 1; i <= n; i++) {
            num *= k + i;
            den *= i;
        }
        return num / den;
    }

    private static Configuration permute(Configuration c, SplittableRandom rng) {
        return new RandomConfigurations(rng).permuted(c);
    }
}
