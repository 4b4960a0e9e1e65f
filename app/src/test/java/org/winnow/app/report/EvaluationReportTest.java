package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.model.Evaluation;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceTsv;

/** {@code winnow evaluate --out} writes its results as JSON, and {@code winnow report} renders them. */
class EvaluationReportTest {
    static Path sample;
    static Path evalDir;

    @BeforeAll
    static void evaluate() throws Exception {
        DemoRun.Outputs run = DemoRun.shared();
        sample = run.sample();
        evalDir = run.evaluation();
    }

    @Test
    void theJsonHoldsWhatTheScorersEvaluationComputes() throws Exception {
        EvaluationFile f = EvaluationFile.read(evalDir.resolve(EvaluationFile.FILE));
        // The same evaluation, recomputed here from the public API on the same rows.
        FrozenModel model = FrozenModel.load(DemoRun.MODEL);
        Set<String> seen = new HashSet<>(Arrays.asList(model.reference().configs()));
        InvariantCalculator calc = new InvariantCalculator();
        List<LabelledExample> test = new ArrayList<>();
        for (ReferenceTsv.Row r : ReferenceTsv.read(sample)) {
            if (r.exact() && !seen.contains(r.config().toText())) {
                test.add(new LabelledExample(r.config(), calc.chi(r.config()), r.hodge()));
            }
        }
        Evaluation ev = Evaluation.of(model, test, null);
        assertEquals(model.checksum(), f.modelChecksum());
        assertEquals(test.size(), f.testRows());
        assertEquals(ev.examples(), f.examples());
        assertEquals(ev.accuracy(), f.accuracy(), 0);
        assertArrayEquals(ev.classes(), f.classes());
        assertArrayEquals(ev.support(), f.support());
        for (int c = 0; c < ev.classes().length; c++) {
            assertArrayEquals(ev.confusion()[c], f.confusion()[c]);
            assertEquals(Double.isNaN(ev.recall()[c]) ? null : ev.recall()[c], f.recall()[c]);
            assertEquals(Double.isNaN(ev.precision()[c]) ? null : ev.precision()[c], f.precision()[c]);
        }
        assertEquals(ev.reliability().size(), f.reliability().size());
        int binned = 0;
        for (int i = 0; i < ev.reliability().size(); i++) {
            assertEquals(ev.reliability().get(i).count(), f.reliability().get(i).count());
            binned += f.reliability().get(i).count();
        }
        assertEquals(f.examples(), binned, "every known-class example falls in one bin");
        assertEquals(null, f.holdoutClass());
        assertEquals(null, f.noveltyAuroc(), "no held-out class: no AUROC, and no number made up for it");
        assertTrue(f.summary().contains(String.format(Locale.ROOT, "h11 accuracy: %.4f", ev.accuracy())), f.summary()
                .toString());
        for (String png : List.of(f.embeddingPlot(), f.confusionPlot())) {
            assertFalse(Path.of(png).isAbsolute(), "pictures inside --out are named relative to it: " + png);
            assertTrue(ImageIO.read(evalDir.resolve(png).toFile()).getWidth() > 0, png);
        }
    }

    @Test
    void theReportOfAnEvaluationShowsEverySection(@TempDir Path dir) throws Exception {
        Path html = dir.resolve("eval.html");
        DemoRun.Run r = DemoRun.winnow("report", evalDir.toString(), "--out", html.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().startsWith("report: " + html + " (evaluation of "), r.out());
        String page = Files.readString(html);
        for (String id : EvaluationHtml.SECTIONS) {
            assertTrue(page.contains("<section id=\"" + id + "\">"), "section " + id);
        }
        assertEquals(3, ReportCommandTest.selfContainedImages(page).size(), "confusion, reliability, embedding");
        EvaluationFile f = EvaluationFile.read(evalDir.resolve(EvaluationFile.FILE));
        // The coloured confusion table holds every count of the file, row by row.
        String confusion = ReportCommandTest.section(page, "confusion");
        Matcher cells = Pattern.compile("<td class=\"cell\"[^>]*>(\\d*)</td>").matcher(confusion);
        List<Integer> values = new ArrayList<>();
        while (cells.find()) {
            values.add(cells.group(1).isEmpty() ? 0 : Integer.parseInt(cells.group(1)));
        }
        List<Integer> expected = new ArrayList<>();
        for (int[] row : f.confusion()) {
            Arrays.stream(row).forEach(expected::add);
        }
        assertEquals(expected, values);
        String perClass = ReportCommandTest.section(page, "per-class");
        assertEquals(f.classes().length, perClass.split("<tr><td class=\"num\">", -1).length - 1, "a row per class");
        String summary = ReportCommandTest.section(page, "summary");
        for (String line : f.summary()) {
            String name = line.substring(0, line.lastIndexOf(": "));
            String value = line.substring(line.lastIndexOf(": ") + 2);
            assertTrue(summary.contains("<th>" + ReportHtml.esc(name) + "</th><td>" + value + "</td>"), line);
        }
        String reliability = ReportCommandTest.section(page, "reliability");
        assertEquals(f.reliability().size(), reliability.split("<tr><td>\\[", -1).length - 1, "a row per bin");
    }

    @Test
    void modelOptionAndBrokenFilesAreRefusedInOneLine(@TempDir Path dir) throws Exception {
        DemoRun.Run m = DemoRun.winnow("report", evalDir.toString(), "--model", DemoRun.MODEL.toString(), "--out",
                dir.resolve("x.html").toString());
        assertEquals(2, m.exit());
        assertTrue(m.err().startsWith("winnow report: --model applies to a scan directory"), m.err());
        Path broken = dir.resolve("broken");
        Files.createDirectories(broken);
        Files.writeString(broken.resolve(EvaluationFile.FILE), "{\"formatVersion\": 1, \"kind\": \"something else\"}");
        DemoRun.Run b = DemoRun.winnow("report", broken.toString(), "--out", dir.resolve("y.html").toString());
        assertEquals(2, b.exit());
        assertTrue(b.err().startsWith("winnow report: " + broken.resolve(EvaluationFile.FILE) + ": "), b.err());
        assertEquals(1, b.err().strip().lines().count(), b.err());
        Path both = dir.resolve("both");
        Files.createDirectories(both);
        Files.copy(evalDir.resolve(EvaluationFile.FILE), both.resolve(EvaluationFile.FILE));
        Files.writeString(both.resolve(org.winnow.sink.ScanFiles.MANIFEST), "{}");
        DemoRun.Run t = DemoRun.winnow("report", both.toString(), "--out", dir.resolve("z.html").toString());
        assertEquals(2, t.exit());
        assertTrue(t.err().startsWith("winnow report: " + both + ": holds both "), t.err());
        assertFalse(Files.exists(dir.resolve("x.html")) || Files.exists(dir.resolve("y.html"))
                || Files.exists(dir.resolve("z.html")));
    }
}
