package org.winnow.app.report;

import java.io.IOException;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.winnow.sink.Manifest;
import org.winnow.pipeline.PredictedValue;
import org.winnow.sink.SurvivorLine;

/**
 * Renders a {@link ScanResult} as one HTML page that needs nothing else: styles and the table sorter
 * are inline and every picture is a data URI, so the file can be mailed and opened offline.
 */
final class ReportHtml {
    /** The section ids, in page order; tests and readers find sections by them. */
    static final List<String> SECTIONS =
            List.of("summary", "funnel", "map", "novelty", "clusters", "confidence", "survivors");

    static final String STYLE = "body{font-family:sans-serif;max-width:1000px;margin:2em auto;color:#222}"
            + "table{border-collapse:collapse}td,th{border:1px solid #ccc;padding:2px 6px;font-size:13px}"
            + "th{background:#eee;cursor:pointer}td.num{text-align:right}img{max-width:100%}"
            + "code{font-size:12px}.warning{color:#a00}.needs-model{color:#666;font-style:italic}";

    // Sorts by the clicked column; numeric when both cells parse as numbers, text otherwise.
    static final String SORTER = "document.querySelectorAll('table.sortable').forEach(function(t){"
            + "t.querySelectorAll('th').forEach(function(th,col){th.addEventListener('click',function(){"
            + "var body=t.tBodies[0];var rows=Array.prototype.slice.call(body.rows);"
            + "var dir=th.dataset.dir==='asc'?-1:1;th.dataset.dir=dir===1?'asc':'desc';"
            + "rows.sort(function(a,b){var x=a.cells[col].textContent,y=b.cells[col].textContent;"
            + "var nx=parseFloat(x),ny=parseFloat(y);"
            + "if(!isNaN(nx)&&!isNaN(ny)){return dir*(nx-ny);}return dir*x.localeCompare(y);});"
            + "rows.forEach(function(r){body.appendChild(r);});});});});";

    private ReportHtml() {}

    /**
     * The page; {@code view} (null without a model) fills the map and the clusters, {@code top} caps the
     * survivors table (the most novel first).
     */
    static String render(ScanResult scan, ModelView view, String title, int top) throws IOException {
        Manifest m = scan.manifest();
        StringBuilder h = new StringBuilder(1 << 16);
        h.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>")
                .append(esc(title)).append("</title><style>").append(STYLE).append("</style></head><body>\n");
        h.append("<h1>").append(esc(title)).append("</h1>\n");
        summary(h, m);
        section(h, "funnel", "Rejection funnel");
        h.append("<p>Every scored candidate has exactly one reason.</p>\n");
        image(h, ReportCharts.funnel(m.counts().rejectedByReason(), m.counts().keptByReason()), "candidates by reason");
        h.append("</section>\n");
        double[] novelty = scan.survivors().stream().mapToDouble(SurvivorLine::novelty).toArray();
        double[] confidence = scan.survivors().stream().mapToDouble(SurvivorLine::confidence).toArray();
        map(h, view, m);
        histogramSection(h, "novelty", "Novelty of the survivors", novelty, "novelty");
        clusters(h, view, m);
        histogramSection(h, "confidence", "Confidence of the h11 predictions", confidence, "h11 confidence");
        bases(h, scan.survivors());
        survivors(h, scan.survivors(), top);
        h.append("<script>").append(SORTER).append("</script>\n</body></html>\n");
        return h.toString();
    }

    private static void summary(StringBuilder h, Manifest m) {
        section(h, "summary", "Run summary");
        Manifest.Counts c = m.counts();
        h.append("<table>\n");
        row(h, "run id", m.runId());
        row(h, "complete", m.complete() ? "yes" : "no (the scan has not finished; counts so far)");
        row(h, "input", m.source());
        row(h, "rules", String.join("; ", m.rules()));
        row(h, "model checksum", m.modelChecksum());
        row(h, "enumerated", Long.toString(c.enumerated()));
        row(h, "duplicates", Long.toString(c.duplicates()));
        row(h, "candidates", Long.toString(c.candidates()));
        row(h, "bad input lines", Long.toString(c.badInput()));
        row(h, "scored", Long.toString(c.scored()));
        row(h, "rejected", Long.toString(c.rejected()) + " (" + percent(c.rejected(), c.scored()) + ")");
        row(h, "kept", Long.toString(c.kept()) + " (" + percent(c.kept(), c.scored()) + ")");
        for (Map.Entry<String, Long> e : c.rejectedByReason().entrySet()) {
            row(h, "rejected: " + e.getKey(), Long.toString(e.getValue()));
        }
        for (Map.Entry<String, Long> e : c.keptByReason().entrySet()) {
            row(h, "kept: " + e.getKey(), Long.toString(e.getValue()));
        }
        Manifest.Timings t = m.timings();
        if (t != null) {
            row(h, "started", String.valueOf(t.startedAt()));
            row(h, "updated", String.valueOf(t.updatedAt()));
            row(h, "elapsed", String.format(Locale.ROOT, "%.2f s over %d session(s)", t.elapsedSeconds(), t.sessions()));
            row(h, "rate", String.format(Locale.ROOT, "%.1f candidates/s (last session)", t.candidatesPerSecond()));
        }
        h.append("</table>\n</section>\n");
    }

