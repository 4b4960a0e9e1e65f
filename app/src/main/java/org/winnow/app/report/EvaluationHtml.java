package org.winnow.app.report;

import java.awt.Color;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Base64;
import java.util.List;
import java.util.Locale;

/**
 * Renders an {@link EvaluationFile} as one self-contained HTML page: the summary, per-class recall and
 * precision, the confusion matrix (the picture {@code winnow evaluate} drew, inlined, and a coloured
 * table), the reliability diagram and the embedding picture.
 */
final class EvaluationHtml {
    /** The section ids, in page order. */
    static final List<String> SECTIONS = List.of("summary", "per-class", "confusion", "reliability", "embedding");

    /** The largest picture inlined; {@code winnow evaluate} draws them at well under 1 MB. */
    static final long MAX_PICTURE_BYTES = 16L << 20;
    private static final byte[] PNG_SIGNATURE = {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1A, '\n'};

    private EvaluationHtml() {}

    /** The page; pictures named in the file are read relative to {@code dir}. */
    static String render(EvaluationFile e, Path dir, String title) throws IOException {
        StringBuilder h = new StringBuilder(1 << 16);
        h.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>")
                .append(ReportHtml.esc(title)).append("</title><style>").append(ReportHtml.STYLE)
                .append("td.cell{text-align:right;min-width:2.2em}</style></head><body>\n");
        h.append("<h1>").append(ReportHtml.esc(title)).append("</h1>\n");
        summary(h, e);
        perClass(h, e);
        confusion(h, e, dir);
        reliability(h, e);
        ReportHtml.section(h, "embedding", "Embedding of the test rows");
        picture(h, dir, e.embeddingPlot(), "embedding of the test rows, coloured by true h11");
        h.append("</section>\n<script>").append(ReportHtml.SORTER).append("</script>\n</body></html>\n");
        return h.toString();
    }

    private static void summary(StringBuilder h, EvaluationFile e) {
        ReportHtml.section(h, "summary", "Summary");
        h.append("<table>\n");
        ReportHtml.row(h, "model", e.model());
        ReportHtml.row(h, "model checksum", e.modelChecksum());
        ReportHtml.row(h, "model reference examples", Integer.toString(e.modelReference()));
        ReportHtml.row(h, "test file", e.testFile());
        ReportHtml.row(h, "test rows scored", Integer.toString(e.testRows()));
        ReportHtml.row(h, "skipped: in the model's reference", Integer.toString(e.inModelReference()));
        ReportHtml.row(h, "skipped: bounded rows", Integer.toString(e.boundedSkipped()));
        for (String line : e.summary()) {
            int colon = line.lastIndexOf(": ");
            if (colon > 0) {
                ReportHtml.row(h, line.substring(0, colon), line.substring(colon + 2));
            } else {
                ReportHtml.row(h, line, "");
            }
        }
        ReportHtml.row(h, "scoring", String.format(Locale.ROOT, "%.2f s", e.scoringSeconds()));
        h.append("</table>\n</section>\n");
    }

    private static void perClass(StringBuilder h, EvaluationFile e) {
        ReportHtml.section(h, "per-class", "Recall and precision per class");
        h.append("<p>Recall: the share of a class's true members predicted as that class; precision: the share of "
                + "the predictions of a class that are right. \"n/a\" where a class has no members or is never "
                + "predicted. Click a column heading to sort.</p>\n");
        h.append("<table class=\"sortable\"><thead><tr><th>h11</th><th>true members</th><th>predicted</th>"
                + "<th>recall</th><th>precision</th></tr></thead><tbody>\n");
        int n = e.classes().length;
        for (int c = 0; c < n; c++) {
            int predicted = 0;
            for (int t = 0; t < n; t++) {
                predicted += e.confusion()[t][c];
            }
            h.append("<tr>");
            ReportHtml.num(h, Integer.toString(e.classes()[c]));
            ReportHtml.num(h, Integer.toString(e.support()[c]));
            ReportHtml.num(h, Integer.toString(predicted));
            ReportHtml.num(h, share(e.recall()[c]));
            ReportHtml.num(h, share(e.precision()[c]));
            h.append("</tr>\n");
        }
        h.append("</tbody></table>\n</section>\n");
    }

