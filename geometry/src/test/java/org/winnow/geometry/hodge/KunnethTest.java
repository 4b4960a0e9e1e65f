package org.winnow.geometry.hodge;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class KunnethTest {
    /** A random diamond with the symmetries of a compact Kahler manifold (entries 0..30). */
    private static HodgeDiamond random(SplittableRandom rnd, int n) {
        long[][] h = new long[n + 1][n + 1];
        for (int p = 0; p <= n; p++) {
            for (int q = 0; q <= n; q++) {
                h[p][q] = rnd.nextInt(31);
            }
        }
        // Give each orbit {(p,q), (q,p), (n-p,n-q), (n-q,n-p)} the value of its first member in row-major order.
        for (int p = 0; p <= n; p++) {
            for (int q = 0; q <= n; q++) {
                long v = h[p][q];
                h[q][p] = v;
                h[n - p][n - q] = v;
                h[n - q][n - p] = v;
            }
        }
        return new HodgeDiamond(n, h);
    }

    /** The oracle: for every output (p, q), the double sum over (a, b) of the Kunneth formula as written. */
    private static long[][] directDoubleSum(HodgeDiamond x, HodgeDiamond y) {
        int n = x.dimension() + y.dimension();
        long[][] h = new long[n + 1][n + 1];
        for (int p = 0; p <= n; p++) {
            for (int q = 0; q <= n; q++) {
                long s = 0;
                for (int a = 0; a <= p; a++) {
                    for (int b = 0; b <= q; b++) {
                        s += x.h(a, b) * y.h(p - a, q - b);
                    }
                }
                h[p][q] = s;
            }
        }
        return h;
    }

    @Test
    void productEqualsTheDirectDoubleSumOnRandomDiamonds() {
        SplittableRandom rnd = new SplittableRandom(1501);
        for (int trial = 0; trial < 500; trial++) {
            HodgeDiamond x = random(rnd, rnd.nextInt(4));
            HodgeDiamond y = random(rnd, rnd.nextInt(4));
            HodgeDiamond p = Kunneth.product(x, y);
            assertEquals(new HodgeDiamond(x.dimension() + y.dimension(), directDoubleSum(x, y)), p, x + " * " + y);
        }
    }

    @Test
    void eulerCharacteristicIsMultiplicativeAndTheProductCommutesAndAssociates() {
        // Common practice, no source: chi(X x Y) = chi(X) chi(Y); the product of spaces is commutative and
        // associative up to isomorphism, so the diamonds must be too.
        SplittableRandom rnd = new SplittableRandom(1502);
        for (int trial = 0; trial < 300; trial++) {
            HodgeDiamond x = random(rnd, rnd.nextInt(4));
            HodgeDiamond y = random(rnd, rnd.nextInt(4));
            HodgeDiamond z = random(rnd, rnd.nextInt(3));
            assertEquals(x.euler() * y.euler(), Kunneth.product(x, y).euler());
            assertEquals(Kunneth.product(x, y), Kunneth.product(y, x));
            assertEquals(Kunneth.product(Kunneth.product(x, y), z), Kunneth.product(x, Kunneth.product(y, z)));
            assertEquals(x, Kunneth.product(x, HodgeDiamond.point()));
        }
    }

    @Test
    void k3TimesK3() {
        // Derived in docs/hodge-coverage.md (Products); chi = 24 * 24 = 576 (common practice, no source).
        HodgeDiamond p = Kunneth.product(HodgeDiamond.k3(), HodgeDiamond.k3());
        assertEquals(576, p.euler());
        assertEquals(1, p.h(0, 0));
        assertEquals(0, p.h(1, 0));
        assertEquals(2, p.h(2, 0));
        assertEquals(0, p.h(3, 0));
        assertEquals(1, p.h(4, 0));
        assertEquals(40, p.h(1, 1));
        assertEquals(0, p.h(2, 1));
        assertEquals(40, p.h(3, 1));
        assertEquals(404, p.h(2, 2));
    }

    @Test
    void ellipticCurveTimesK3AndTimesAThreefold() {
        // Derived in docs/hodge-coverage.md (Products); chi = 0 * 24 = 0 and 0 * chi(Y) = 0 (common practice).
        HodgeDiamond t2k3 = Kunneth.product(HodgeDiamond.ellipticCurve(), HodgeDiamond.k3());
        assertEquals(0, t2k3.euler());
        assertEquals(3, t2k3.dimension());
        assertEquals(1, t2k3.h(1, 0));
        assertEquals(1, t2k3.h(2, 0));
        assertEquals(1, t2k3.h(3, 0));
        assertEquals(21, t2k3.h(1, 1));
        assertEquals(21, t2k3.h(2, 1));
        // T2 x Y with (h11, h21)(Y) = (1, 101): h11 = 1 + 1, h21 = 1 + 101, h31 = 1 + 101, h22 = 2 * 1 + 2 * 101.
        HodgeDiamond t2y = Kunneth.product(HodgeDiamond.ellipticCurve(), HodgeDiamond.calabiYau3(1, 101));
        assertEquals(0, t2y.euler());
        assertEquals(2, t2y.h(1, 1));
        assertEquals(102, t2y.h(2, 1));
        assertEquals(102, t2y.h(3, 1));
        assertEquals(204, t2y.h(2, 2));
        assertEquals(1, t2y.h(1, 0));
        assertEquals(1, t2y.h(4, 0));
    }

    @Test
    void threeEllipticCurvesGiveBinomialNumbers() {
        // h^{p,q}(E^3) = C(3, p) C(3, q) (common practice, no source: the exterior algebra of H^{1,0} + H^{0,1}).
        List<HodgeDiamond> e = new ArrayList<>();
        for (int i = 0; i < 3; i++) {
            e.add(HodgeDiamond.ellipticCurve());
        }
        HodgeDiamond p = Kunneth.product(e);
        long[] c = {1, 3, 3, 1};
        for (int a = 0; a <= 3; a++) {
            for (int b = 0; b <= 3; b++) {
                assertEquals(c[a] * c[b], p.h(a, b), "h^{" + a + "," + b + "}");
            }
        }
        assertEquals(0, p.euler());
    }

    @Test
    void calabiYauFactorsFromTheirHodgeNumbers() {
        assertEquals(HodgeDiamond.ellipticCurve(), Kunneth.calabiYauFactor(1));
        assertEquals(HodgeDiamond.k3(), Kunneth.calabiYauFactor(2, 20));
        assertEquals(24, Kunneth.calabiYauFactor(2, 20).euler());
        // Three-folds: chi = 2(h11 - h21), the quintic's -200 ([T] from memory, as in the check-value table).
        assertEquals(-200, Kunneth.calabiYauFactor(3, 1, 101).euler());
        // Four-folds: the sextic (1, 0, 426, 1752) has chi 2610 ([S3] arXiv:1303.1832, JHEP 2013).
        assertEquals(2610, Kunneth.calabiYauFactor(4, 1, 0, 426, 1752).euler());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Kunneth.calabiYauFactor(2, 19));
        assertEquals("a K3 surface has h11 = 20, got 19", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Kunneth.calabiYauFactor(3, 1));
        assertThrows(IllegalArgumentException.class, () -> Kunneth.calabiYauFactor(5));
    }

    @Test
    void diamondsRefuseBrokenSymmetry() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new HodgeDiamond(1, new long[][] {{1, 2}, {1, 1}}));
        assertEquals("h^{0,1} = 2 but h^{1,0} = 1 (complex conjugation)", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> new HodgeDiamond(1, new long[][] {{1, 0}, {0, 2}}));
        assertThrows(IllegalArgumentException.class, () -> new HodgeDiamond(1, new long[][] {{1, 0}}));
        long[][] h = {{1, 1}, {1, 1}};
        HodgeDiamond d = new HodgeDiamond(1, h);
        h[0][0] = 7;
        assertEquals(1, d.h(0, 0), "the diamond copies its input");
        d.numbers()[0][0] = 7;
        assertEquals(1, d.h(0, 0), "and its output");
    }
}
