package org.winnow.app.hodge;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import picocli.CommandLine;

/** {@code winnow label} from bounds: the same labels as from the enumerated file, status lines, resumption. */
class LabelFromBoundsTest {
    private record Run(int exit, List<String> err) {
        String last() {
            return err.isEmpty() ? "" : err.get(err.size() - 1);
        }
    }

    private static Run run(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        String s = err.toString();
        return new Run(exit, s.isEmpty() ? List.of() : List.of(s.split("\n")));
    }

    private static List<String> sorted(Path f) throws IOException {
        return Files.readAllLines(f).stream().sorted().toList();
    }

    @Test
    void fromBoundsEqualsFromTheEnumeratedFileForThreeFolds(@TempDir Path dir) throws IOException {
        Path space = dir.resolve("space.txt");
        assertEquals(0, run("enumerate", "--dim", "3", "--max-rows", "2", "--out", space.toString()).exit());
        Path fromFile = dir.resolve("from-file.tsv");
        Path fromBounds = dir.resolve("from-bounds.tsv");
        Run f = run("label", "--in", space.toString(), "--out", fromFile.toString(), "--threads", "2");
        assertEquals(0, f.exit(), String.join("\n", f.err()));
        Run b = run("label", "--dim", "3", "--max-rows", "2", "--out", fromBounds.toString(), "--threads", "2",
                "--enumerate-threads", "2");
        assertEquals(0, b.exit(), String.join("\n", b.err()));
        List<String> expected = sorted(fromFile);
        // 5 + 56 lossless three-folds with 1 or 2 rows (the row counts of docs/enumeration.md), and the header.
        assertEquals(62, expected.size());
        assertEquals("config\th11\th21\tstatus\tsource", Files.readAllLines(fromBounds).get(0));
        long products = expected.stream().filter(l -> l.endsWith("\tproduct")).count();
        assertTrue(products > 0, String.join("\n", expected));
        assertEquals(expected, sorted(fromBounds));
        assertTrue(b.last().startsWith("winnow label: 61 labelled (61 exact, 0 bounded; " + products
                + " of them products), 0 refused, 0 already labelled or repeated; "), b.last());
        assertTrue(b.last().endsWith(" s wall"), b.last());
    }

    @Test
    void fromBoundsEqualsFromTheEnumeratedFileForFourFolds(@TempDir Path dir) throws IOException {
        Path space = dir.resolve("space.txt");
        assertEquals(0, run("enumerate", "--dim", "4", "--max-rows", "2", "--out", space.toString()).exit());
        Path fromFile = dir.resolve("from-file.tsv");
        Path fromBounds = dir.resolve("from-bounds.tsv");
        assertEquals(0, run("label", "--in", space.toString(), "--out", fromFile.toString()).exit());
        Run b = run("label", "--dim", "4", "--max-rows", "2", "--out", fromBounds.toString(), "--enumerate-threads", "1");
        assertEquals(0, b.exit(), String.join("\n", b.err()));
        assertEquals("config\th11\th21\th31\th22\tstatus\tsource", Files.readAllLines(fromBounds).get(0));
        List<String> expected = sorted(fromFile);
        assertEquals(Files.readAllLines(space).size() + 1, expected.size(), "every enumerated four-fold labelled");
        assertEquals(expected, sorted(fromBounds));
        // The sextic four-fold: (h11, h21, h31, h22) = (1, 0, 426, 1752), from memory.
        assertTrue(expected.contains("5:6\t1\t0\t426\t1752\texact\tcomputed"), String.join("\n", expected));
        // K3 x K3 (chi = 24 * 24 = 576, the Kunneth product of two (h11 = 20) K3 diamonds: common practice, no
        // source) is a product, labelled and marked as such.
        assertTrue(expected.stream().anyMatch(l -> l.startsWith("3:4,0/3:0,4\t") && l.endsWith("\texact\tproduct")),
                String.join("\n", expected));
    }

