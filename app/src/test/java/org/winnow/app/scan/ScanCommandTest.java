package org.winnow.app.scan;

import org.winnow.app.cli.WinnowCli;
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
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Verdict;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.CandidateScorer;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.Manifest;
import org.winnow.sink.RejectLine;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SurvivorLine;

class ScanCommandTest {
    @TempDir
    static Path shared;
    static Path model;
    static ScanFixtures.Input input;

    @BeforeAll
    static void setUp() throws Exception {
        model = ScanFixtures.saveModel(shared);
        input = ScanFixtures.input(shared, 3, 400);
    }

    private record Run(int exit, String out, String err) {}

    private static Run scan(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        var cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        List<String> all = new ArrayList<>(List.of("scan"));
        all.addAll(List.of(args));
        int exit = cl.execute(all.toArray(String[]::new));
        return new Run(exit, out.toString(), err.toString());
    }

    @Test
    void endToEndEverySurvivorParsesAndEveryVerdictIsTheScorersOwn(@TempDir Path dir) throws Exception {
        Path outDir = dir.resolve("out");
        Run r = scan("--model", model.toString(), "--input", input.file().toString(), "--keep", "h11=2..5",
                "--keep", "chi=-150..0", "--min-confidence", "0.5", "--novelty", "0.9", "--out", outDir.toString(),
                "--threads", "2", "--rejects", "--lines-per-file", "40", "--queue", "16");
        assertEquals(0, r.exit(), r.err());
        Manifest m = Manifest.read(outDir.resolve(ScanFiles.MANIFEST));
        Manifest.Counts c = m.counts();
        assertTrue(m.complete());
        assertTrue(r.out().contains("scan " + m.runId() + " complete: " + c.candidates() + " candidates"), r.out());
        assertEquals(input.goodLines(), c.enumerated());
        assertEquals(c.enumerated(), c.duplicates() + c.candidates());
        assertTrue(c.duplicates() >= 10, "duplicates after canonical form: " + c.duplicates());
        assertEquals(c.candidates(), c.scored());
        assertEquals(c.scored(), c.kept() + c.rejected());
        assertEquals(input.badLines(), m.badInputLines().stream().map(b -> b.line()).toList());
        assertEquals(List.of("keep h11=2..5", "keep chi=-150..0", "min-confidence 0.5", "novelty 0.9"), m.rules());
        assertEquals(ScanFixtures.model().checksum(), m.modelChecksum());

        KeepRules rules = KeepRules.of(List.of("h11=2..5", "chi=-150..0"), 0.5, 0.9);
        CandidateScorer direct = CandidateScorer.of(new ModelScoring(ScanFixtures.model()), rules);
        Map<Reason, Integer> seen = new HashMap<>();
        int survivors = 0;
        for (String f : m.survivorFiles()) {
            List<String> lines = Files.readAllLines(outDir.resolve(f));
            assertTrue(lines.size() <= 42, f + " has " + lines.size() + " lines");
            for (String line : lines.subList(2, lines.size())) {
                SurvivorLine s = SurvivorLine.parse(line);
                Scored d = score(direct, s.config());
                assertEquals(Verdict.KEEP, d.verdict());
                assertEquals(d.reason(), s.keptBecause());
                assertEquals(d.invariants().chi(), s.chi());
                assertEquals(d.prediction().h11(), s.h11());
                assertEquals(d.prediction().h21(), s.h21());
                assertEquals(d.prediction().confidence(), s.confidence(), 5e-7);
                assertEquals(d.novelty(), s.novelty(), 5e-7);
                assertEquals(d.prediction().nearestReference(), s.nearestReference());
                seen.merge(s.keptBecause(), 1, Integer::sum);
                survivors++;
            }
        }
        assertEquals(c.kept(), survivors);
        int rejected = 0;
        for (String f : m.rejectFiles()) {
            List<String> lines = Files.readAllLines(outDir.resolve(f));
            for (String line : lines.subList(2, lines.size())) {
                RejectLine x = RejectLine.parse(line);
                Scored d = score(direct, x.config());
                assertEquals(d.reason(), x.rejectedBecause());
                // The rejection really follows from a rule at the stated confidence and novelty.
                switch (x.rejectedBecause()) {
                    case EXACT_CHI_OUT_OF_RANGE -> assertTrue(x.chi() < -150 || x.chi() > 0, line);
                    case PROVED_H11_OUT_OF_RANGE -> {
                        assertTrue(x.h11Value().isProved() && (x.h11() < 2 || x.h11() > 5), line);
                        assertTrue(x.chi() >= -150 && x.chi() <= 0, line);
                    }
                    case BOUNDED_H11_OUT_OF_RANGE -> {
                        assertTrue(!x.h11Value().isProved() && x.h11Value().provedOutside(2, 5), line);
                        assertTrue(x.chi() >= -150 && x.chi() <= 0, line);
                    }
                    case PREDICTED_H11_OUT_OF_RANGE -> {
                        assertTrue(x.h11() < 2 || x.h11() > 5, line);
                        assertTrue(!x.h11Value().isProved() && x.confidence() >= 0.5 - 5e-7 && x.novelty() < 0.9, line);
                        assertTrue(x.chi() >= -150 && x.chi() <= 0, line);
                    }
                    default -> throw new AssertionError("unexpected reason " + line);
                }
                seen.merge(x.rejectedBecause(), 1, Integer::sum);
                rejected++;
            }
        }
        assertEquals(c.rejected(), rejected);
        for (Reason reason : Reason.values()) {
            long expected = (reason.verdict() == Verdict.KEEP ? c.keptByReason() : c.rejectedByReason()).get(reason.code());
            assertEquals(expected, (long) seen.getOrDefault(reason, 0), reason.code());
        }
        assertTrue(c.kept() > 0 && c.rejected() > 0, "a degenerate test: " + c);
    }

