package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.OptionalLong;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/**
 * The closed Calabi-Yau forms (the pair matrix of p_2, the pairing formula of p_2^2, masked column
 * moments, the fused four-fold pass) against the generic Chern-class route, which expands
 * {@code prod (1+J_r)^{n_r+1} / prod (1+D_j)} as polynomials and shares none of that code, on
 * thousands of seeded random Calabi-Yau matrices of dimension 1..4 through one reused calculator
 * (so stale workspace state of an earlier shape would show). Common practice, no source.
 */
class ClosedFormsOracleTest {
    @Test
    void closedFormsEqualTheGenericRouteOnThousandsOfMatrices() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(20261202L));
        InvariantCalculator calc = new InvariantCalculator();
        long[] c2J = new long[Configuration.MAX_ROWS];
        int[] perDim = new int[5];
        int multiRowFourfolds = 0;
        for (int i = 0; i < 4000; i++) {
            int dim = 1 + i % 4;
            // Mostly small rows (many shared columns, repeated rows in the monomials), some wide.
            Configuration c = i % 8 < 6 ? gen.calabiYau(dim, 7, 3) : gen.calabiYau(dim, 4, 6);
            ChernClasses chern = ChernClasses.of(c);
            CheapInvariants inv = calc.compute(c);
            long chi = chern.eulerCharacteristic();
            assertEquals(dim, inv.dim(), c::toText);
            assertEquals(chi, inv.chi(), c::toText);
            assertEquals(chi, calc.chi(c), c::toText);
            assertEquals(degree(c), inv.degree(), c::toText);
            assertEquals(Blocks.of(Reduction.reduce(c)).count(), inv.blocks(), c::toText);
            if (dim == 3) {
                assertArrayEquals(chern.c2DotJ(), inv.c2J(), c::toText);
                assertEquals(chi, calc.threefold(c, c2J), c::toText);
                assertArrayEquals(chern.c2DotJ(), java.util.Arrays.copyOf(c2J, c.rows()), c::toText);
            } else {
                assertEquals(0, inv.c2J().length, c::toText);
            }
            if (dim == 4) {
                assertEquals(OptionalLong.of(chern.c2Squared()), inv.c2sq(), c::toText);
                multiRowFourfolds += c.rows() >= 3 ? 1 : 0;
            } else {
                assertTrue(inv.c2sq().isEmpty(), c::toText);
            }
            perDim[dim]++;
        }
        assertEquals(1000, perDim[4]);
        assertTrue(multiRowFourfolds > 300, "the sample should hold many four-folds of three or more rows: " + multiRowFourfolds);
    }

    /** {@code int_X (sum J_r)^d} straight from the map of intersection numbers: multinomial per entry. */
    private static long degree(Configuration c) {
        long sum = 0;
        for (Map.Entry<List<Integer>, Long> e : IntersectionNumbers.all(c).entrySet()) {
            long multinomial = ExactMath.factorial(c.dimension());
            for (int a : e.getKey()) {
                multinomial /= ExactMath.factorial(a);
            }
            sum += multinomial * e.getValue();
        }
        return sum;
    }
}
