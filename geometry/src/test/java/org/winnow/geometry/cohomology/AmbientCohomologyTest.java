package org.winnow.geometry.cohomology;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.math.BigInteger;
import org.junit.jupiter.api.Test;

class AmbientCohomologyTest {
    @Test
    void bottFormulaOnOneFactor() {
        // h^0(P^4, O(5)) = C(9,4) = 126 (textbook Bott formula, from memory).
        AmbientCohomology h = AmbientCohomology.of(new int[] {4}, new int[] {5});
        assertEquals(0, h.degree());
        assertEquals(126, h.dimensionExact());
        assertEquals(0, h.bottMask());
        // Serre duality on P^n: h^n(O(k)) = h^0(O(-k-n-1)).
        for (int n = 1; n <= 5; n++) {
            for (int k = -12; k <= -n - 1; k++) {
                AmbientCohomology top = AmbientCohomology.of(new int[] {n}, new int[] {k});
                AmbientCohomology dual = AmbientCohomology.of(new int[] {n}, new int[] {-k - n - 1});
                assertEquals(n, top.degree());
                assertEquals(dual.dimension(), top.dimension());
            }
            for (int k = -n; k <= -1; k++) {
                assertTrue(AmbientCohomology.of(new int[] {n}, new int[] {k}).isZero());
            }
        }
    }

    @Test
    void kunnethMultipliesAndAddsDegrees() {
        // NF1 example of the design notes: H^3(P^3 x P^3, O(2,-4)) = Sym^2 (x) <y^-1>, dimension 10.
        AmbientCohomology h = AmbientCohomology.of(new int[] {3, 3}, new int[] {2, -4});
        assertEquals(3, h.degree());
        assertEquals(10, h.dimensionExact());
        assertEquals(0b10, h.bottMask());
        assertTrue(AmbientCohomology.of(new int[] {3, 3}, new int[] {2, -2}).isZero());
        AmbientCohomology both = AmbientCohomology.of(new int[] {1, 2}, new int[] {-3, -4});
        assertEquals(3, both.degree());
        assertEquals(2 * 3, both.dimensionExact());
        assertEquals(0b11, both.bottMask());
    }

    @Test
    void dimensionsBeyondLongAreExact() {
        AmbientCohomology h = AmbientCohomology.of(new int[] {20, 20, 20}, new int[] {200, 200, 200});
        BigInteger one = AmbientCohomology.binomial(220, 20);
        assertEquals(one.pow(3), h.dimension());
        assertTrue(h.dimension().bitLength() > 63);
    }
}
