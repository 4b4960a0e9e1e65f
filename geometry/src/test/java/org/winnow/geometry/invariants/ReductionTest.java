package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/** Rule R1 and the block decomposition (common practice, no source). */
class ReductionTest {
    @Test
    void hyperplaneColumnsLeaveEveryInvariantUnchanged() {
        SplittableRandom random = new SplittableRandom(40L);
        RandomConfigurations gen = new RandomConfigurations(random);
        InvariantCalculator calc = new InvariantCalculator();
        for (int i = 0; i < 300; i++) {
            int dim = 1 + i % 4;
            Configuration base = i % 3 == 0 ? gen.arbitrary(dim, 3, 3, 3) : gen.calabiYau(dim, 4, 3);
            Configuration padded = gen.withHyperplaneColumns(base, 1 + random.nextInt(3));
            Configuration reduced = Reduction.reduce(padded);
            assertTrue(reduced.cols() == 1 || Reduction.findHyperplaneColumn(reduced) < 0, reduced::toText);
            assertEquals(dim, reduced.dimension());
            // Calabi-Yau is preserved; a non-Calabi-Yau point row may vanish, so no converse.
            assertTrue(!padded.isCalabiYau() || reduced.isCalabiYau(), padded::toText);
            // Intersection numbers are indexed by rows; a deleted row had exponent 0.
            assertEquals(IntersectionNumbers.all(padded).values().stream().sorted().toList(),
                    IntersectionNumbers.all(reduced).values().stream().sorted().toList(), padded::toText);
            assertEquals(calc.chi(padded), calc.chi(reduced), padded::toText);
            CheapInvariants p = calc.compute(padded);
            CheapInvariants r = calc.compute(reduced);
            assertEquals(p.chi(), r.chi());
            assertEquals(p.degree(), r.degree());
            assertEquals(p.blocks(), r.blocks());
            assertEquals(p.c2sq(), r.c2sq());
        }
    }

    @Test
    void reductionExamples() {
        assertEquals(Configuration.parse("4:5"), Reduction.reduce(Configuration.parse("5:1,5")));
        // Two hyperplanes in P^6 then the quintic; and a point row disappears with its entries.
        assertEquals(Configuration.parse("4:5"), Reduction.reduce(Configuration.parse("6:1,5,1")));
        assertEquals(Configuration.parse("4:5"), Reduction.reduce(Configuration.parse("1:1,2/4:0,5")));
        Configuration quintic = Configuration.parse("4:5");
        assertSame(quintic, Reduction.reduce(quintic));
        // The last column stays; equations left on a point mean an empty variety.
        assertEquals(Configuration.parse("4:1"), Reduction.reduce(Configuration.parse("4:1")));
        assertEquals(Configuration.parse("3:1"), Reduction.reduce(Configuration.parse("4:1,1")));
        assertThrows(IllegalArgumentException.class, () -> Reduction.reduce(Configuration.parse("1:1,2")));
    }

    @Test
    void blocks() {
        Blocks b = Blocks.of(Configuration.parse("3:4,0/3:0,4"));
        assertEquals(2, b.count());
        assertEquals(new Block(List.of(0), List.of(0), 2), b.list().get(0));
        assertEquals(new Block(List.of(1), List.of(1), 2), b.list().get(1));
        Blocks one = Blocks.of(Configuration.parse("2:3,0/2:0,3/1:1,1"));
        assertEquals(1, one.count());
        assertEquals(new Block(List.of(0, 1, 2), List.of(0, 1), 3), one.list().get(0));
        // Rows 0 and 2 share a block through column 1; row 1 stands alone.
        Blocks mixed = Blocks.of(Configuration.parse("2:3,0,0/1:0,0,2/1:0,2,0"));
        assertEquals(List.of(new Block(List.of(0), List.of(0), 1), new Block(List.of(1), List.of(2), 0),
                new Block(List.of(2), List.of(1), 0)), mixed.list());
        assertEquals(3, new InvariantCalculator().blockCount(Configuration.parse("2:3,0,0/1:0,0,2/1:0,2,0")));
    }
}
