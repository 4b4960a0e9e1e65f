package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.OptionalLong;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.winnow.geometry.Configuration;

/**
 * Published and textbook values. Sources, as named in the project's check-value table:
 * [T] standard textbook values of the quintic family and its relatives (from memory, each
 * re-derived by a deformation count); [S5] "New Calabi-Yau Manifolds with Small Hodge Numbers",
 * arXiv:0809.4681 (2008); [S3] "All Complete Intersection Calabi-Yau Four-Folds", arXiv:1303.1832,
 * JHEP (2013). Row indices below are 0-based in the written row order (the table's d122 is
 * {@code (0,1,1)} here).
 */
class CheckValuesTest {
    private final InvariantCalculator calc = new InvariantCalculator();

    /** Triples as "r,s,t=v;..." with 0-based rows r <= s <= t; c2.J as "a,b,...". */
    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        // [T] quintic and the other one-row three-folds
        "4:5                 | -200 | 0,0,0=5                     | 50",
        "5:3,3               | -144 | 0,0,0=9                     | 54",
        "5:2,4               | -176 | 0,0,0=8                     | 56",
        "6:2,2,3             | -144 | 0,0,0=12                    | 60",
        "7:2,2,2,2           | -128 | 0,0,0=16                    | 64",
        // [T] bicubic, P1 x P3, tetraquadric, split quintic (the last from memory)
        "2:3/2:3             | -162 | 0,0,1=3;0,1,1=3             | 36,36",
        "1:2/3:4             | -168 | 0,1,1=4;1,1,1=2             | 24,44",
        "1:2/1:2/1:2/1:2     | -128 | 0,1,2=2;0,1,3=2;0,2,3=2;1,2,3=2 | 24,24,24,24",
        "1:1,1/4:4,1         | -168 | 0,1,1=4;1,1,1=5             | 24,50",
        // [S5] the two non-favourable three-folds
        "3:3,0,1/3:0,3,1     | -18  | 0,0,1=9;0,1,1=9             | 36,36",
        "2:3,0/2:0,3/1:1,1   | 0    | 0,0,1=3;0,1,1=3;0,1,2=9     | 36,36,0",
        // derived in the check-value table (cubic surface times P^2 argument)
        "2:3,0/3:1,3         | -54  | 0,0,1=3;0,1,1=9             | 36,36",
    })
    void threeFolds(String config, long chi, String triples, String c2J) {
        Configuration c = Configuration.parse(config.trim());
        CheapInvariants inv = calc.compute(c);
        assertEquals(3, inv.dim());
        assertEquals(chi, inv.chi(), "chi");
        assertEquals(parseTriples(triples.trim()), inv.triple(), "d_rst");
        assertArrayEquals(parseLongs(c2J.trim()), inv.c2J(), "c2.J");
        // The hot path must agree with the record.
        long[] out = new long[c.rows()];
        assertEquals(chi, calc.threefold(c, out));
        assertArrayEquals(parseLongs(c2J.trim()), out);
        for (TripleIntersection t : inv.triple()) {
            assertEquals(t.value(), calc.intersections().triple(t.t(), t.r(), t.s()));
        }
        // chi = 2 (h11 - h21) is even for every three-fold ([T], common practice).
        assertEquals(0, inv.chi() % 2);
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "2:3           | 1 | 0",   // [T] elliptic curve
        "3:4           | 2 | 24",  // [T] quartic K3
        "4:2,3         | 2 | 24",  // [T] K3
        "1:2/2:3       | 2 | 24",  // [T] K3
    })
    void lowerDimensions(String config, int dim, long chi) {
        Configuration c = Configuration.parse(config.trim());
        CheapInvariants inv = calc.compute(c);
        assertEquals(dim, inv.dim());
        assertEquals(chi, inv.chi());
        assertEquals(chi, calc.chi(c));
        assertEquals(chi, ChernClasses.of(c).eulerCharacteristic());
    }

    /** [S3] (chi range, sextic) and [T] (re-derived): the seven one-row four-folds. */
    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "5:6           | 2610 | 1350",
        "6:2,5         | 2190 | 1210",
        "6:3,4         | 1476 | 972",
        "7:2,2,4       | 1632 | 1024",
        "7:2,3,3       | 1206 | 882",
        "8:2,2,2,3     | 1152 | 864",
        "9:2,2,2,2,2   | 960  | 800",
    })
    void fourFolds(String config, long chi, long c2sq) {
        Configuration c = Configuration.parse(config.trim());
        CheapInvariants inv = calc.compute(c);
        assertEquals(4, inv.dim());
        assertEquals(chi, inv.chi());
        assertEquals(OptionalLong.of(c2sq), inv.c2sq());
        // Identities for holonomy exactly SU(4) (common practice, from the index theorem).
        assertEquals(480 + inv.chi() / 3, inv.c2sq().getAsLong());
        assertEquals(0, inv.chi() % 6);
        assertEquals(1, inv.blocks());
    }

    /**
     * K3 x K3 is block-diagonal: chi = 24^2 = 576 and int c2^2 = 1152 per the check-value table's
     * negative case; the SU(4) identity int c2^2 = 480 + chi/3 must fail for it.
     */
    @Test
    void productOfTwoK3sBreaksTheSu4Identity() {
        CheapInvariants inv = calc.compute(Configuration.parse("3:4,0/3:0,4"));
        assertEquals(576, inv.chi());
        assertEquals(OptionalLong.of(1152), inv.c2sq());
        assertEquals(2, inv.blocks());
        assertEquals(0, inv.chi() % 6);
        assertNotEquals(480 + inv.chi() / 3, inv.c2sq().getAsLong());
    }

    /** [T] quintic: deg = 5, and a hyperplane column changes nothing (rule R1). */
    @Test
    void quinticDegreeAndReduction() {
        CheapInvariants inv = calc.compute(Configuration.parse("4:5"));
        assertEquals(5, inv.degree());
        assertEquals(inv, calc.compute(Configuration.parse("5:5,1")));
        assertTrue(inv.c2sq().isEmpty());
    }

    private static List<TripleIntersection> parseTriples(String text) {
        List<TripleIntersection> out = new ArrayList<>();
        for (String item : text.split(";")) {
            String[] kv = item.split("=");
            String[] rst = kv[0].split(",");
            out.add(new TripleIntersection(Integer.parseInt(rst[0].trim()), Integer.parseInt(rst[1].trim()),
                    Integer.parseInt(rst[2].trim()), Long.parseLong(kv[1].trim())));
        }
        return out;
    }

    private static long[] parseLongs(String text) {
        String[] parts = text.split(",");
        long[] out = new long[parts.length];
        for (int i = 0; i < parts.length; i++) {
            out[i] = Long.parseLong(parts[i].trim());
        }
        return out;
    }
}
