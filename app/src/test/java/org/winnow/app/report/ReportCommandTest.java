package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.WinnowCli;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.pipeline.Reason;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SurvivorLine;

class ReportCommandTest {
    @TempDir
    static Path shared;
    static Path scanDir;
    static Path model;

    private record Run(int exit, String out, String err) {}

    private static Run winnow(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        var cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    @BeforeAll
    static void scan() throws Exception {
        model = ScanFixtures.saveModel(shared);
        ScanFixtures.Input input = ScanFixtures.input(shared, 7, 300);
        scanDir = shared.resolve("scan");
        Run r = winnow("scan", "--model", model.toString(), "--input", input.file().toString(), "--keep", "h11=2..5",
                "--keep", "chi=-150..0", "--min-confidence", "0.5", "--novelty", "0.9", "--out", scanDir.toString(),
                "--threads", "2", "--lines-per-file", "40");
        assertEquals(0, r.exit(), r.err());
        // The same scan with a model file that is gone afterwards: the report has no model to draw with.
        Path gone = shared.resolve("gone.wnm");
        Files.copy(model, gone);
        orphanDir = shared.resolve("orphan");
        Run o = winnow("scan", "--model", gone.toString(), "--input", input.file().toString(), "--keep", "h11=2..5",
                "--keep", "chi=-150..0", "--min-confidence", "0.5", "--novelty", "0.9", "--out", orphanDir.toString(),
                "--threads", "2", "--lines-per-file", "40");
        assertEquals(0, o.exit(), o.err());
        Files.delete(gone);
    }

    static Path orphanDir;

    @Test
    void selfContainedPageWithEverySectionAndTheScansOwnCounts(@TempDir Path dir) throws Exception {
        Path html = dir.resolve("r/report.html");
        Run r = winnow("report", orphanDir.toString(), "--out", html.toString(), "--top", "25");
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().contains("gone.wnm is no longer there; no embedding map (give --model M.wnm)"), r.err());
        String page = Files.readString(html);
        Manifest m = Manifest.read(orphanDir.resolve(ScanFiles.MANIFEST));

        List<String> images = selfContainedImages(page);
        for (String id : ReportHtml.SECTIONS) {
            assertTrue(page.contains("<section id=\"" + id + "\">"), "section " + id);
        }
        // funnel, novelty and confidence each draw a picture when there are survivors; map and clusters need --model
        assertTrue(m.counts().kept() > 0, "the fixture scan keeps something");
        assertEquals(3, images.size());
        for (String id : List.of("map", "clusters")) {
            assertTrue(section(page, id).contains("This section needs the model: run <code>winnow report DIR --model"),
                    id + " says it needs --model");
        }
        assertTrue(page.contains("<td>" + m.modelChecksum() + "</td>"), "model checksum in the summary");
        assertTrue(page.contains("<th>scored</th><td>" + m.counts().scored() + "</td>"));
        assertTrue(page.contains("<th>kept</th><td>" + m.counts().kept() + " ("));
        assertTrue(page.contains("The " + Math.min(25, m.counts().kept()) + " most novel of " + m.counts().kept()
                + " survivors"), "table caption counts every survivor line");
        int rows = page.split("<tr><td><code>", -1).length - 1;
        assertEquals(Math.min(25, m.counts().kept()), rows);
        assertTrue(r.out().contains("report: " + html), r.out());
    }

    /**
     * {@code winnow report} used to need {@code --model} for the map although the scan knows its model: now
     * the model file the manifest names is used when its checksum still matches.
     */
    @Test
    void withoutModelOptionTheScansOwnModelDrawsTheMap(@TempDir Path dir) throws Exception {
        Path html = dir.resolve("report.html");
        Run r = winnow("report", scanDir.toString(), "--out", html.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().contains("embedding map with the scan's model " + model.toAbsolutePath().normalize()), r.err());
        assertFalse(Files.readString(html).contains("needs the model"));
    }

