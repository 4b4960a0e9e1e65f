package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.OptionalLong;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/** Closed Calabi-Yau forms against the generic Chern-class route (common practice, no source). */
class ChernClassesTest {
    @Test
    void closedFormsEqualTheGenericRoute() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(99L));
        InvariantCalculator calc = new InvariantCalculator();
        for (int i = 0; i < 400; i++) {
            int dim = 1 + i % 4;
            Configuration c = gen.calabiYau(dim, 5, 4);
            ChernClasses chern = ChernClasses.of(c);
            CheapInvariants inv = calc.compute(c);
            assertEquals(chern.eulerCharacteristic(), inv.chi(), c::toText);
            assertEquals(chern.eulerCharacteristic(), calc.chi(c), c::toText);
            if (dim == 3) {
                assertArrayEquals(chern.c2DotJ(), inv.c2J(), c::toText);
            }
            if (dim == 4) {
                assertEquals(OptionalLong.of(chern.c2Squared()), inv.c2sq(), c::toText);
            }
        }
    }

    @Test
    void firstChernClassVanishesExactlyForCalabiYau() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(3L));
        for (int i = 0; i < 100; i++) {
            Configuration c = gen.calabiYau(2 + i % 3, 4, 3);
            ChernClasses chern = ChernClasses.of(c);
            for (int r = 0; r < c.rows(); r++) {
                int[] a = new int[c.rows()];
                a[r] = 1;
                assertEquals(0, chern.coefficient(a), c::toText);
            }
        }
        // P^2[2], a conic: c1 = (3 - 2) J.
        assertEquals(1, ChernClasses.of(Configuration.parse("2:2")).coefficient(1));
    }

    /** Non-Calabi-Yau classics, from memory: a conic is P^1 (chi 2); a cubic surface has chi 9. */
    @Test
    void nonCalabiYauClassics() {
        InvariantCalculator calc = new InvariantCalculator();
        assertEquals(2, calc.compute(Configuration.parse("2:2")).chi());
        assertEquals(9, calc.compute(Configuration.parse("3:3")).chi());
        // P^1 x P^1 as a quadric in P^3: chi 4; P^3 itself as P^4[1]: chi 4.
        assertEquals(4, calc.compute(Configuration.parse("3:2")).chi());
        assertEquals(4, calc.compute(Configuration.parse("4:1")).chi());
        // A plane curve of degree e has chi = -e(e - 3): e = 4 gives -4.
        assertEquals(-4, calc.chi(Configuration.parse("2:4")));
    }

    @Test
    void emptyVarietyIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> ChernClasses.of(Configuration.parse("1:1,1")));
        assertThrows(IllegalArgumentException.class,
                () -> new InvariantCalculator().compute(Configuration.parse("1:2,2")));
    }
}