    private static Scored score(CandidateScorer direct, String canonicalText) {
        Configuration cfg = Configuration.parse(canonicalText);
        assertEquals(canonicalText, cfg.canonicalText(), "survivor config is not canonical");
        return direct.score(new Candidate(cfg, canonicalText, 0, 0));
    }

    @Test
    void badRulesAndBadModelsFailAtStartupWithOneLine(@TempDir Path dir) throws Exception {
        Run badRule = scan("--model", model.toString(), "--input", input.file().toString(), "--keep", "h11=5..4",
                "--out", dir.resolve("a").toString());
        assertEquals(2, badRule.exit());
        assertEquals("winnow scan: rule 'h11=5..4': empty range, 5 > 4\n", badRule.err());
        assertFalse(Files.exists(dir.resolve("a")));

        Path rules = dir.resolve("demo.rules");
        Files.writeString(rules, "keep h11=1..3\nkeep size=1..2\n");
        Run badFile = scan("--model", model.toString(), "--input", input.file().toString(), "--rules-file",
                rules.toString(), "--out", dir.resolve("b").toString());
        assertEquals(2, badFile.exit());
        assertTrue(badFile.err().startsWith("winnow scan: " + rules + ":2: rule 'size=1..2': unknown invariant 'size'"),
                badFile.err());
        assertEquals(1, badFile.err().lines().count());

        Run noModel = scan("--model", dir.resolve("missing.wnm").toString(), "--input", input.file().toString(),
                "--out", dir.resolve("c").toString());
        assertEquals(2, noModel.exit());
        assertTrue(noModel.err().startsWith("winnow scan: --model " + dir.resolve("missing.wnm")), noModel.err());
        assertEquals(1, noModel.err().lines().count(), noModel.err());

        Path junk = dir.resolve("junk.wnm");
        Files.writeString(junk, "not a model");
        Run junkModel = scan("--model", junk.toString(), "--input", input.file().toString(), "--out",
                dir.resolve("d").toString());
        assertEquals(2, junkModel.exit());
        assertEquals(1, junkModel.err().lines().count(), junkModel.err());
    }

