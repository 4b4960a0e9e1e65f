package org.winnow.geometry.cohomology;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.IntersectionNumbers;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;

class KoszulPageTest {
    private static int[] randomBundle(SplittableRandom rng, int m, int lo, int hi) {
        int[] k = new int[m];
        for (int r = 0; r < m; r++) {
            k[r] = rng.nextInt(lo, hi + 1);
        }
        return k;
    }

    /** Brute force: every subset of columns, no pruning. */
    private static Set<List<Long>> bruteForce(Configuration c, int[] k) {
        Set<List<Long>> out = new HashSet<>();
        for (int s = 0; s < 1 << c.cols(); s++) {
            int[] res = k.clone();
            for (int j = 0; j < c.cols(); j++) {
                if ((s & (1 << j)) != 0) {
                    for (int r = 0; r < c.rows(); r++) {
                        res[r] -= c.q(r, j);
                    }
                }
            }
            AmbientCohomology h = AmbientCohomology.of(c.dims(), res);
            if (!h.isZero()) {
                out.add(List.of((long) s, (long) h.degree(), h.dimensionExact()));
            }
        }
        return out;
    }

    @Test
    void prunedSearchFindsExactlyTheNonzeroSummands() {
        SplittableRandom rng = new SplittableRandom(21);
        RandomConfigurations gen = new RandomConfigurations(rng);
        int nonTrivial = 0;
        for (int trial = 0; trial < 150; trial++) {
            Configuration c = gen.calabiYau(2 + trial % 3, 4, 3);
            if (c.cols() > 12) {
                continue;
            }
            int[] k = randomBundle(rng, c.rows(), -4, 4);
            Set<List<Long>> found = new HashSet<>();
            for (KoszulPage.Summand s : KoszulPage.of(c, k).summands()) {
                found.add(List.of((long) s.subset(), (long) s.q(), s.dim()));
            }
            assertEquals(bruteForce(c, k), found, c + " O_X" + java.util.Arrays.toString(k));
            if (found.size() > 1) {
                nonTrivial++;
            }
        }
        assertTrue(nonTrivial > 50, "too few pages with several summands: " + nonTrivial);
    }

    @Test
    void alternatingSumIsTheIndexFormulaOnThreefolds() {
        // Riemann-Roch on a Calabi-Yau three-fold: chi(O_X(D)) = D^3/6 + c2.D/12 (textbook, from memory).
        SplittableRandom rng = new SplittableRandom(22);
        RandomConfigurations gen = new RandomConfigurations(rng);
        InvariantCalculator calc = new InvariantCalculator();
        for (int trial = 0; trial < 60; trial++) {
            Configuration c = gen.calabiYau(3, 4, 3);
            long[] c2J = new long[c.rows()];
            calc.threefold(c, c2J);
            IntersectionNumbers in = calc.intersections();
            int[] k = randomBundle(rng, c.rows(), -3, 3);
            long cube = 0;
            long c2D = 0;
            for (int r = 0; r < c.rows(); r++) {
                c2D += k[r] * c2J[r];
                for (int s = 0; s < c.rows(); s++) {
                    for (int t = 0; t < c.rows(); t++) {
                        cube += (long) k[r] * k[s] * k[t] * in.triple(r, s, t);
                    }
                }
            }
            long chi = KoszulPage.of(c, k).eulerCharacteristic();
            assertEquals(2 * cube + c2D, 12 * chi, c + " O_X" + java.util.Arrays.toString(k));
        }
    }

    @Test
    void alternatingSumIsTheIndexFormulaOnK3Surfaces() {
        // Riemann-Roch on a K3 surface: chi(O_X(D)) = D^2/2 + 2 (textbook, from memory).
        SplittableRandom rng = new SplittableRandom(23);
        RandomConfigurations gen = new RandomConfigurations(rng);
        for (int trial = 0; trial < 40; trial++) {
            Configuration c = gen.calabiYau(2, 3, 3);
            Map<List<Integer>, Long> in = IntersectionNumbers.all(c);
            int[] k = randomBundle(rng, c.rows(), -3, 3);
            long square = 0;
            for (Map.Entry<List<Integer>, Long> e : in.entrySet()) {
                // the entry for exponent a contributes (2 / a!) * prod k^a, summed over ordered pairs
                List<Integer> a = e.getKey();
                long term = e.getValue();
                int factorial = 1;
                for (int r = 0; r < a.size(); r++) {
                    for (int i = 0; i < a.get(r); i++) {
                        term *= k[r];
                    }
                    factorial *= a.get(r) == 2 ? 2 : 1;
                }
                square += term * 2 / factorial;
            }
            long blocks = org.winnow.geometry.invariants.Blocks.of(c).count();
            if (blocks > 1) {
                continue;
            }
            assertEquals(square + 4, 2 * KoszulPage.of(c, k).eulerCharacteristic(), c + " O_X" + java.util.Arrays.toString(k));
        }
    }

    @Test
    void structureSheafOfAConnectedThreefoldHasTheTwoCornerSummands() {
        KoszulPage p = KoszulPage.of(Configuration.parse("3:3,0,1/3:0,3,1"), new int[] {0, 0});
        assertEquals(2, p.summands().size());
        assertArrayEquals(new long[] {1, 0, 0, 1}, values(SpectralBounds.analyse(p.e1())));
    }

    static long[] values(Interval[] h) {
        long[] out = new long[h.length];
        for (int t = 0; t < h.length; t++) {
            out[t] = h[t].value();
        }
        return out;
    }
}
