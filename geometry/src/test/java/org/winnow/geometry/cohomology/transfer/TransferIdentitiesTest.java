package org.winnow.geometry.cohomology.transfer;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.Polynomial;
import org.winnow.geometry.invariants.Blocks;
import org.winnow.geometry.invariants.ChernClasses;
import org.winnow.geometry.invariants.IntersectionNumbers;
import org.winnow.geometry.invariants.RandomConfigurations;
import org.winnow.geometry.linalg.ModP;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * Structural identities of the transferred complex on random line bundles (derived: they follow from
 * the perturbation lemma, Serre duality and Riemann-Roch, so they hold for every input).
 */
class TransferIdentitiesTest {
    /** A random bundle on a random configuration, kept small so a test stays well under a second. */
    private record Case(Configuration x, int[] k, DefiningPolynomials f) {
        @Override
        public String toString() {
            return x.toText() + " O_X" + java.util.Arrays.toString(k);
        }
    }

    /**
     * Random bundles with twists in [-3, 3] (higher only) or [-2, 2] (ordinary) on random irreducible configurations. With
     * {@code higherOnly}, only bundles whose {@code d_inf} has a nonzero component of order >= 2
     * (a true higher differential, about one bundle in twenty) are kept, so the identities below are
     * also checked where the spectral sequence does not degenerate at E2.
     */
    private static List<Case> cases(int dim, int count, long seed, boolean higherOnly) {
        SplittableRandom random = new SplittableRandom(seed);
        RandomConfigurations configs = new RandomConfigurations(random);
        List<Case> out = new ArrayList<>();
        int tries = 0;
        while (out.size() < count) {
            assertTrue(++tries < 200 * count, "too few bundles with higher differentials: " + out.size());
            Configuration x = configs.calabiYau(dim, 4, 3);
            if (Blocks.of(x).count() != 1) {
                continue;
            }
            int[] k = new int[x.rows()];
            for (int r = 0; r < k.length; r++) {
                k[r] = higherOnly ? random.nextInt(-3, 4) : random.nextInt(-2, 3);
            }
            BottPage page = BottPage.of(x, k);
            int largest = 0;
            for (int t = page.minDegree(); t <= page.maxDegree(); t++) {
                largest = Math.max(largest, page.dimension(t));
            }
            if (largest > 100) {
                continue;
            }
            Case c = new Case(x, k, DefiningPolynomials.random(x, random.nextLong()));
            if (!higherOnly || hasHigherComponent(TransferredKoszul.of(c.f()).complex(k))) {
                out.add(c);
            }
        }
        return out;
    }

    /** True iff some entry of {@code d_inf} joins summands whose columns differ by two or more. */
    static boolean hasHigherComponent(TransferredComplex complex) {
        BottPage page = complex.page();
        for (int t = page.minDegree(); t < page.maxDegree(); t++) {
            ModPMatrix d = complex.differential(t);
            for (BottPage.Summand s : page.summands(t)) {
                for (BottPage.Summand u : page.summands(t + 1)) {
                    if (s.column() - u.column() < 2) {
                        continue;
                    }
                    for (int a = 0; a < s.basis().size(); a++) {
                        for (int b = 0; b < u.basis().size(); b++) {
                            if (d.get(u.offset() + b, s.offset() + a) != 0) {
                                return true;
                            }
                        }
                    }
                }
            }
        }
        return false;
    }

    private static List<Case> mixed(int dim, long seed) {
        List<Case> out = new ArrayList<>(cases(dim, 15, seed, false));
        out.addAll(cases(dim, 5, seed + 1, true));
        return out;
    }

