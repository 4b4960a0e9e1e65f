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

    /**
     * Single-row columns are applied before the programme runs (start state {@code c = t}, weight the
     * product of their degrees): against the dense reference on random matrices with many of them,
     * including rows that get more such columns than their dimension (empty result). Common practice,
     * no source.
     */
    @Test
    void singleRowColumnsGiveTheDenseAnswer() {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(4L));
        IntersectionNumbers reused = new IntersectionNumbers();
        int withSingle = 0;
        for (int i = 0; i < 1500; i++) {
            Configuration c = i % 2 == 0 ? gen.calabiYau(i % 5, 4, 3) : gen.arbitrary(i % 5, 3, 3, 3);
            if (!denseAffordable(c)) {
                continue;
            }
            reused.compute(c);
            assertEquals(DenseIntersectionNumbers.all(c), reused.asMap(), c::toText);
            withSingle += hasSingleRowColumn(c) ? 1 : 0;
        }
        assertTrue(withSingle > 400, "too few matrices with a single-row column: " + withSingle);
        // Two single-row columns on a P^1 force J_1^2 = 0: no points.
        assertTrue(IntersectionNumbers.all(Configuration.parse("1:2,2,1/2:0,0,3")).isEmpty());
        assertTrue(DenseIntersectionNumbers.all(Configuration.parse("1:2,2,1/2:0,0,3")).isEmpty());
        // Only single-row columns: 6 x 5 x 7 points.
        assertEquals(Map.of(List.of(0, 0), 210L), IntersectionNumbers.all(Configuration.parse("1:6,0,0/2:0,5,7")));
    }

    private static boolean hasSingleRowColumn(Configuration c) {
        for (int j = 0; j < c.cols(); j++) {
            int nonzero = 0;
            for (int r = 0; r < c.rows(); r++) {
                nonzero += c.q(r, j) > 0 ? 1 : 0;
            }
            if (nonzero == 1) {
                return true;
            }
        }
        return false;
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
