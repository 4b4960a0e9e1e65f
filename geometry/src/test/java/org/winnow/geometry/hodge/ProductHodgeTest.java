package org.winnow.geometry.hodge;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.ChernClasses;
import org.winnow.geometry.invariants.RandomConfigurations;

/** Block-diagonal configurations: each block by the engine, the diamond by the Kunneth formula. */
class ProductHodgeTest {
    private final HodgeEngine engine = HodgeEngine.standard();

    private HodgeResult run(String text) {
        return engine.compute(Configuration.parse(text));
    }

    private static void assertProduct(HodgeResult r, int factors) {
        assertEquals(Status.EXACT, r.status(), r.input() + ": " + r.reason());
        assertEquals(Method.PRODUCT, r.method());
        assertTrue(r.isProduct());
        assertEquals(factors, r.factors().size(), r.factors().toString());
        // chi from the generic Chern class route, independent of the line bundle cohomology behind the diamond.
        assertEquals(ChernClasses.of(r.input()).eulerCharacteristic(), r.diamond().euler(), r.input().toText());
        assertEquals(r.chi().orElseThrow(), r.diamond().euler());
    }

    @Test
    void k3FromTheQuarticHasTheTextbookDiamond() {
        // [T] textbook, from memory: the quartic surface in P^3 is a K3 surface, h11 = 20, chi = 24.
        HodgeResult r = run("3:4");
        assertEquals(Status.EXACT, r.status());
        assertFalse(r.isProduct());
        assertEquals(HodgeDiamond.k3(), r.diamond());
        assertEquals(24, r.diamond().euler());
    }

    @Test
    void k3TimesK3() {
        // Common practice, no source: chi is multiplicative, 24 * 24 = 576 (also in our check-value table as the
        // block-diagonal negative test, int c2^2 = 1152 there).
        HodgeResult r = run("3:4,0/3:0,4");
        assertProduct(r, 2);
        assertEquals(576, r.chi().orElseThrow());
        assertEquals(Kunneth.product(HodgeDiamond.k3(), HodgeDiamond.k3()), r.diamond());
        assertEquals(40, r.h11().value());
        assertEquals(0, r.h21().value());
        assertEquals(40, r.h31().value());
        assertEquals(404, r.h22().value());
        // The identity chi = 48 + 6(h11 - h21 + h31) of full holonomy fails, as it must for a product.
        assertTrue(48 + 6 * (40 - 0 + 40) != 576);
    }

    @Test
    void ellipticCurveTimesK3() {
        // Common practice, no source: chi = 0 * 24 = 0.
        HodgeResult r = run("2:3,0/3:0,4");
        assertProduct(r, 2);
        assertEquals(3, r.dim());
        assertEquals(0, r.chi().orElseThrow());
        assertEquals(Kunneth.product(HodgeDiamond.ellipticCurve(), HodgeDiamond.k3()), r.diamond());
        assertEquals(21, r.h11().value());
        assertEquals(21, r.h21().value());
        assertEquals(1, r.diamond().h(1, 0));
    }

    @Test
    void ellipticCurveTimesThreefoldsUsesTheEnginesThreefold() {
        for (String[] pair : new String[][] {{"2:3,0/4:0,5", "4:5"}, {"2:3,0,0/2:0,3,0/2:0,0,3", "2:3/2:3"},
                {"1:2,0/1:2,0/1:0,2/3:0,4", "1:2/3:4"}}) {
            HodgeResult p = run(pair[0]);
            HodgeResult y = run(pair[1]);
            assertEquals(Status.EXACT, y.status(), pair[1]);
            if (p.dim() == 4) {
                assertProduct(p, 2);
                assertEquals(Kunneth.product(HodgeDiamond.ellipticCurve(), y.diamond()), p.diamond(), pair[0]);
                // Derived in docs/hodge-coverage.md (Products).
                assertEquals(1 + y.h11().value(), p.h11().value());
                assertEquals(y.h11().value() + y.h21().value(), p.h21().value());
                assertEquals(1 + y.h21().value(), p.h31().value());
                assertEquals(2 * y.h11().value() + 2 * y.h21().value(), p.h22().value());
                assertEquals(0, p.chi().orElseThrow());
            } else {
                // Three elliptic curves: h^{p,q} = C(3,p) C(3,q), so h11 = h21 = 9 (common practice, no source).
                assertProduct(p, 3);
                assertEquals(9, p.h11().value());
                assertEquals(9, p.h21().value());
            }
        }
    }

