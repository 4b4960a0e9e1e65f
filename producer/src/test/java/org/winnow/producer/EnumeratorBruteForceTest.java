package org.winnow.producer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.TreeMap;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The orderly generator against {@link BruteForceSpace}, for every bound combination with at most
 * 4 rows and 6 columns, every lower row limit and caps on n and on the entries (all flags
 * compared), and every rule set with and without products on the widest bound.
 */
class EnumeratorBruteForceTest {
    private static final int ROWS = 4;
    private static final int COLS = 6;

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 3, 4})
    void matchesTheBruteForceOnEverySmallBound(int dim) {
        TreeMap<String, BruteForceSpace.Entry> space = BruteForceSpace.generate(dim, ROWS, COLS);
        assertTrue(space.size() > 5, "the oracle space is not trivial: " + space.size());
        Enumerator enumerator = new Enumerator();
        List<Bounds> bounds = new ArrayList<>();
        for (int maxRows = 1; maxRows <= ROWS; maxRows++) {
            for (int maxCols = 1; maxCols <= COLS; maxCols++) {
                bounds.add(new Bounds(dim, 1, maxRows, maxCols, 2 * dim + 1, 2 * dim + 2));
            }
        }
        for (int minRows = 2; minRows <= ROWS; minRows++) {
            bounds.add(new Bounds(dim, minRows, ROWS, COLS, 2 * dim + 1, 2 * dim + 2));
        }
        for (int maxN = 1; maxN <= 3; maxN++) {
            for (int maxEntry = 1; maxEntry <= 3; maxEntry++) {
                bounds.add(new Bounds(dim, 1, ROWS, COLS, maxN, maxEntry));
            }
        }
        int compared = 0;
        for (Bounds b : bounds) {
            // the lines carry the flags, so one base run per bound checks every flag of every matrix
            compare(enumerator, space, b, ExclusionSet.BASE);
            compared++;
        }
        Bounds widest = new Bounds(dim, 1, ROWS, COLS, 2 * dim + 1, 2 * dim + 2);
        for (ExclusionSet rules : ExclusionSet.named()) {
            compare(enumerator, space, widest, rules);
            compare(enumerator, space, widest, rules.withoutProducts());
            compared += 2;
        }
        assertTrue(compared > 30);
    }

    private static void compare(Enumerator enumerator, TreeMap<String, BruteForceSpace.Entry> space, Bounds b,
            ExclusionSet r) {
        List<String> actual = new ArrayList<>();
        enumerator.run(b, r, ShardSpec.ALL, e -> actual.add(e.toLine()));
        actual.sort(null);
        assertEquals(expected(space, b, r), actual, b + " " + r.name());
    }

    private static List<String> expected(TreeMap<String, BruteForceSpace.Entry> space, Bounds b, ExclusionSet r) {
        List<String> out = new ArrayList<>();
        for (BruteForceSpace.Entry e : space.values()) {
            if (e.rows() >= b.minRows() && e.rows() <= b.maxRows() && e.cols() <= b.maxCols()
                    && e.maxN() <= b.maxN() && e.maxEntry() <= b.maxEntry() && !r.drops(e.flags())) {
                out.add(new EnumeratedMatrix(0, null, e.text(), e.flags()).toLine());
            }
        }
        out.sort(null);
        return out;
    }
}
