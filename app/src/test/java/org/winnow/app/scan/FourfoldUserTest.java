package org.winnow.app.scan;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanDirectory;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SurvivorLine;
import picocli.CommandLine;

/** What a new four-fold user ran into, each as a regression. */
class FourfoldUserTest {
    private record Run(int exit, String out, String err) {}

    private static Run winnow(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    /**
     * {@code winnow scan --dim 4} with a model of three-folds once gave every four-fold the model's h11 with
     * confidence 1.000000 and a three-fold as its nearest reference, and predicted rules rejected on it. Now the
     * model's neighbours do not vote there: the scan says so in one line, and only proved and bounded values
     * (and exact invariants) reject; nothing is rejected on the three-fold model's word.
     */
    @Test
    void boundsOfAnotherDimensionThanTheModelRejectOnlyOnProofs(@TempDir Path dir) throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        Path out = dir.resolve("scan");
        Run r = winnow("scan", "--dim", "4", "--max-rows", "2", "--model", model.toString(), "--out", out.toString(),
                "--keep", "h11=2..3", "--keep", "h31=100..300");
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().startsWith("winnow scan: note: --model " + model + " is of dimension 3 and the bounds of "
                + "dimension 4: only proved and bounded values can reject, every other candidate is kept as novel\n"),
                r.err());
        Manifest m = Manifest.read(out.resolve(ScanFiles.MANIFEST));
        long rejected = 0;
        for (var e : m.counts().rejectedByReason().entrySet()) {
            assertTrue(e.getValue() == 0 || !e.getKey().startsWith("predicted-"), "rejected on the model's word: " + e);
            rejected += e.getValue();
        }
        assertTrue(rejected > 0 && m.counts().kept() > 0, "both verdicts occur: " + m.counts());
    }

    /**
     * Rules that cannot act in the scan they are given to once ran to the end with exit 0: {@code --keep h31=...}
     * on three-fold bounds kept everything as undecided, {@code --keep h21=-5..-1} and, on bounds that hold no
     * such candidate, {@code --keep dim=3} or {@code --keep rows=20..} rejected everything. Each is refused in
     * one line naming the rule.
     */
    @Test
    void rulesThatCannotActForTheDimensionOrTheBoundsAreRefused(@TempDir Path dir) throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        String[][] cases = {
            {"--keep", "h31=100..500", "rule 'h31=100..500': the bounds hold 3-folds, which have no h31 (it exists "
                + "from dimension 4 on), so the rule could never act"},
            {"--keep", "h22=..900", "rule 'h22=..900': the bounds hold 3-folds, which have no h22 (it exists from "
                + "dimension 4 on), so the rule could never act"},
            {"--keep", "h21=-5..-1", "rule 'h21=-5..-1': h21 is never below 0, so the rule would reject every "
                + "candidate"},
            {"--keep", "h11=0", "rule 'h11=0': h11 is never below 1, so the rule would reject every candidate"},
            {"--keep", "dim=2", "rule 'dim=2': every candidate of the bounds has dim in 3, so the scan would reject them "
                + "all"},
            {"--keep", "rows=7..", "rule 'rows=7..': every candidate of the bounds has rows in 1..3, so the scan would "
                + "reject them all"},
            {"--keep", "cols=30..", "rule 'cols=30..': every candidate of the bounds has cols in 1..24, so the scan "
                + "would reject them all"},
        };
        for (String[] c : cases) {
            Path out = dir.resolve("scan");
            Run r = winnow("scan", "--dim", "3", "--max-rows", "3", "--model", model.toString(), "--out", out.toString(),
                    c[0], c[1]);
            assertEquals(Exit.BAD_INPUT, r.exit(), c[1] + ": " + r.err());
            assertEquals("winnow scan: " + c[2] + "\n", r.err());
            assertFalse(Files.exists(out), "nothing written");
        }
        // An input file may hold candidates of any shape (here a four-fold, whose h31 is proved): not refused there.
        Path input = Files.writeString(dir.resolve("in.txt"), "4:5\n5:6\n");
        Run r = winnow("scan", "--input", input.toString(), "--model", model.toString(), "--out",
                dir.resolve("s").toString(), "--keep", "rows=7..", "--keep", "h31=100..300");
        assertEquals(0, r.exit(), r.err());
    }

    /**
     * A candidate of another dimension than the model's was shown with a reference of the model's dimension as
     * its nearest one, as if the two were alike. Such a candidate names no reference now ({@code -}), while one of
     * the model's dimension in the same file still does.
     */
    @Test
    void aCandidateOfAnotherDimensionNamesNoNearestReference(@TempDir Path dir) throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        Path input = Files.writeString(dir.resolve("in.txt"), "4:5\n5:6\n");
        Path out = dir.resolve("s");
        Run r = winnow("scan", "--input", input.toString(), "--model", model.toString(), "--out", out.toString());
        assertEquals(0, r.exit(), r.err());
        Map<String, String> nearest = new HashMap<>();
        for (SurvivorLine s : ScanDirectory.read(out).survivors()) {
            nearest.put(s.config(), s.nearestReference());
        }
        assertEquals(Set.of("4:5", "5:6"), nearest.keySet(), "both kept (no rules)");
        assertEquals("", nearest.get("5:6"), "a four-fold next to a three-fold model");
        assertFalse(nearest.get("4:5").isEmpty(), "a three-fold still names its nearest three-fold");
        List<String> lines = new ArrayList<>();
        try (Stream<Path> files = Files.list(out)) {
            for (Path f : files.filter(f -> f.getFileName().toString().startsWith(ScanFiles.SURVIVORS)).toList()) {
                lines.addAll(Files.readAllLines(f));
            }
        }
        assertTrue(lines.stream().anyMatch(l -> l.startsWith("5:6\t") && l.endsWith("\t-")), String.join("\n", lines));
    }
}