    @Test
    void differentialSquaresToZero() {
        int nonzero = 0;
        for (Case c : mixed(3, 101)) {
            TransferredComplex complex = TransferredKoszul.of(c.f()).complex(c.k());
            for (int t = complex.page().minDegree() - 1; t <= complex.page().maxDegree(); t++) {
                ModPMatrix first = complex.differential(t);
                ModPMatrix second = complex.differential(t + 1);
                if (first.rows() > 0 && first.cols() > 0 && second.rows() > 0) {
                    assertTrue(second.multiply(first).isZero(), () -> "d_inf o d_inf != 0 for " + c);
                }
                if (!first.isZero()) {
                    nonzero++;
                }
            }
        }
        assertTrue(nonzero >= 10, "the sample should exercise nonzero differentials, got " + nonzero);
    }

    @Test
    void cohomologyLivesInDegreesZeroToDAndMatchesRiemannRoch() {
        IntersectionNumbers numbers = new IntersectionNumbers();
        for (Case c : mixed(3, 202)) {
            TransferredComplex complex = TransferredKoszul.of(c.f()).complex(c.k());
            long alternating = 0;
            for (int t = complex.page().minDegree(); t <= complex.page().maxDegree(); t++) {
                int h = complex.cohomology(t);
                assertTrue(h >= 0, () -> "negative h for " + c);
                if (t < 0 || t > 3) {
                    assertEquals(0, h, "h^" + t + " must vanish for " + c);
                }
                alternating += (t % 2 == 0 ? 1 : -1) * (long) h;
            }
            assertEquals(complex.page().eulerCharacteristic(), alternating, () -> "alternating sum for " + c);
            // Riemann-Roch on a Calabi-Yau three-fold: chi(O_X(D)) = D^3/6 + c2.D/12.
            numbers.compute(c.x());
            long[] c2 = ChernClasses.of(c.x()).c2DotJ();
            long cube = 0;
            long c2d = 0;
            int m = c.x().rows();
            for (int r = 0; r < m; r++) {
                c2d += c2[r] * c.k()[r];
                for (int s = 0; s < m; s++) {
                    for (int u = 0; u < m; u++) {
                        cube += numbers.triple(r, s, u) * c.k()[r] * c.k()[s] * c.k()[u];
                    }
                }
            }
            assertEquals(0, (2 * cube + c2d) % 12, () -> "Riemann-Roch is not integral for " + c);
            assertEquals((2 * cube + c2d) / 12, alternating, () -> "Riemann-Roch for " + c);
        }
    }

    @Test
    void riemannRochOnK3Surfaces() {
        for (Case c : cases(2, 20, 303, false)) {
            int[] h = TransferredKoszul.of(c.f()).cohomology(c.k());
            // chi(O_X(D)) = D^2/2 + 2 on a K3 surface (common practice, Riemann-Roch).
            Map<List<Integer>, Long> numbers = IntersectionNumbers.all(c.x());
            long square = 0;
            for (Map.Entry<List<Integer>, Long> e : numbers.entrySet()) {
                long term = e.getValue();
                long multinomial = 2;
                for (int r = 0; r < c.x().rows(); r++) {
                    int a = e.getKey().get(r);
                    for (int i = 0; i < a; i++) {
                        term *= c.k()[r];
                    }
                    if (a == 2) {
                        multinomial = 1;
                    }
                }
                square += multinomial * term;
            }
            assertEquals(square / 2 + 2, h[0] - h[1] + h[2], () -> "Riemann-Roch for " + c);
        }
    }

    @Test
    void serreDuality() {
        for (Case c : mixed(3, 404)) {
            int m = c.x().rows();
            int[] dual = new int[m];
            for (int r = 0; r < m; r++) {
                dual[r] = c.x().rowSum(r) - c.x().n(r) - 1 - c.k()[r];
            }
            TransferredKoszul tk = TransferredKoszul.of(c.f());
            int[] h = tk.cohomology(c.k());
            int[] hd = tk.cohomology(dual);
            for (int t = 0; t <= 3; t++) {
                assertEquals(h[t], hd[3 - t], "h^" + t + " against its dual for " + c);
            }
        }
    }

