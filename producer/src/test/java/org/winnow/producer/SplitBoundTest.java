package org.winnow.producer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Skipping the subtrees whose every leaf is proved an ineffective split changes nothing: the same matrices,
 * flags and order as the walk without it, while the tree walked is smaller (so the skipping is exercised).
 */
class SplitBoundTest {
    /** One walk: the emitted lines in order, and the tree nodes visited. */
    private record Walk(List<String> lines, long nodes) {}

    private static Walk walk(Bounds b, ExclusionSet rules, boolean splitBound) {
        List<String> lines = new ArrayList<>();
        SearchTree tree = new SearchTree(b, rules, u -> true, (n, q, m, k, flags) -> {
            StringBuilder s = new StringBuilder();
            for (int r = 0; r < m; r++) {
                s.append(n[r]).append(Arrays.toString(Arrays.copyOf(q[r], k)));
            }
            lines.add(s.append(' ').append(flags).toString());
        }, splitBound);
        for (int[] dims : Ambients.list(b)) {
            tree.run(dims);
        }
        return new Walk(lines, tree.nodes());
    }

    private static void sameOutputSmallerTree(Bounds b, ExclusionSet rules) {
        Walk plain = walk(b, rules, false);
        Walk bounded = walk(b, rules, true);
        assertTrue(plain.lines().size() > 100, "the space is not trivial: " + plain.lines().size());
        assertEquals(plain.lines(), bounded.lines(), b + " " + rules.name());
        assertTrue(bounded.nodes() < plain.nodes(), "nodes " + bounded.nodes() + " vs " + plain.nodes());
    }

    @Test
    void threeFoldsWithEightAndNineRows() {
        Bounds b = Bounds.complete(3).withRows(8, 9);
        for (ExclusionSet rules : new ExclusionSet[] {ExclusionSet.SPLIT, ExclusionSet.SHORT.withoutProducts()}) {
            sameOutputSmallerTree(b, rules);
        }
    }

    @Test
    void fourFoldsWithEightRowsAndFewColumns() {
        sameOutputSmallerTree(new Bounds(4, 8, 8, 8, 9, 10), ExclusionSet.LOSSLESS);
    }

    @Test
    void baseRulesKeepEveryIneffectiveSplit() {
        Bounds b = Bounds.complete(3).withRows(6, 7);
        Walk plain = walk(b, ExclusionSet.BASE, false);
        Walk bounded = walk(b, ExclusionSet.BASE, true);
        assertEquals(plain, bounded, "base does not drop Ek, so nothing may be skipped");
        assertTrue(plain.lines().stream().anyMatch(l -> (Integer.parseInt(l.substring(l.lastIndexOf(' ') + 1))
                & Flag.EK.bit()) != 0), "the space has ineffective splits");
    }
}