    @Test
    void strictModeFailsAtTheFirstBadLineNamingIt(@TempDir Path dir) throws Exception {
        Run r = scan("--model", model.toString(), "--input", input.file().toString(), "--out",
                dir.resolve("s").toString(), "--strict");
        assertEquals(2, r.exit(), r.err());
        assertTrue(r.err().startsWith("winnow scan: " + input.file() + " line " + input.badLines().get(0) + ": "), r.err());
        assertFalse(Manifest.read(dir.resolve("s").resolve(ScanFiles.MANIFEST)).complete());
    }

    @Test
    void aDirectoryOfAnotherScanIsRefused(@TempDir Path dir) throws Exception {
        Path out = dir.resolve("o");
        assertEquals(0, scan("--model", model.toString(), "--input", input.file().toString(), "--out", out.toString(),
                "--keep", "h11=1..3").exit());
        Run again = scan("--model", model.toString(), "--input", input.file().toString(), "--out", out.toString(),
                "--keep", "h11=1..4");
        assertEquals(2, again.exit());
        assertTrue(again.err().contains("use a fresh directory"), again.err());
    }

    /** The body of a survivor or reject file: its lines without the two header lines that carry the run id. */
    private static List<String> body(Path dir, List<String> files) throws Exception {
        List<String> all = new ArrayList<>();
        for (String f : files) {
            List<String> lines = Files.readAllLines(dir.resolve(f));
            all.addAll(lines.subList(2, lines.size()));
        }
        return all;
    }

    @Test
    void fromBoundsTheScanEqualsTheScanOfTheEnumeratedFile(@TempDir Path dir) throws Exception {
        String[] space = {"--dim", "3", "--max-rows", "3", "--rules", "lossless"};
        Path listing = dir.resolve("space.txt");
        List<String> enumerate = new ArrayList<>(List.of("enumerate", "--out", listing.toString()));
        enumerate.addAll(List.of(space));
        assertEquals(0, WinnowCli.commandLine().execute(enumerate.toArray(String[]::new)));
        List<String> common = List.of("--model", model.toString(), "--keep", "h11=2..5", "--keep", "chi=-150..0",
                "--min-confidence", "0.5", "--novelty", "0.9", "--threads", "2", "--rejects", "--lines-per-file", "40");

        List<String> fromBounds = new ArrayList<>(common);
        fromBounds.addAll(List.of(space));
        fromBounds.addAll(List.of("--out", dir.resolve("bounds").toString()));
        Run b = scan(fromBounds.toArray(String[]::new));
        assertEquals(0, b.exit(), b.err());
        List<String> fromFile = new ArrayList<>(common);
        fromFile.addAll(List.of("--input", listing.toString(), "--out", dir.resolve("file").toString()));
        Run f = scan(fromFile.toArray(String[]::new));
        assertEquals(0, f.exit(), f.err());

        Manifest mb = Manifest.read(dir.resolve("bounds").resolve(ScanFiles.MANIFEST));
        Manifest mf = Manifest.read(dir.resolve("file").resolve(ScanFiles.MANIFEST));
        assertTrue(mb.complete());
        long lines = Files.readAllLines(listing).size();
        assertEquals(lines, mb.counts().candidates());
        assertEquals(mf.counts(), mb.counts());
        assertEquals(mf.survivorFiles(), mb.survivorFiles());
        assertEquals(body(dir.resolve("file"), mf.survivorFiles()), body(dir.resolve("bounds"), mb.survivorFiles()));
        assertEquals(body(dir.resolve("file"), mf.rejectFiles()), body(dir.resolve("bounds"), mb.rejectFiles()));
        // Every enumerated matrix is scored exactly once: survivors and rejects together are the listing.
        List<String> seen = new ArrayList<>();
        for (String line : body(dir.resolve("bounds"), mb.survivorFiles())) {
            seen.add(SurvivorLine.parse(line).config());
        }
        for (String line : body(dir.resolve("bounds"), mb.rejectFiles())) {
            seen.add(RejectLine.parse(line).config());
        }
        assertEquals(Files.readAllLines(listing).stream().map(l -> l.split("\t")[0]).sorted().toList(),
                seen.stream().sorted().toList());

        assertTrue(mb.source().startsWith("enumeration dim 3, rows 1..3"), mb.source());
        assertEquals(Map.of("dim", 3, "minRows", 1, "maxRows", 3, "maxCols", 24, "maxN", 7, "maxEntry", 8,
                "ruleSet", "lossless", "excludes", List.of("C", "Q3p", "Ek"), "shard", "0/1"), mb.bounds());
        assertEquals(mf.rules(), mb.rules());
        assertTrue(mf.bounds() == null);
        assertFalse(mb.runId().equals(mf.runId()), "a file and an enumeration are different scans");
    }