    @Test
    void aCutOutputIsContinuedNotRedone(@TempDir Path dir) throws IOException {
        Path out = dir.resolve("labels.tsv");
        assertEquals(0, run("label", "--dim", "3", "--max-rows", "2", "--out", out.toString()).exit());
        List<String> expected = sorted(out);
        // Keep the header and 20 labels, then a torn line as a kill mid-write leaves it.
        List<String> lines = Files.readAllLines(out);
        Files.write(out, lines.subList(0, 21));
        Files.writeString(out, lines.get(30).substring(0, 5), StandardCharsets.UTF_8,
                java.nio.file.StandardOpenOption.APPEND);
        Run again = run("label", "--dim", "3", "--max-rows", "2", "--out", out.toString());
        assertEquals(0, again.exit(), String.join("\n", again.err()));
        assertTrue(again.last().startsWith("winnow label: 41 labelled (41 exact, 0 bounded; "), again.last());
        assertTrue(again.last().contains(", 0 refused, 20 already labelled or repeated; "), again.last());
        assertEquals(expected, sorted(out));
        Run third = run("label", "--dim", "3", "--max-rows", "2", "--out", out.toString());
        assertTrue(third.last().startsWith("winnow label: 0 labelled (0 exact, 0 bounded; 0 of them products), 0 refused,"
                + " 61 already labelled or repeated; "), third.last());
        assertEquals(expected, sorted(out));
    }

    /** The first status line of a slow run showed "0/s" and an ETA of billions of seconds before anything was done. */
    @Test
    void theStatusShowsNoRateAndNoEtaUntilSomethingIsDone() {
        LabelCommand.Counts counts = new LabelCommand.Counts();
        assertEquals("winnow label: 0 done of 61 (0.0%), ETA -- s, --/s, 10 s",
                LabelCommand.Progress.line(counts, 61, 0, 10_000_000_000L));
        assertEquals("winnow label: 0 done (enumerated 0, total not known yet), --/s, 10 s",
                LabelCommand.Progress.line(counts, -1, 0, 10_000_000_000L));
        counts.exact.addAndGet(20);
        assertEquals("winnow label: 20 done of 61 (32.8%), ETA 21 s, 2/s, 10 s",
                LabelCommand.Progress.line(counts, 61, 0, 10_000_000_000L));
    }

    @Test
    void aPipedRunWritesPlainStatusLinesWithTheTotalAndAnEta(@TempDir Path dir) throws IOException {
        Path out = dir.resolve("labels.tsv");
        Run r = run("label", "--dim", "3", "--max-rows", "2", "--out", out.toString(), "--threads", "1",
                "--expect", "61", "--status-every-ms", "2");
        assertEquals(0, r.exit(), String.join("\n", r.err()));
        Pattern status = Pattern.compile("winnow label: (0 done of 61 \\(0\\.0%\\), ETA -- s, --/s"
                + "|[1-9]\\d* done of 61 \\(\\d+\\.\\d%\\), ETA \\d+ s, \\d+/s), \\d+ s");
        List<String> statusLines = new ArrayList<>();
        for (String l : r.err().subList(0, r.err().size() - 1)) {
            assertTrue(status.matcher(l).matches(), "only status lines before the summary: " + l);
            statusLines.add(l);
        }
        assertTrue(!statusLines.isEmpty(), "a run of this size takes more than a few periods of 2 ms");
        assertTrue(r.last().startsWith("winnow label: 61 labelled"), r.last());
        // Without --expect the total is unknown while the enumeration runs; a wrong --expect is noted at the end.
        Run wrong = run("label", "--dim", "3", "--max-rows", "2", "--out", dir.resolve("x.tsv").toString(),
                "--expect", "60");
        assertEquals("winnow label: note: the space held 61 matrices, --expect said 60", wrong.last());
        assertEquals(0, wrong.exit());
    }