    /**
     * {@code winnow report} on the directory given to {@code winnow demo --out} used to refuse: the scan sits
     * one level down. A single scan below is found; two are refused, naming them.
     */
    @Test
    void aScanOneLevelDownIsFoundAndTwoAreRefused(@TempDir Path dir) throws Exception {
        Path outer = dir.resolve("outer");
        copy(scanDir, outer.resolve("scan"));
        Path html = dir.resolve("report.html");
        Run r = winnow("report", outer.toString(), "--out", html.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().contains(outer + " holds no scan itself; reporting on " + outer.resolve("scan")), r.err());
        copy(scanDir, outer.resolve("second"));
        Run two = winnow("report", outer.toString(), "--out", html.toString());
        assertEquals(2, two.exit());
        assertTrue(two.err().startsWith("winnow report: " + outer + ": holds 2 scans"), two.err());
    }

    /** A committed part cut after the scan is refused in one line naming it, not reported on. */
    @Test
    void aDamagedPartIsRefusedNamingIt(@TempDir Path dir) throws Exception {
        Path copy = dir.resolve("scan");
        copy(scanDir, copy);
        Path part = copy.resolve("survivors-00001.tsv");
        byte[] b = Files.readAllBytes(part);
        Files.write(part, java.util.Arrays.copyOf(b, b.length - 10));
        Run r = winnow("report", copy.toString(), "--out", dir.resolve("r.html").toString());
        assertEquals(2, r.exit());
        assertEquals("winnow report: " + part + ": " + (b.length - 10) + " bytes, but the manifest records " + b.length
                + " for this sealed part; it was cut, extended or replaced\n", r.err());
        assertFalse(Files.exists(dir.resolve("r.html")));
    }

