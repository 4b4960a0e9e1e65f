package org.winnow.geometry.cohomology;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.KoszulPage.Position;
import org.winnow.geometry.invariants.RandomConfigurations;

class KoszulD1Test {
    @Test
    void d1SquaresToZeroAndE2StaysInsideTheE1Bounds() {
        SplittableRandom rng = new SplittableRandom(41);
        RandomConfigurations gen = new RandomConfigurations(rng);
        int nonzeroComposites = 0;
        int checked = 0;
        for (int trial = 0; trial < 80; trial++) {
            Configuration c = gen.calabiYau(3, 4, 3);
            int[] k = new int[c.rows()];
            for (int r = 0; r < k.length; r++) {
                k[r] = rng.nextInt(-2, 4);
            }
            KoszulPage page = KoszulPage.of(c, k);
            if (page.summands().stream().mapToLong(KoszulPage.Summand::dim).sum() > 1500) {
                continue;
            }
            KoszulD1 d1 = KoszulD1.of(page, DefiningPolynomials.random(c, trial));
            for (Position x : page.positions()) {
                Position y = new Position(x.p() - 1, x.q());
                Position z = new Position(x.p() - 2, x.q());
                if (page.dimension(y) == 0 || page.dimension(z) == 0) {
                    continue;
                }
                checked++;
                assertTrue(d1.matrix(y).multiply(d1.matrix(x)).isZero(), "d1 o d1 at " + x + " for " + c);
                if (!d1.matrix(x).isZero() && !d1.matrix(y).isZero()) {
                    nonzeroComposites++;
                }
            }
            int[] dual = new int[k.length];
            for (int r = 0; r < k.length; r++) {
                dual[r] = -k[r];
            }
            KoszulPage dualPage = KoszulPage.of(c, dual);
            KoszulD1 dualD1 = KoszulD1.of(dualPage, DefiningPolynomials.random(c, trial));
            try {
                Interval[] e1 = SpectralBounds.analyse(page.e1(), dualPage.e1());
                Interval[] e2 = SpectralBounds.analyse(d1.e2(), dualD1.e2());
                for (int t = 0; t < e1.length; t++) {
                    assertTrue(e1[t].lo() <= e2[t].lo() && e2[t].hi() <= e1[t].hi(),
                            "E2 bounds " + Arrays.toString(e2) + " outside E1 bounds " + Arrays.toString(e1));
                }
            } catch (InconsistentPageException e) {
                // products with empty or lower-dimensional pieces; not what this test is about
            }
        }
        assertTrue(checked > 10 && nonzeroComposites > 5, "checked " + checked + ", nonzero pairs " + nonzeroComposites);
    }
}