    @Test
    void aFileAndBoundsTogetherOrNeitherAreRefused(@TempDir Path dir) throws IOException {
        Path in = Files.writeString(dir.resolve("in.txt"), "4:5\n");
        Run both = run("label", "--dim", "3", "--in", in.toString(), "--out", dir.resolve("x.tsv").toString());
        assertEquals(Exit.BAD_INPUT, both.exit());
        assertEquals(List.of("winnow label: give either --in F or the bounds of a space (--dim D ...), not both"),
                both.err());
        Run neither = run("label", "--out", dir.resolve("x.tsv").toString());
        assertEquals(Exit.BAD_INPUT, neither.exit());
        assertEquals(List.of("winnow label: give either --in F or the bounds of a space (--dim D ...), not neither"),
                neither.err());
        Run expectWithFile = run("label", "--in", in.toString(), "--out", dir.resolve("x.tsv").toString(), "--expect",
                "1");
        assertEquals(Exit.BAD_INPUT, expectWithFile.exit());
        Run curve = run("label", "--dim", "1", "--out", dir.resolve("x.tsv").toString());
        assertEquals(List.of("winnow label: dimension 1: Hodge numbers need dimension 2, 3 or 4"), curve.err());
        Path three = dir.resolve("three.tsv");
        assertEquals(0, run("label", "--in", in.toString(), "--out", three.toString()).exit());
        Run wrongWidth = run("label", "--dim", "4", "--max-rows", "1", "--out", three.toString());
        assertEquals(Exit.BAD_INPUT, wrongWidth.exit());
        assertEquals(List.of("winnow label: " + three + " has three-fold columns but the space has dimension 4"),
                wrongWidth.err());
    }

    /**
     * A file mixing four-folds and three-folds used to be labelled in part with exit 0, the other dimension's
     * lines refused one by one among the progress lines. Refused up front now, naming both lines, nothing written.
     */
    @Test
    void aFileMixingDimensionsIsRefusedUpFrontNamingTheLines(@TempDir Path dir) throws IOException {
        Path in = Files.writeString(dir.resolve("mixed.txt"), "# three-folds first\n4:5\n5:6\n2:3/2:3\n");
        Path out = dir.resolve("out.tsv");
        Run mixed = run("label", "--in", in.toString(), "--out", out.toString());
        assertEquals(Exit.BAD_INPUT, mixed.exit());
        assertEquals(List.of("winnow label: " + in + " mixes dimensions: line 3 '5:6' (dimension 4) after line 2 '4:5' "
                + "(dimension 3); four-folds have other columns (h31 h22), so label them into a file of their own"),
                mixed.err());
        assertFalse(Files.exists(out), "nothing written");
        // Into an existing output of the other width: refused naming the line, the output left as it was.
        Path threes = Files.writeString(dir.resolve("threes.txt"), "4:5\n");
        assertEquals(0, run("label", "--in", threes.toString(), "--out", out.toString()).exit());
        String before = Files.readString(out);
        Path fours = Files.writeString(dir.resolve("fours.txt"), "\n5:6\n");
        Run wrong = run("label", "--in", fours.toString(), "--out", out.toString());
        assertEquals(Exit.BAD_INPUT, wrong.exit());
        assertEquals(List.of("winnow label: " + fours + " line 2 '5:6' (dimension 4) does not fit the three-fold columns"
                + " of " + out + "; label it into another --out"), wrong.err());
        assertEquals(before, Files.readString(out));
    }

    @Test
    void aFullDiskStopsTheRunInOneLine() {
        assumeTrue(Files.isWritable(Path.of("/dev/full")), "no /dev/full here");
        Run r = run("label", "--dim", "3", "--max-rows", "2", "--out", "/dev/full");
        assertEquals(Exit.STOPPED, r.exit());
        assertEquals(1, r.err().size(), String.join("\n", r.err()));
        assertTrue(r.err().get(0).startsWith("winnow label: /dev/full: "), r.err().get(0));
    }
}