    private static void copy(Path from, Path to) throws java.io.IOException {
        Files.createDirectories(to);
        try (var s = Files.list(from)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                if (Files.isRegularFile(p)) {
                    Files.copy(p, to.resolve(p.getFileName()));
                }
            }
        }
    }

    @Test
    void withTheModelTheMapAndTheClustersOfNovelSurvivorsAppear(@TempDir Path dir) throws Exception {
        Path html = dir.resolve("report.html");
        Run r = winnow("report", scanDir.toString(), "--model", model.toString(), "--out", html.toString());
        assertEquals(0, r.exit(), r.err());
        assertEquals("", r.err(), "the run's own model gives no warning");
        String page = Files.readString(html);
        for (String id : ReportHtml.SECTIONS) {
            assertTrue(page.contains("<section id=\"" + id + "\">"), "section " + id);
        }
        assertFalse(page.contains("needs the model"));
        assertEquals(4, selfContainedImages(page).size(), "funnel, map, novelty, confidence");

        // The fixture scan ran with --novelty 0.9: the report reads that guard from the manifest.
        List<SurvivorLine> survivors = ScanResult.read(scanDir).survivors();
        List<SurvivorLine> novel = survivors.stream().filter(s -> s.novelty() >= 0.9).toList();
        assertFalse(novel.isEmpty(), "the fixture has novel survivors");
        String map = section(page, "map");
        FrozenModel fm = FrozenModel.load(model);
        assertTrue(map.contains("The model's " + fm.reference().size() + " reference examples"), map);
        assertTrue(map.contains(survivors.size() + " survivors (coloured by their predicted h11)"), map);
        long keptAsNovel = novel.stream().filter(s -> s.keptBecause() == Reason.KEPT_AS_NOVEL).count();
        assertTrue(map.contains("(novelty at least 0.9, the run's guard) are triangles, " + novel.size() + " ("
                + keptAsNovel + " of them kept only because they are novel"), map);

        String clusters = section(page, "clusters");
        Matcher counts = Pattern.compile("(\\d+) clusters hold (\\d+) novel survivors; (\\d+) are isolated")
                .matcher(clusters);
        assertTrue(counts.find(), clusters);
        int k = Integer.parseInt(counts.group(1));
        int held = Integer.parseInt(counts.group(2));
        assertEquals(novel.size(), held + Integer.parseInt(counts.group(3)));
        Matcher row = Pattern.compile("<tr><td>C(\\d+)</td><td class=\"num\">(\\d+)</td><td><code>([^<]*)</code>")
                .matcher(clusters);
        int rows = 0;
        int sum = 0;
        java.util.Set<String> novelConfigs = new java.util.HashSet<>();
        novel.forEach(s -> novelConfigs.add(s.config()));
        while (row.find()) {
            rows++;
            assertEquals(rows, Integer.parseInt(row.group(1)));
            sum += Integer.parseInt(row.group(2));
            assertTrue(Integer.parseInt(row.group(2)) >= 3, "a cluster has at least three members");
            assertTrue(novelConfigs.contains(row.group(3)), "the medoid is a novel survivor: " + row.group(3));
        }
        assertEquals(k, rows);
        assertEquals(held, sum);
        // The radius printed is the reference's median nearest-neighbour spacing, recomputed here by brute force.
        int d = fm.reference().dim();
        double[][] ref = new double[fm.reference().size()][];
        for (int i = 0; i < ref.length; i++) {
            ref[i] = java.util.Arrays.copyOfRange(fm.reference().embeddings(), i * d, (i + 1) * d);
        }
        assertTrue(clusters.contains(String.format(java.util.Locale.ROOT, "Radius %.4g:", NoveltyClusters.spacing(ref, ref))),
                clusters);
    }

    @Test
    void anotherModelIsNamedInAWarning(@TempDir Path dir) throws Exception {
        Path other = dir.resolve("other.wnm");
        FrozenModel fm = FrozenModel.load(model);
        fm.withMetadata(fm.metadata().withEvaluation("changed")).save(other);
        Path html = dir.resolve("report.html");
        Run r = winnow("report", scanDir.toString(), "--model", other.toString(), "--out", html.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().startsWith("winnow report: warning: " + other + " has checksum "), r.err());
        assertTrue(section(Files.readString(html), "map").contains("<b>Another model.</b>"));
    }

    @Test
    void aMissingModelIsRefusedInOneLine(@TempDir Path dir) {
        Run r = winnow("report", scanDir.toString(), "--model", dir.resolve("none.wnm").toString(), "--out",
                dir.resolve("x.html").toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().startsWith("winnow report: "), r.err());
        assertTrue(r.err().contains("none.wnm"), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertFalse(Files.exists(dir.resolve("x.html")));
        Run cap = winnow("report", scanDir.toString(), "--model", model.toString(), "--max-map-points", "0", "--out",
                dir.resolve("x.html").toString());
        assertEquals(2, cap.exit());
        assertEquals("winnow report: --max-map-points 0: must be at least 1", cap.err().strip());
        assertFalse(Files.exists(dir.resolve("x.html")));
    }

    /** The page between {@code <section id="id">} and its end. */
    static String section(String page, String id) {
        int a = page.indexOf("<section id=\"" + id + "\">");
        assertTrue(a >= 0, "section " + id);
        return page.substring(a, page.indexOf("</section>", a));
    }

    /**
     * Asserts that the page loads nothing: no scheme-qualified or protocol-relative address, every
     * src/href inline or a fragment, no style import; returns the image data URIs, each a decodable PNG.
     */
    static List<String> selfContainedImages(String page) throws java.io.IOException {
        assertFalse(Pattern.compile("(?i)[a-z][a-z0-9+.-]*://").matcher(page).find(), "an address with a scheme");
        assertFalse(Pattern.compile("(?i)(src|href)\\s*=\\s*[\"']?//").matcher(page).find(), "a protocol-relative address");
        Matcher ref = Pattern.compile("(?i)\\b(src|href)\\s*=\\s*\"([^\"]*)\"").matcher(page);
        List<String> images = new ArrayList<>();
        while (ref.find()) {
            String target = ref.group(2);
            assertTrue(target.startsWith("data:image/png;base64,") || target.startsWith("#"), target);
            if (target.startsWith("data:")) {
                images.add(target);
            }
        }
        assertFalse(Pattern.compile("(?i)@import|url\\(").matcher(page).find(), "a style that loads something");
        for (String uri : images) {
            byte[] png = Base64.getDecoder().decode(uri.substring(uri.indexOf(',') + 1));
            var img = ImageIO.read(new ByteArrayInputStream(png));
            assertTrue(img != null && img.getWidth() > 0 && img.getHeight() > 0, "decodable PNG");
        }
        return images;
    }

    @Test
    void aDirectoryWithoutManifestIsRefusedInOneLine(@TempDir Path dir) {
        Run r = winnow("report", dir.toString(), "--out", dir.resolve("x.html").toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().startsWith("winnow report: " + dir.resolve(ScanFiles.MANIFEST) + ": no manifest"), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertFalse(Files.exists(dir.resolve("x.html")));
    }
}
