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
import org.winnow.app.WinnowCli;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;

class ReportCommandTest {
    @TempDir
    static Path shared;
    static Path scanDir;

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
        Path model = ScanFixtures.saveModel(shared);
        ScanFixtures.Input input = ScanFixtures.input(shared, 7, 300);
        scanDir = shared.resolve("scan");
        Run r = winnow("scan", "--model", model.toString(), "--input", input.file().toString(), "--keep", "h11=2..5",
                "--keep", "chi=-150..0", "--min-confidence", "0.5", "--novelty", "0.9", "--out", scanDir.toString(),
                "--threads", "2", "--lines-per-file", "40");
        assertEquals(0, r.exit(), r.err());
    }

    @Test
    void selfContainedPageWithEverySectionAndTheScansOwnCounts(@TempDir Path dir) throws Exception {
        Path html = dir.resolve("r/report.html");
        Run r = winnow("report", scanDir.toString(), "--out", html.toString(), "--top", "25");
        assertEquals(0, r.exit(), r.err());
        String page = Files.readString(html);
        Manifest m = Manifest.read(scanDir.resolve(ScanFiles.MANIFEST));

        // No scheme-qualified or protocol-relative address anywhere, and every src/href is inline or local.
        assertFalse(Pattern.compile("(?i)[a-z][a-z0-9+.-]*://").matcher(page).find(), "an address with a scheme");
        Matcher ref = Pattern.compile("(?i)\\b(src|href)\\s*=\\s*\"([^\"]*)\"").matcher(page);
        List<String> images = new ArrayList<>();
        while (ref.find()) {
            String target = ref.group(2);
            assertTrue(target.startsWith("data:image/png;base64,") || target.startsWith("#"), target);
            images.add(target);
        }
        assertFalse(Pattern.compile("(?i)@import|url\\(").matcher(page).find(), "a style that loads something");
        for (String id : ReportHtml.SECTIONS) {
            assertTrue(page.contains("<section id=\"" + id + "\">"), "section " + id);
        }
        // funnel, novelty and confidence each draw a picture when there are survivors
        assertTrue(m.counts().kept() > 0, "the fixture scan keeps something");
        assertEquals(3, images.size());
        for (String uri : images) {
            byte[] png = Base64.getDecoder().decode(uri.substring(uri.indexOf(',') + 1));
            var img = ImageIO.read(new ByteArrayInputStream(png));
            assertTrue(img != null && img.getWidth() > 0 && img.getHeight() > 0, "decodable PNG");
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

    @Test
    void aDirectoryWithoutManifestIsRefusedInOneLine(@TempDir Path dir) {
        Run r = winnow("report", dir.toString(), "--out", dir.resolve("x.html").toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().startsWith("winnow report: " + dir.resolve(ScanFiles.MANIFEST) + ": no manifest"), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertFalse(Files.exists(dir.resolve("x.html")));
    }
}