    @Test
    void boundsAndAnInputFileTogetherAreOneLineAndExitTwo(@TempDir Path dir) {
        Run both = scan("--model", model.toString(), "--input", input.file().toString(), "--dim", "3", "--out",
                dir.resolve("a").toString());
        assertEquals(2, both.exit());
        assertEquals("winnow scan: give either --input F or bounds (--dim, --max-rows, ...), not both\n", both.err());
        assertFalse(Files.exists(dir.resolve("a")));

        Run neither = scan("--model", model.toString(), "--out", dir.resolve("b").toString());
        assertEquals(2, neither.exit());
        assertEquals(1, neither.err().lines().count(), neither.err());
        assertTrue(neither.err().startsWith("winnow scan: give --input F"), neither.err());

        Run bad = scan("--model", model.toString(), "--max-rows", "17", "--out", dir.resolve("c").toString());
        assertEquals(2, bad.exit());
        assertEquals("winnow scan: max-rows 17 exceeds the supported 16\n", bad.err());
    }

    @Test
    void theProofStepSettlesWhatTheCheapTupleOnlyBoundsAndTheManifestCountsIt(@TempDir Path dir) throws Exception {
        // The demo model; h11 of the second line is only bounded (7..11) without the exact backend, which
        // proves 8; the quintic's h11 = 1 is proved by the cheap tuple, so no proof step runs for it.
        Path demoModel = Path.of("../demo-data/threefolds-1pct.wnm");
        Path in = dir.resolve("in.txt");
        Files.writeString(in, "4:5\n2:2,1,0,0,0/2:0,1,1,1,0/1:0,0,2,0,0/1:0,0,2,0,0/1:0,0,0,1,1/1:0,0,0,0,2\n");
        Run off = scan("--model", demoModel.toString(), "--input", in.toString(), "--keep", "h11=2..7", "--out",
                dir.resolve("off").toString());
        assertEquals(0, off.exit(), off.err());
        Manifest m0 = Manifest.read(dir.resolve("off").resolve(ScanFiles.MANIFEST));
        assertEquals(java.util.Map.of(), m0.proofs());
        assertEquals(1L, m0.counts().keptByReason().get("kept-in-range"));
        Run on = scan("--model", demoModel.toString(), "--input", in.toString(), "--keep", "h11=2..7", "--prove", "120s",
                "--rejects", "--out", dir.resolve("on").toString());
        assertEquals(0, on.exit(), on.err());
        Manifest m1 = Manifest.read(dir.resolve("on").resolve(ScanFiles.MANIFEST));
        assertEquals(java.util.Map.of("settled", 1L), m1.proofs());
        assertEquals(2L, m1.counts().rejectedByReason().get("proved-h11-out-of-range"));
        Run bad = scan("--model", demoModel.toString(), "--input", in.toString(), "--prove", "soon", "--out",
                dir.resolve("bad").toString());
        assertEquals(2, bad.exit());
        assertEquals("winnow scan: --prove soon: expected a time such as 200ms or 2s\n", bad.err());
    }
}
