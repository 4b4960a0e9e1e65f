package org.winnow.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.producer.ExclusionSet;

/** The four-fold bench file: distinct canonical four-folds of the enumeration with their exact chi. */
class GenerateCandidatesTest {
    @TempDir
    Path dir;

    @Test
    void fourFoldFileHoldsDistinctCanonicalMatricesOfEveryRowCountWithTheirChi() throws Exception {
        Path out = dir.resolve("c4.tsv");
        assertEquals(400, GenerateCandidates.writeEnumerated(400, 4, ExclusionSet.LOSSLESS, out));
        List<String> lines = Files.readAllLines(out, StandardCharsets.UTF_8);
        assertEquals(400, lines.size());
        InvariantCalculator calculator = new InvariantCalculator();
        Set<Configuration> distinct = new HashSet<>();
        Set<Integer> rows = new HashSet<>();
        int number = 0;
        for (String line : lines) {
            CandidateLine c = CandidateLine.parse(line, ++number);
            assertEquals(4, c.config().dimension(), line);
            assertEquals(c.config().canonical(), c.config(), line);
            assertEquals(calculator.chi(c.config()), c.chi(), line);
            distinct.add(c.config());
            rows.add(c.config().rows());
        }
        assertEquals(400, distinct.size());
        // An even stride over the whole enumeration, not its first 400 (which are all small).
        assertTrue(rows.containsAll(Set.of(2, 3, 4)), "row counts: " + rows);
    }

    @Test
    void aSpaceSmallerThanTheCountIsWrittenWhole() throws Exception {
        Path out = dir.resolve("small.tsv");
        long written = GenerateCandidates.writeEnumerated(1_000_000, 1, ExclusionSet.LOSSLESS, out);
        assertEquals(written, Files.readAllLines(out, StandardCharsets.UTF_8).size());
        assertTrue(written > 0 && written < 1_000_000, "written: " + written);
    }
}