    @Test
    void transferredProjectionInvertsTransferredInclusion() {
        for (Case c : mixed(3, 505)) {
            BottPage page = BottPage.of(c.x(), c.k());
            Transfer transfer = new Transfer(c.x(), c.f(), CellLayout.of(c.x(), c.k()));
            for (int t = page.minDegree(); t <= page.maxDegree(); t++) {
                Reach reach = Reach.of(t, page);
                for (BottPage.Summand s : page.summands(t)) {
                    for (int v = 0; v < s.basis().size(); v++) {
                        long[] back = transfer.project(transfer.lift(s, v, reach), page, t);
                        for (int w = 0; w < back.length; w++) {
                            assertEquals(w == s.offset() + v ? 1 : 0, back[w], "Pi_inf iota_inf != 1 for " + c);
                        }
                    }
                }
            }
        }
    }

    @Test
    void transferredMultiplicationIsAChainMap() {
        SplittableRandom random = new SplittableRandom(606);
        int nonzero = 0;
        for (Case c : cases(3, 40, 606, false)) {
            int m = c.x().rows();
            int[] degree = new int[m];
            for (int r = 0; r < m; r++) {
                degree[r] = random.nextInt(2);
            }
            degree[random.nextInt(m)] = 1;
            int[] target = c.k().clone();
            for (int r = 0; r < m; r++) {
                target[r] += degree[r];
            }
            Polynomial g = randomPolynomial(c.x().dims(), degree, random);
            BottPage src = BottPage.of(c.x(), c.k());
            BottPage tgt = BottPage.of(c.x(), target);
            Transfer transfer = new Transfer(c.x(), c.f(), CellLayout.of(c.x(), c.k(), target));
            TransferredComplex srcComplex = new TransferredComplex(src, transfer);
            TransferredComplex tgtComplex = new TransferredComplex(tgt, transfer);
            int lo = Math.min(src.minDegree(), tgt.minDegree());
            int hi = Math.max(src.maxDegree(), tgt.maxDegree());
            for (int t = lo; t < hi; t++) {
                ModPMatrix here = transferredMap(transfer, src, tgt, g, t);
                ModPMatrix there = transferredMap(transfer, src, tgt, g, t + 1);
                ModPMatrix left = tgtComplex.differential(t).multiply(here);
                ModPMatrix right = there.multiply(srcComplex.differential(t));
                assertEquals(left, right, "phi_inf is not a chain map for " + c + " times " + java.util.Arrays.toString(degree));
                if (!here.isZero()) {
                    nonzero++;
                }
            }
        }
        assertTrue(nonzero > 10, "the sample should exercise nonzero maps, got " + nonzero);
    }

    private static ModPMatrix transferredMap(Transfer transfer, BottPage src, BottPage tgt, Polynomial g, int t) {
        ModPMatrix out = new ModPMatrix(tgt.dimension(t), src.dimension(t));
        Reach reach = Reach.of(t, tgt);
        Transfer.PackedPolynomial packed = transfer.pack(g);
        for (BottPage.Summand s : src.summands(t)) {
            for (int v = 0; v < s.basis().size(); v++) {
                long[] image = transfer.project(transfer.multiply(transfer.lift(s, v, reach), packed), tgt, t);
                for (int w = 0; w < image.length; w++) {
                    out.set(w, s.offset() + v, image[w]);
                }
            }
        }
        return out;
    }

    private static Polynomial randomPolynomial(int[] n, int[] degree, SplittableRandom random) {
        int[][] monomials = Polynomial.monomialsOfDegree(n, degree);
        long[] coefficients = new long[monomials.length];
        for (int i = 0; i < coefficients.length; i++) {
            coefficients[i] = ModP.random(random);
        }
        return Polynomial.of(n, degree, monomials, coefficients);
    }

    @Test
    void twoSeedsAgree() {
        for (Case c : mixed(3, 707)) {
            int[] first = TransferredKoszul.of(c.f()).cohomology(c.k());
            int[] second = TransferredKoszul.of(DefiningPolynomials.random(c.x(), c.f().seed() + 1)).cohomology(c.k());
            assertArrayEquals(first, second, () -> "seeds disagree for " + c);
        }
    }
}