    private static void map(StringBuilder h, ModelView v, Manifest m) throws IOException {
        section(h, "map", "Embedding map");
        if (v == null) {
            needsModel(h, m);
        } else {
            modelNote(h, v, m);
            Projection p = v.projection();
            h.append(String.format(Locale.ROOT, "<p>The model's %d reference examples (coloured by their true h11) and "
                    + "%s survivors (coloured by their predicted h11), projected on the reference's two principal axes "
                    + "(variance %.4g and %.4g). Novel survivors (novelty at least %s, %s) are triangles, %s (%d of them "
                    + "kept only because they are novel; the others are in range or not confidently out of it); "
                    + "cluster medoids are diamonds labelled as in the clusters section.</p>%n", v.reference().size(),
                    drawn(v.others().size() + v.novel().size(), v.survivorsTotal()), p.variance()[0], p.variance()[1],
                    fmt(v.guard()), v.guardFromRules() ? "the run's guard" : "the default guard; the manifest records none",
                    drawn(v.novel().size(), v.novelTotal()), v.keptAsNovel()));
            image(h, ReportCharts.embeddingMap(v), "embedding map");
        }
        h.append("</section>\n");
    }

    private static void clusters(StringBuilder h, ModelView v, Manifest m) {
        section(h, "clusters", "Clusters of novel survivors");
        if (v == null) {
            needsModel(h, m);
        } else if (v.clusters() == null) {
            h.append("<p>The reference has fewer than two distinct embeddings, so it gives no spacing to derive a "
                    + "cluster radius from; no clusters computed.</p>\n");
        } else {
            NoveltyClusters c = v.clusters();
            h.append(String.format(Locale.ROOT, "<p>DBSCAN on the embeddings of %s novel survivors (novelty at least "
                    + "%s), Euclidean distance. Radius %.4g: the median distance from a reference example to its "
                    + "nearest other reference example. A core point has at least %d others within the radius, so a "
                    + "cluster has at least %d members. %d clusters hold %d novel survivors; %d are isolated.</p>%n",
                    drawn(v.novel().size(), v.novelTotal()), fmt(v.guard()), c.radius(), NoveltyClusters.MIN_NEIGHBOURS,
                    NoveltyClusters.MIN_NEIGHBOURS + 1, c.clusters().size(), c.clustered(), c.noise()));
            if (!c.clusters().isEmpty()) {
                h.append("<p>Each cluster is represented by its medoid, the member with the least summed distance to "
                        + "the others.</p>\n<table class=\"sortable\"><thead><tr><th>cluster</th><th>size</th>"
                        + "<th>medoid</th><th>chi</th><th>h11 (predicted)</th><th>novelty</th>"
                        + "<th>predicted h11 of members</th><th>mean novelty</th><th>nearest reference</th>"
                        + "</tr></thead><tbody>\n");
                int k = 1;
                for (NoveltyClusters.Group g : c.clusters()) {
                    SurvivorLine s = v.novelLines().get(g.medoid());
                    int lo = Integer.MAX_VALUE;
                    int hi = Integer.MIN_VALUE;
                    double sum = 0;
                    for (int i : g.members()) {
                        SurvivorLine x = v.novelLines().get(i);
                        lo = Math.min(lo, x.h11());
                        hi = Math.max(hi, x.h11());
                        sum += x.novelty();
                    }
                    h.append("<tr><td>C").append(k++).append("</td>");
                    num(h, Integer.toString(g.size()));
                    h.append("<td><code>").append(esc(s.config())).append("</code></td>");
                    num(h, Long.toString(s.chi()));
                    num(h, Integer.toString(s.h11()));
                    num(h, String.format(Locale.ROOT, "%.4f", s.novelty()));
                    num(h, lo == hi ? Integer.toString(lo) : lo + ".." + hi);
                    num(h, String.format(Locale.ROOT, "%.4f", sum / g.size()));
                    h.append("<td><code>").append(esc(s.nearestReference().isEmpty() ? SurvivorLine.UNDETERMINED
                            : s.nearestReference())).append("</code></td></tr>\n");
                }
                h.append("</tbody></table>\n");
            }
        }
        h.append("</section>\n");
    }

    private static void needsModel(StringBuilder h, Manifest m) {
        h.append("<p class=\"needs-model\">This section needs the model: run <code>winnow report DIR --model M.wnm "
                + "--out report.html</code> with the run's model (checksum <code>").append(esc(m.modelChecksum()))
                .append("</code>).</p>\n");
    }

    private static void modelNote(StringBuilder h, ModelView v, Manifest m) {
        if (!v.sameModel()) {
            h.append("<p class=\"warning\"><b>Another model.</b> The embeddings come from model <code>")
                    .append(esc(v.model())).append("</code>, but the run was scored with <code>")
                    .append(esc(m.modelChecksum())).append("</code>; predictions and novelty are the run's.</p>\n");
        }
    }

