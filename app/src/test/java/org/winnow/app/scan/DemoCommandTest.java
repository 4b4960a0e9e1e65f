package org.winnow.app.scan;

import org.winnow.app.cli.WinnowCli;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.rules.RulesFile;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SurvivorLine;

/** {@code winnow demo} on the shipped demo data: a scan from bounds, no candidates file, the summary. */
class DemoCommandTest {
    private static final Path DATA = Path.of("..", "demo-data");

    @Test
    void theDemoScansTheThreeFoldSpaceFromBoundsAndSummarisesIt(@TempDir Path dir) throws Exception {
        assumeTrue(Files.isReadable(DATA.resolve("threefolds-1pct.wnm")), "demo data not beside the module");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        var cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        Path demo = dir.resolve("demo-out");
        int exit = cl.execute("demo", "--out", demo.toString(), "--data", DATA.toString(), "--threads", "2");
        assertEquals(0, exit, err.toString());
        try (Stream<Path> s = Files.list(demo)) {
            assertEquals(List.of("scan"), s.map(p -> p.getFileName().toString()).toList(), "only the scan directory");
        }
        Path scan = demo.resolve("scan");
        Manifest m = Manifest.read(scan.resolve(ScanFiles.MANIFEST));
        Manifest.Counts c = m.counts();
        assertTrue(m.complete());
        assertTrue(m.source().startsWith("enumeration dim 3, "), m.source());
        assertEquals(3, ((Map<?, ?>) m.bounds()).get("dim"));
        assertEquals("lossless", ((Map<?, ?>) m.bounds()).get("ruleSet"));
        RulesFile.Contents rules = RulesFile.read(DATA.resolve("rules.txt"));
        assertEquals(KeepRules.of(rules.keeps(), rules.minConfidence().orElse(KeepRules.DEFAULT_MIN_CONFIDENCE),
                rules.noveltyGuard().orElse(KeepRules.DEFAULT_NOVELTY_GUARD)).describe(), m.rules());
        assertEquals(0, c.duplicates());
        assertEquals(c.candidates(), c.scored());
        assertEquals(c.scored(), c.kept() + c.rejected());

        String text = out.toString();
        assertTrue(text.contains("scan " + m.runId() + " complete: " + c.candidates() + " candidates"), text);
        // The listed survivors are the most novel ones of the files, most novel first.
        List<Double> novelty = new ArrayList<>();
        for (String f : m.survivorFiles()) {
            List<String> lines = Files.readAllLines(scan.resolve(f));
            for (String line : lines.subList(2, lines.size())) {
                novelty.add(SurvivorLine.parse(line).novelty());
            }
        }
        assertEquals(c.kept(), novelty.size());
        List<String> listed = text.lines().dropWhile(l -> !l.startsWith("most novel survivors")).skip(2)
                .takeWhile(l -> !l.isBlank()).toList();
        assertEquals(Math.min(10, novelty.size()), listed.size(), text);
        double top = novelty.stream().mapToDouble(Double::doubleValue).max().orElseThrow();
        assertEquals(top, Double.parseDouble(listed.get(0).trim().split("\\s+")[0]), 5e-5);
        assertFalse(text.contains("candidates.txt"), text);
        assertTrue(text.contains("files: survivors in " + scan.resolve(ScanFiles.SURVIVORS)), text);
    }
}
