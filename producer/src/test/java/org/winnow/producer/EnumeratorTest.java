package org.winnow.producer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.canonical.CanonicalForm;

class EnumeratorTest {
    private final Enumerator enumerator = new Enumerator();

    @Test
    void exactlyFiveThreeFoldsHaveOneRow() {
        // "Complete Intersection Calabi-Yau Manifolds", Nucl. Phys. B298 (1988) 493: the one-row three-folds
        assertEquals(List.of("4:5", "5:3,3", "5:4,2", "6:3,2,2", "7:2,2,2,2"), oneRow(3));
    }

    @Test
    void exactlySevenFourFoldsHaveOneRow() {
        // "All Complete Intersection Calabi-Yau Four-Folds", arXiv:1303.1832, JHEP (2013)
        assertEquals(List.of("5:6", "6:4,3", "6:5,2", "7:3,3,2", "7:4,2,2", "8:3,2,2,2", "9:2,2,2,2,2"), oneRow(4));
    }

    private List<String> oneRow(int dim) {
        List<String> out = new ArrayList<>();
        for (ExclusionSet r : ExclusionSet.named()) {
            List<String> lines = new ArrayList<>();
            enumerator.run(Bounds.complete(dim).withRows(1, 1), r, ShardSpec.ALL, e -> lines.add(e.text()));
            lines.sort(null);
            if (out.isEmpty()) {
                out.addAll(lines);
            }
            assertEquals(out, lines, "one-row matrices carry no identity flag, so every rule set keeps them");
        }
        return out;
    }

    @Test
    void outputIsCanonicalDistinctAndDeterministic() {
        Bounds b = Bounds.complete(3).withRows(1, 5);
        List<EnumeratedMatrix> first = new ArrayList<>();
        enumerator.run(b, ExclusionSet.BASE, ShardSpec.ALL, first::add);
        Set<String> seen = new HashSet<>();
        for (EnumeratedMatrix e : first) {
            assertTrue(seen.add(e.text()), "emitted twice: " + e.text());
            assertTrue(CanonicalForm.isCanonical(e.configuration()), e.text());
            assertTrue(e.configuration().isCalabiYau(), e.text());
            assertEquals(3, e.configuration().dimension(), e.text());
        }
        List<String> again = new ArrayList<>();
        enumerator.run(b, ExclusionSet.BASE, ShardSpec.ALL, e -> again.add(e.sequence() + " " + e.toLine()));
        for (int i = 0; i < first.size(); i++) {
            assertEquals(i + " " + first.get(i).toLine(), again.get(i));
        }
        // counts per number of rows, enumeration design §10 (independent prototype)
        EnumerationCounts c = enumerator.count(b, ExclusionSet.BASE, ShardSpec.ALL);
        assertEquals(List.of(5L, 63L, 438L, 1914L, 5896L),
                List.of(c.rows(1), c.rows(2), c.rows(3), c.rows(4), c.rows(5)));
        assertEquals(first.size(), c.total());
    }

    @Test
    void ambientsOfTheCompleteSpacesMatchTheDesignCounts() {
        // 13 and 68 ambients for d = 1, 2 (all rows), 235 for d = 3; enumeration design §6
        assertEquals(235, Enumerator.ambients(Bounds.complete(3)).size());
    }

    @Test
    void lowDimensionalTotalsUnderEveryRuleSet() {
        // enumeration design §10, d = 1 and d = 2 (independent prototype)
        long[][] expected = {{24, 5, 2, 2}, {1350, 41, 16, 13}};
        for (int d = 1; d <= 2; d++) {
            ExclusionSet[] sets = ExclusionSet.named();
            for (int i = 0; i < sets.length; i++) {
                assertEquals(expected[d - 1][i], enumerator.count(Bounds.complete(d), sets[i], ShardSpec.ALL).total(),
                        "d=" + d + " " + sets[i].name());
            }
        }
    }
}
