package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The reports of a demo-like scan (with --model) and of an evaluation, rendered in headless Chromium:
 * every section is in the DOM after the scripts ran, every picture decodes to a nonzero size in the
 * browser, the table sorter works, no script error is raised, and a screenshot comes out. Skipped
 * when no Chromium is installed.
 */
class ReportBrowserTest {
    /**
     * Appended to a copy of the page (the page itself stays as shipped): on load, record each image's
     * natural size and any script error, then sort the survivors table by chi and record the column.
     */
    private static final String PROBE = "<script>var probeErrors=[];window.addEventListener('error',function(e){"
            + "probeErrors.push(String(e.message));});window.addEventListener('load',function(){var s=[];"
            + "document.querySelectorAll('img').forEach(function(i){s.push(i.naturalWidth+'x'+i.naturalHeight);});"
            + "document.body.setAttribute('data-image-sizes',s.join(' '));"
            + "var t=document.querySelector('#survivors table.sortable');if(t){t.querySelectorAll('th')[1].click();"
            + "var c=[];Array.prototype.forEach.call(t.tBodies[0].rows,function(r){c.push(r.cells[1].textContent);});"
            + "document.body.setAttribute('data-sorted-chi',c.join(' '));}"
            + "document.body.setAttribute('data-errors',probeErrors.join('|'));"
            + "document.body.setAttribute('data-probe','done');});</script>";

    @TempDir
    static Path shared;
    static HeadlessChromium browser;
    static Path scanReport;
    static Path evalReport;

    @BeforeAll
    static void render() throws Exception {
        browser = HeadlessChromium.find(shared).orElse(null);
        Assumptions.assumeTrue(browser != null, "no chromium installed; the browser checks are skipped");
        DemoRun.Outputs run = DemoRun.shared();
        Path scan = run.scan();
        Path eval = run.evaluation();
        scanReport = shared.resolve("scan.html");
        evalReport = shared.resolve("eval.html");
        DemoRun.Run r = DemoRun.winnow("report", scan.toString(), "--model", DemoRun.MODEL.toString(), "--out",
                scanReport.toString());
        assertEquals(0, r.exit(), r.err());
        DemoRun.Run e = DemoRun.winnow("report", eval.toString(), "--out", evalReport.toString());
        assertEquals(0, e.exit(), e.err());
    }

    @Test
    void theScanReportShowsEverySectionAndPictureInTheBrowser() throws Exception {
        String page = Files.readString(scanReport);
        ReportCommandTest.selfContainedImages(page);
        String dom = checkInBrowser(scanReport, ReportHtml.SECTIONS, 4);
        assertFalse(dom.contains("needs the model"), "with --model every section has its content");
        Matcher chi = Pattern.compile("data-sorted-chi=\"([^\"]*)\"").matcher(dom);
        assertTrue(chi.find(), "the sorter ran");
        long previous = Long.MIN_VALUE;
        String[] values = chi.group(1).trim().split(" ");
        assertTrue(values.length > 1, "the table has rows to sort");
        for (String v : values) {
            long x = Long.parseLong(v);
            assertTrue(x >= previous, "chi ascending after one click: " + chi.group(1));
            previous = x;
        }
    }

    @Test
    void theEvaluationReportShowsEverySectionAndPictureInTheBrowser() throws Exception {
        ReportCommandTest.selfContainedImages(Files.readString(evalReport));
        checkInBrowser(evalReport, EvaluationHtml.SECTIONS, 3);
    }

    @Test
    void screenshotsComeOutAtTheWindowSize() throws Exception {
        for (Path html : List.of(scanReport, evalReport)) {
            Path png = shared.resolve(html.getFileName() + ".png");
            browser.screenshot(html, png, 1000, 1400);
            assertTrue(Files.size(png) > 0, "a screenshot of " + html);
            BufferedImage img = ImageIO.read(png.toFile());
            assertEquals(1000, img.getWidth());
            assertEquals(1400, img.getHeight());
            // not a blank page: the rendered report has both light and dark pixels
            boolean dark = false;
            for (int y = 0; y < img.getHeight() && !dark; y += 3) {
                for (int x = 0; x < img.getWidth() && !dark; x += 3) {
                    dark = (img.getRGB(x, y) & 0xFF) < 64;
                }
            }
            assertTrue(dark, "the screenshot shows something");
        }
    }

    /** Loads a probed copy of the page, checks sections and image sizes, and returns the DOM. */
    private static String checkInBrowser(Path html, List<String> sections, int images) throws Exception {
        String page = Files.readString(html);
        Path probed = html.resolveSibling("probed-" + html.getFileName());
        Files.writeString(probed, page.replace("</body>", PROBE + "</body>"));
        String dom = browser.dumpDom(probed);
        assertTrue(dom.contains("data-probe=\"done\""), "the page's load event fired and scripts ran");
        Matcher errors = Pattern.compile("data-errors=\"([^\"]*)\"").matcher(dom);
        assertTrue(errors.find() && errors.group(1).isEmpty(), "script errors: " + (errors.find(0) ? errors.group(1) : "?"));
        for (String id : sections) {
            Matcher s = Pattern.compile("<section id=\"" + Pattern.quote(id) + "\"><h2>[^<]+</h2>").matcher(dom);
            assertTrue(s.find(), "section " + id + " with its heading in the rendered DOM");
        }
        Matcher sizes = Pattern.compile("data-image-sizes=\"([^\"]*)\"").matcher(dom);
        assertTrue(sizes.find(), "image sizes recorded");
        String[] each = sizes.group(1).trim().split(" ");
        assertEquals(images, each.length, "pictures in " + html.getFileName() + ": " + sizes.group(1));
        for (String wh : each) {
            String[] p = wh.split("x");
            assertTrue(Integer.parseInt(p[0]) > 0 && Integer.parseInt(p[1]) > 0, "image natural size " + wh);
        }
        return dom;
    }
}