    private static String drawn(int shown, int total) {
        return shown == total ? Integer.toString(total) : shown + " (an even sample) of " + total;
    }

    private static String fmt(double x) {
        return java.math.BigDecimal.valueOf(x).stripTrailingZeros().toPlainString();
    }

    private static void histogramSection(StringBuilder h, String id, String heading, double[] values, String axis)
            throws IOException {
        section(h, id, heading);
        if (values.length == 0) {
            h.append("<p>No survivors, so nothing to show.</p>\n");
        } else {
            h.append(String.format(Locale.ROOT, "<p>%d survivors; median %.3f.</p>%n", values.length, median(values)));
            image(h, ReportCharts.histogram(values, heading, axis), heading);
        }
        h.append("</section>\n");
    }

    /** How each predicted value of the survivors is known: proved, bounded or estimated, counted. */
    static void bases(StringBuilder h, List<SurvivorLine> all) {
        section(h, "bases", "How the survivors' values are known");
        h.append("<p>Proved values are theorems (confidence 1); bounded ones lie in a proved interval; estimated ones"
                + " rest on the model alone, and their confidence stays below 1.</p>\n");
        h.append("<table><thead><tr><th>value</th><th>proved</th><th>bounded</th><th>estimated</th>"
                + "<th>not determined</th></tr></thead><tbody>\n");
        String[] names = {"h11", "h21", "h31", "h22"};
        for (int i = 0; i < names.length; i++) {
            long[] n = new long[4];
            for (SurvivorLine x : all) {
                PredictedValue v = new PredictedValue[] {x.h11Value(), x.h21Value(), x.h31Value(), x.h22Value()}[i];
                n[v == null ? 3 : v.basis().ordinal()]++;
            }
            h.append("<tr><td>").append(names[i]).append("</td>");
            for (long c : n) {
                num(h, Long.toString(c));
            }
            h.append("</tr>\n");
        }
        h.append("</tbody></table>\n</section>\n");
    }

    private static void survivors(StringBuilder h, List<SurvivorLine> all, int top) {
        section(h, "survivors", "Top survivors");
        List<SurvivorLine> shown = all.stream()
                .sorted(Comparator.comparingDouble(SurvivorLine::novelty).reversed()
                        .thenComparing(SurvivorLine::config))
                .limit(top).toList();
        h.append(String.format(Locale.ROOT,
                "<p>The %d most novel of %d survivors; click a column heading to sort.</p>%n", shown.size(), all.size()));
        h.append("<table class=\"sortable\"><thead><tr>");
        for (String col : SurvivorLine.COLUMNS.split("\t")) {
            h.append("<th>").append(esc(col)).append("</th>");
        }
        h.append("</tr></thead><tbody>\n");
        for (SurvivorLine s : shown) {
            h.append("<tr><td><code>").append(esc(s.config())).append("</code></td>");
            num(h, Long.toString(s.chi()));
            for (PredictedValue v : new PredictedValue[] {s.h11Value(), s.h21Value(), s.h31Value(), s.h22Value()}) {
                // Each value with how it is known: proved, bounded LO..HI or estimated, and its confidence.
                num(h, v == null ? SurvivorLine.UNDETERMINED : Long.toString(v.value()));
                h.append("<td>").append(esc(v == null ? SurvivorLine.UNDETERMINED : v.describeBasis())).append("</td>");
                num(h, v == null ? SurvivorLine.UNDETERMINED : String.format(Locale.ROOT, "%.4f", v.confidence()));
            }
            num(h, String.format(Locale.ROOT, "%.4f", s.novelty()));
            h.append("<td>").append(esc(s.keptBecause().code())).append("</td><td><code>")
                    .append(esc(s.nearestReference().isEmpty() ? SurvivorLine.UNDETERMINED : s.nearestReference()))
                    .append("</code></td></tr>\n");
        }
        h.append("</tbody></table>\n</section>\n");
    }

    static void section(StringBuilder h, String id, String heading) {
        h.append("<section id=\"").append(id).append("\"><h2>").append(esc(heading)).append("</h2>\n");
    }

    static void row(StringBuilder h, String name, String value) {
        h.append("<tr><th>").append(esc(name)).append("</th><td>").append(esc(value)).append("</td></tr>\n");
    }

    static void num(StringBuilder h, String value) {
        h.append("<td class=\"num\">").append(esc(value)).append("</td>");
    }

    static void image(StringBuilder h, String dataUri, String alt) {
        h.append("<img alt=\"").append(esc(alt)).append("\" src=\"").append(dataUri).append("\">\n");
    }

    private static String percent(long part, long whole) {
        return whole == 0 ? "-" : String.format(Locale.ROOT, "%.1f%%", 100.0 * part / whole);
    }

    private static double median(double[] values) {
        double[] s = values.clone();
        java.util.Arrays.sort(s);
        int n = s.length;
        return n % 2 == 1 ? s[n / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
    }

    static String esc(String s) {
        StringBuilder b = new StringBuilder(s.length());
        for (char ch : s.toCharArray()) {
            switch (ch) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                default -> b.append(ch);
            }
        }
        return b.toString();
    }
}