    @Test
    void ellipticCurveTimesTheQuintic() {
        // [T] from memory: the quintic has (h11, h21) = (1, 101); T2 x quintic has h11 = 2, h21 = h31 = 102.
        HodgeResult r = run("2:3,0/4:0,5");
        assertProduct(r, 2);
        assertEquals(List.of("2:3", "4:5"), r.factors().stream().map(Configuration::toText).toList());
        assertEquals(2, r.h11().value());
        assertEquals(102, r.h21().value());
        assertEquals(102, r.h31().value());
        assertEquals(204, r.h22().value());
    }

    @Test
    void aBlockOfDimensionZeroIsRefusedWithAReason() {
        // A P^1 row with a quadric column: two points times a K3 surface, not connected.
        HodgeResult r = run("1:2,0/3:0,4");
        assertEquals(Status.REFUSED, r.status());
        assertNull(r.diamond());
        assertTrue(r.reason().contains("dimension 0"), r.reason());
    }

    /** The block-diagonal matrix of {@code a} and {@code b}: the product of the two varieties. */
    private static Configuration blockDiagonal(Configuration a, Configuration b) {
        int m = a.rows() + b.rows();
        int k = a.cols() + b.cols();
        int[] n = new int[m];
        int[][] q = new int[m][k];
        for (int r = 0; r < a.rows(); r++) {
            n[r] = a.n(r);
            for (int j = 0; j < a.cols(); j++) {
                q[r][j] = a.q(r, j);
            }
        }
        for (int r = 0; r < b.rows(); r++) {
            n[a.rows() + r] = b.n(r);
            for (int j = 0; j < b.cols(); j++) {
                q[a.rows() + r][a.cols() + j] = b.q(r, j);
            }
        }
        return Configuration.of(n, q);
    }

    @Test
    void everyRandomProductIsExactAndEqualsTheKunnethProductOfItsFactors() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(1503));
        int products = 0;
        for (int trial = 0; trial < 60; trial++) {
            int da = 1 + trial % 3;
            int db = 1 + (trial / 3) % (4 - da);
            Configuration a = gen.calabiYau(da, 3, 3);
            Configuration b = gen.calabiYau(db, 3, 3);
            HodgeResult ra = engine.compute(blockDiagonal(a, Configuration.parse("1:2/1:2")).canonical());
            HodgeResult rb = engine.compute(blockDiagonal(b, Configuration.parse("1:2/1:2")).canonical());
            HodgeResult r = engine.compute(blockDiagonal(a, b));
            if (r.status() == Status.REFUSED && (r.reason().contains("empty") || r.reason().contains("dimension 0"))) {
                continue;
            }
            products++;
            assertProduct(r, r.factors().size());
            // Common practice, no source: chi(a x b) = chi(a) chi(b). And (a x T2) x (b x T2), each computed by the
            // engine as a product of its own, must equal (a x b) x T2 x T2.
            long chiA = ChernClasses.of(a).eulerCharacteristic();
            long chiB = ChernClasses.of(b).eulerCharacteristic();
            assertEquals(chiA * chiB, r.diamond().euler(), a.toText() + " x " + b.toText());
            if (ra.status() == Status.EXACT && rb.status() == Status.EXACT) {
                HodgeDiamond t2 = HodgeDiamond.ellipticCurve();
                assertEquals(Kunneth.product(ra.diamond(), rb.diamond()),
                        Kunneth.product(Kunneth.product(r.diamond(), t2), t2), a.toText() + " x " + b.toText());
            }
            long[][] h = r.diamond().numbers();
            assertTrue(h[1][0] + h[2][0] > 0, "a product of Calabi-Yau factors has some h^{p,0} != 0 for 0 < p < n: "
                    + r.input().toText() + " " + r.diamond());
        }
        assertTrue(products >= 30, "too few products: " + products);
    }

    @Test
    void aRememberedBlockGivesTheSameProductAsAFreshEngine() {
        // Products sharing blocks, some blocks met twice: one engine remembers the blocks, the oracle is a fresh
        // engine for every product.
        List<String> products = List.of("3:4,0/3:0,4", "2:3,0/3:0,4", "3:4,0/3:0,4", "2:3,0/4:0,5", "2:3,0/3:0,4",
                "2:3,0,0/2:0,3,0/3:0,0,4", "2:3,0/4:0,5");
        HodgeEngine remembering = HodgeEngine.standard();
        for (String text : products) {
            HodgeResult again = remembering.compute(Configuration.parse(text));
            HodgeResult fresh = HodgeEngine.standard().compute(Configuration.parse(text));
            assertEquals(fresh.status(), again.status(), text);
            assertEquals(fresh.diamond(), again.diamond(), text);
            assertEquals(fresh.factors(), again.factors(), text);
            assertTrue(again.isProduct(), text);
        }
    }
}