    private static void confusion(StringBuilder h, EvaluationFile e, Path dir) {
        ReportHtml.section(h, "confusion", "Confusion matrix");
        picture(h, dir, e.confusionPlot(), "confusion matrix");
        h.append("<p>Rows: true h11; columns: predicted h11. A cell's shade is its share of the row (the true "
                + "class), blue on the diagonal and red off it.</p>\n<table class=\"confusion\"><tr><th>true \\ "
                + "predicted</th>");
        int n = e.classes().length;
        for (int c : e.classes()) {
            h.append("<th>").append(c).append("</th>");
        }
        h.append("</tr>\n");
        for (int t = 0; t < n; t++) {
            h.append("<tr><th>").append(e.classes()[t]).append("</th>");
            int row = 0;
            for (int p = 0; p < n; p++) {
                row += e.confusion()[t][p];
            }
            for (int p = 0; p < n; p++) {
                int v = e.confusion()[t][p];
                double f = row == 0 ? 0 : v / (double) row;
                Color base = t == p ? new Color(0x2471A3) : new Color(0xC0392B);
                h.append(String.format(Locale.ROOT, "<td class=\"cell\" style=\"background:%s;color:%s\">%s</td>",
                        hex(blend(base, f)), f > 0.5 ? "#fff" : "#222", v == 0 ? "" : Integer.toString(v)));
            }
            h.append("</tr>\n");
        }
        h.append("</table>\n</section>\n");
    }

    private static void reliability(StringBuilder h, EvaluationFile e) throws IOException {
        ReportHtml.section(h, "reliability", "Reliability diagram");
        h.append("<p>Each bar spans a band of stated confidence and rises to the observed accuracy of the "
                + "predictions in it; the dots sit at the band's mean confidence. A model whose confidence means "
                + "what it says keeps its dots on the diagonal.</p>\n");
        boolean any = e.reliability().stream().anyMatch(b -> b.count() > 0);
        if (any) {
            ReportHtml.image(h, ReportCharts.reliability(e.reliability()), "reliability diagram");
        } else {
            h.append("<p>No known-class examples, so nothing to show.</p>\n");
        }
        h.append("<table><thead><tr><th>confidence</th><th>n</th><th>mean confidence</th><th>accuracy</th>"
                + "</tr></thead><tbody>\n");
        for (EvaluationFile.Bin b : e.reliability()) {
            h.append("<tr><td>").append(String.format(Locale.ROOT, "[%.2f, %.2f%s", b.low(), b.high(),
                    b.high() == 1.0 ? "]" : ")")).append("</td>");
            ReportHtml.num(h, Integer.toString(b.count()));
            ReportHtml.num(h, share(b.meanConfidence()));
            ReportHtml.num(h, share(b.accuracy()));
            h.append("</tr>\n");
        }
        h.append("</tbody></table>\n</section>\n");
    }

    /** Inlines a PNG the evaluation wrote, or says why it cannot. */
    private static void picture(StringBuilder h, Path dir, String name, String alt) {
        if (name == null) {
            h.append("<p>The evaluation names no picture here.</p>\n");
            return;
        }
        byte[] png;
        try {
            Path f = dir.resolve(name);
            // The file names the picture, so a hand-made one could name /dev/zero or a huge file: read only
            // a regular file of picture size that starts like a PNG.
            if (!Files.isRegularFile(f) || Files.size(f) > MAX_PICTURE_BYTES) {
                throw new IOException("not a regular file of at most " + MAX_PICTURE_BYTES + " bytes");
            }
            png = Files.readAllBytes(f);
            if (png.length < PNG_SIGNATURE.length || !Arrays.equals(png, 0, PNG_SIGNATURE.length, PNG_SIGNATURE, 0,
                    PNG_SIGNATURE.length)) {
                throw new IOException("not a PNG picture");
            }
        } catch (IOException | java.nio.file.InvalidPathException ex) {
            h.append("<p class=\"warning\">The picture <code>").append(ReportHtml.esc(name))
                    .append("</code> cannot be read (").append(ReportHtml.esc(String.valueOf(ex.getMessage())))
                    .append(").</p>\n");
            return;
        }
        ReportHtml.image(h, "data:image/png;base64," + Base64.getEncoder().encodeToString(png), alt);
    }

    private static String share(Double v) {
        return v == null ? "n/a" : String.format(Locale.ROOT, "%.4f", v);
    }

    private static Color blend(Color c, double f) {
        double w = Math.min(1, Math.max(0, f)) * 0.85;
        return new Color((int) Math.round(255 + (c.getRed() - 255) * w), (int) Math.round(255 + (c.getGreen() - 255) * w),
                (int) Math.round(255 + (c.getBlue() - 255) * w));
    }

    private static String hex(Color c) {
        return String.format(Locale.ROOT, "#%02x%02x%02x", c.getRed(), c.getGreen(), c.getBlue());
    }
}
