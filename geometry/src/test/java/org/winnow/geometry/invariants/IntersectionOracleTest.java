package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/** The frontier programme against the dense reference (common practice, no source). */
class IntersectionOracleTest {
    private static final int DENSE_LIMIT = 200_000;

    @Test
    void frontierProgrammeEqualsDenseReferenceOnRandomMatrices() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(20261201L));
        IntersectionNumbers reused = new IntersectionNumbers();
        int compared = 0;
        int nonEmpty = 0;
        for (int i = 0; compared < 1200; i++) {
            int dim = 1 + i % 4;
            Configuration c = (i / 4) % 2 == 0 ? gen.calabiYau(dim, 5, 4) : gen.arbitrary(dim, 4, 4, 3);
            if (!denseAffordable(c)) {
                continue;
            }
            Map<List<Integer>, Long> expected = DenseIntersectionNumbers.all(c);
            assertEquals(expected, IntersectionNumbers.all(c), c::toText);
            // A reused workspace must give the same answer as a fresh one.
            reused.compute(c);
            assertEquals(expected, reused.asMap(), c::toText);
            compared++;
            if (!expected.isEmpty()) {
                nonEmpty++;
            }
        }
        assertTrue(nonEmpty > 1000, "too few non-empty cases: " + nonEmpty);
    }

    @Test
    void denseTablesMatchTheEntriesAfterReuse() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(7L));
        IntersectionNumbers in = new IntersectionNumbers();
        for (int i = 0; i < 300; i++) {
            int dim = 3 + i % 2;
            Configuration c = gen.calabiYau(dim, 6, 3);
            in.compute(c);
            Map<List<Integer>, Long> map = in.asMap();
            int m = c.rows();
            for (int r = 0; r < m; r++) {
                for (int s = 0; s < m; s++) {
                    for (int t = 0; t < m; t++) {
                        if (dim == 3) {
                            assertEquals(lookup(map, m, r, s, t), in.triple(r, s, t), c::toText);
                        } else {
                            int u = (r + s + t) % m;
                            assertEquals(lookup(map, m, r, s, t, u), in.quartic(r, s, t, u), c::toText);
                        }
                    }
                }
            }
        }
    }

    @Test
    void negativeDimensionAndZeroColumnGiveNothing() {
        assertTrue(IntersectionNumbers.all(Configuration.parse("1:1,1")).isEmpty());
        assertTrue(IntersectionNumbers.all(Configuration.parse("4:5,0")).isEmpty());
        // A finite set of points: d = 0, I(0) = number of points (product of the degrees).
        assertEquals(Map.of(List.of(0, 0), 6L), IntersectionNumbers.all(Configuration.parse("1:2,0/1:0,3")));
    }

    /** 24 hypersurfaces of degree 10^6 in P^24 meet in 10^144 points: far beyond a long. */
    @Test
    void overflowFailsLoudly() {
        String config = "24:" + String.join(",", java.util.Collections.nCopies(24, "1000000"));
        Configuration c = Configuration.parse(config);
        org.junit.jupiter.api.Assertions.assertThrows(ArithmeticException.class, () -> IntersectionNumbers.all(c));
        org.junit.jupiter.api.Assertions.assertThrows(ArithmeticException.class, () -> new InvariantCalculator().compute(c));
    }

    private static long lookup(Map<List<Integer>, Long> map, int m, int... rows) {
        Integer[] a = new Integer[m];
        java.util.Arrays.fill(a, 0);
        for (int r : rows) {
            a[r]++;
        }
        return map.getOrDefault(List.of(a), 0L);
    }

    private static boolean denseAffordable(Configuration c) {
        long size = 1;
        for (int r = 0; r < c.rows(); r++) {
            size *= c.n(r) + 1;
        }
        return size * c.cols() <= DENSE_LIMIT;
    }
}
