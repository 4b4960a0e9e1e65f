package org.winnow.geometry.hodge;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.invariants.RandomConfigurations;

class HodgeEnginePropertyTest {
    private static boolean contains(Interval outer, Interval inner) {
        return outer.lo() <= inner.lo() && inner.hi() <= outer.hi();
    }

    private static void assertNoFailedCheck(HodgeResult r) {
        assertFalse(r.reason().startsWith("check failed") || r.reason().startsWith("inconsistent"),
                r.input() + ": " + r.reason());
    }

    @Test
    void threefoldsSatisfyTheEulerIdentityAndTheExactValuesLieInsideTheBounds() {
        // Common practice, no source: 2(h11 - h21) = chi for every Calabi-Yau three-fold.
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(51));
        HodgeEngine full = HodgeEngine.standard();
        HodgeEngine noBackend = new HodgeEngine(null);
        int exact = 0;
        int singleBlock = 0;
        for (int trial = 0; trial < 60; trial++) {
            Configuration c = gen.calabiYau(3, 5, 3);
            HodgeResult r = full.compute(c);
            assertNoFailedCheck(r);
            if (r.status() == Status.REFUSED || r.isProduct()) {
                // Products have smaller holonomy: 2(h11 - h21) = chi need not hold (ProductHodgeTest covers them).
                continue;
            }
            singleBlock++;
            assertEquals(Status.EXACT, r.status(), c + ": " + r.reason());
            exact++;
            assertEquals(r.chi().orElseThrow(), 2 * (r.h11().value() - r.h21().value()), c.toText());
            assertTrue(r.h11().value() >= 1, "a projective three-fold has h11 >= 1: " + c);
            HodgeResult b = noBackend.compute(c);
            assertNoFailedCheck(b);
            assertTrue(contains(b.h11(), r.h11()) && contains(b.h21(), r.h21()),
                    c + ": exact " + r.h11() + "," + r.h21() + " outside " + b.h11() + "," + b.h21());
        }
        assertTrue(singleBlock > 20, "too few irreducible samples: " + singleBlock);
        assertEquals(singleBlock, exact);
    }

    @Test
    void fourfoldsSatisfyTheIndexIdentities() {
        // Common practice, derived from the index theorem: chi = 48 + 6(h11 - h21 + h31) and
        // h22 = 44 + 4 h11 - 2 h21 + 4 h31 for a four-fold with holonomy SU(4).
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(52));
        HodgeEngine engine = HodgeEngine.standard();
        int exact = 0;
        for (int trial = 0; trial < 25; trial++) {
            Configuration c = gen.calabiYau(4, 4, 3);
            HodgeResult r = engine.compute(c);
            assertNoFailedCheck(r);
            if (r.status() != Status.EXACT || r.isProduct()) {
                // The identities need holonomy SU(4); products are checked in ProductHodgeTest.
                continue;
            }
            exact++;
            long h11 = r.h11().value();
            long h21 = r.h21().value();
            long h31 = r.h31().value();
            assertEquals(r.chi().orElseThrow(), 48 + 6 * (h11 - h21 + h31), c.toText());
            assertEquals(44 + 4 * h11 - 2 * h21 + 4 * h31, r.h22().value(), c.toText());
        }
        assertTrue(exact > 5, "too few exact four-folds: " + exact);
    }

    @Test
    void k3SurfacesAlwaysGiveTwenty() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(53));
        HodgeEngine engine = HodgeEngine.standard();
        int seen = 0;
        for (int trial = 0; trial < 30; trial++) {
            HodgeResult r = engine.compute(gen.calabiYau(2, 4, 3));
            assertNoFailedCheck(r);
            if (r.status() == Status.EXACT && !r.isProduct()) {
                seen++;
                assertEquals(20, r.h11().value(), r.input().toText());
            }
        }
        assertTrue(seen > 5, "too few K3 samples: " + seen);
    }

    @Test
    void resultsAreDeterministicAndIndependentOfHyperplaneColumns() {
        // A hyperplane column describes the same variety in a smaller ambient space (rule R1).
        HodgeEngine engine = HodgeEngine.standard();
        HodgeResult plain = engine.compute(Configuration.parse("3:3,0,1/3:0,3,1"));
        HodgeResult padded = engine.compute(Configuration.parse("4:3,0,1,1/3:0,3,1,0"));
        assertEquals(plain.h11(), padded.h11());
        assertEquals(plain.h21(), padded.h21());
        assertEquals(plain.h11(), engine.compute(Configuration.parse("3:3,0,1/3:0,3,1")).h11());
    }
}
