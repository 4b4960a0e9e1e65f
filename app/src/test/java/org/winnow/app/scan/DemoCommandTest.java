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

    /**
     * The four-fold demo on its smallest matrices (up to 3 rows, 1,488 of them): the shipped four-fold model
     * and rules, and against the engine's exact labels of the same matrices no true target of the scenario
     * is rejected (the whole space's figures are in the README).
     */
    @Test
    void theFourFoldDemoKeepsEveryTrueTargetOfItsSmallestMatrices(@TempDir Path dir) throws Exception {
        assumeTrue(Files.isReadable(DATA.resolve("fourfolds-1pct.wnm")), "demo data not beside the module");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        var cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        Path demo = dir.resolve("demo-out");
        int exit = cl.execute("demo", "--dim", "4", "--max-rows", "3", "--out", demo.toString(), "--data",
                DATA.toString(), "--threads", "2");
        assertEquals(0, exit, err.toString());
        Path scan = demo.resolve("scan");
        Manifest m = Manifest.read(scan.resolve(ScanFiles.MANIFEST));
        assertTrue(m.complete());
        assertEquals(4, ((Map<?, ?>) m.bounds()).get("dim"));
        assertEquals(3, ((Map<?, ?>) m.bounds()).get("maxRows"));
        RulesFile.Contents rules = RulesFile.read(DATA.resolve("rules-fourfolds.txt"));
        assertEquals(KeepRules.of(rules.keeps(), rules.minConfidence().orElse(KeepRules.DEFAULT_MIN_CONFIDENCE),
                rules.noveltyGuard().orElse(KeepRules.DEFAULT_NOVELTY_GUARD)).describe(), m.rules());
        assertTrue(out.toString().startsWith("winnow demo: scanning every four-fold configuration matrix (rule set "
                + "lossless, at most 3 rows)"), out.toString());
        java.util.Set<String> kept = new java.util.HashSet<>();
        for (String f : m.survivorFiles()) {
            List<String> lines = Files.readAllLines(scan.resolve(f));
            for (String line : lines.subList(2, lines.size())) {
                kept.add(SurvivorLine.parse(line).config());
            }
        }
        assertEquals(m.counts().kept(), kept.size());
        // The scenario of rules-fourfolds.txt, decided on the engine's exact labels.
        org.winnow.geometry.hodge.HodgeEngine engine = org.winnow.geometry.hodge.HodgeEngine.standard();
        int targets = 0;
        List<String> lost = new ArrayList<>();
        var space = new org.winnow.producer.Enumerator();
        List<org.winnow.geometry.Configuration> all = new ArrayList<>();
        space.run(org.winnow.producer.Bounds.complete(4).withRows(1, 3), org.winnow.producer.ExclusionSet.byName("lossless"),
                org.winnow.producer.ShardSpec.ALL, e -> all.add(e.configuration()));
        assertEquals(m.counts().candidates(), all.size());
        for (org.winnow.geometry.Configuration c : all) {
            org.winnow.geometry.hodge.HodgeResult r = engine.compute(c);
            assertTrue(r.isExact(), c.toText());
            long chi = r.chi().orElseThrow();
            long h11 = r.h11().value();
            long h31 = r.h31().value();
            if (h11 >= 4 && h11 <= 8 && h31 >= 80 && h31 <= 200 && chi >= 600 && chi <= 1200 && chi % 24 == 0) {
                targets++;
                if (!kept.contains(c.toText())) {
                    lost.add(c.toText());
                }
            }
        }
        assertTrue(targets > 0, "the scenario has targets among the smallest matrices");
        assertEquals(List.of(), lost, "true targets rejected");
    }
}
