package org.winnow.app.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Paint;
import java.awt.Shape;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Path2D;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import java.util.Map;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.annotations.XYTextAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.DatasetRenderingOrder;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.SeriesRenderingOrder;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.LookupPaintScale;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.PaintScaleLegend;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.category.DefaultCategoryDataset;
import org.jfree.data.statistics.HistogramDataset;
import org.jfree.data.xy.XYIntervalSeries;
import org.jfree.data.xy.XYIntervalSeriesCollection;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;

/** The report's pictures, drawn headless with JFreeChart and returned as PNG data URIs. */
final class ReportCharts {
    private static final int WIDTH = 900;
    private static final int HEIGHT = 420;

    private ReportCharts() {}

    /** Horizontal bars, one per reason, in two series: rejected and kept. */
    static String funnel(Map<String, Long> rejected, Map<String, Long> kept) throws IOException {
        DefaultCategoryDataset data = new DefaultCategoryDataset();
        rejected.forEach((reason, n) -> data.addValue(n, "rejected", reason));
        kept.forEach((reason, n) -> data.addValue(n, "kept", reason));
        JFreeChart chart = ChartFactory.createBarChart("candidates by reason", "reason", "candidates", data,
                PlotOrientation.HORIZONTAL, true, false, false);
        CategoryPlot plot = chart.getCategoryPlot();
        plot.setBackgroundPaint(Color.WHITE);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        plot.getRenderer().setSeriesPaint(0, new Color(0xC0392B));
        plot.getRenderer().setSeriesPaint(1, new Color(0x2471A3));
        return dataUri(chart);
    }

    /** A histogram of {@code values} on [0, 1]; {@code values} must not be empty. */
    static String histogram(double[] values, String title, String axis) throws IOException {
        HistogramDataset data = new HistogramDataset();
        data.addSeries(axis, values, 20, 0.0, 1.0);
        JFreeChart chart = ChartFactory.createHistogram(title, axis, "survivors", data, PlotOrientation.VERTICAL,
                false, false, false);
        XYPlot plot = chart.getXYPlot();
        plot.setBackgroundPaint(Color.WHITE);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        plot.getRenderer().setSeriesPaint(0, new Color(0x2471A3));
        return dataUri(chart);
    }

    /**
     * The embedding map: survivors below the guard as small dots, reference examples as circles,
     * novel survivors as triangles with a dark edge and cluster medoids as large diamonds labelled
     * C1, C2, ...; the fill colour is h11 (true for the reference, predicted for survivors).
     */
    static String embeddingMap(ModelView v) throws IOException {
        List<ModelView.Point> medoids = new ArrayList<>();
        if (v.clusters() != null) {
            for (NoveltyClusters.Group g : v.clusters().clusters()) {
                medoids.add(v.novel().get(g.medoid()));
            }
        }
        List<List<ModelView.Point>> layers = List.of(v.others(), v.reference(), v.novel(), medoids);
        String[] names = {"survivor (predicted h11)", "reference (true h11)", "novel survivor", "cluster medoid"};
        Shape[] shapes = {new Ellipse2D.Double(-1.5, -1.5, 3, 3), new Ellipse2D.Double(-3.5, -3.5, 7, 7),
            triangle(5), diamond(8)};
        int lo = Integer.MAX_VALUE;
        int hi = Integer.MIN_VALUE;
        XYSeriesCollection data = new XYSeriesCollection();
        for (int s = 0; s < layers.size(); s++) {
            XYSeries series = new XYSeries(names[s], false, true);
            for (ModelView.Point p : layers.get(s)) {
                series.add(p.x(), p.y());
                lo = Math.min(lo, p.h11());
                hi = Math.max(hi, p.h11());
            }
            data.addSeries(series);
        }
        final int low = lo;
        final int high = Math.max(lo, hi);
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(false, true) {
            private static final long serialVersionUID = 1L;

            @Override
            public Paint getItemPaint(int series, int item) {
                return h11Colour(layers.get(series).get(item).h11(), low, high);
            }

            @Override
            public Paint getItemOutlinePaint(int series, int item) {
                return series == 0 ? getItemPaint(series, item) : Color.DARK_GRAY;
            }
        };
        renderer.setUseOutlinePaint(true);
        renderer.setDrawOutlines(true);
        for (int s = 0; s < shapes.length; s++) {
            renderer.setSeriesShape(s, shapes[s]);
            renderer.setSeriesPaint(s, Color.GRAY);
            renderer.setSeriesOutlinePaint(s, Color.DARK_GRAY);
            renderer.setSeriesOutlineStroke(s, new BasicStroke(s == 3 ? 2f : 0.8f));
        }
        XYPlot plot = new XYPlot(data, new NumberAxis("principal axis 1 of the reference"),
                new NumberAxis("principal axis 2 of the reference"), renderer);
        plot.setSeriesRenderingOrder(SeriesRenderingOrder.FORWARD);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinePaint(Color.LIGHT_GRAY);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        Font font = new Font(Font.SANS_SERIF, Font.BOLD, 12);
        for (int c = 0; c < medoids.size(); c++) {
            XYTextAnnotation a = new XYTextAnnotation("C" + (c + 1), medoids.get(c).x(), medoids.get(c).y());
            a.setFont(font);
            a.setTextAnchor(TextAnchor.BOTTOM_LEFT);
            plot.addAnnotation(a);
        }
        JFreeChart chart = new JFreeChart("embedding map", JFreeChart.DEFAULT_TITLE_FONT, plot, true);
        LookupPaintScale scale = new LookupPaintScale(low, high + 1, Color.GRAY);
        for (int h = low; h <= high; h++) {
            scale.add(h, h11Colour(h, low, high));
        }
        NumberAxis axis = new NumberAxis("h11");
        axis.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        PaintScaleLegend legend = new PaintScaleLegend(scale, axis);
        legend.setPosition(RectangleEdge.RIGHT);
        legend.setMargin(4, 4, 40, 4);
        chart.addSubtitle(legend);
        return dataUri(chart, WIDTH, 720);
    }

    /**
     * The reliability diagram: one bar per non-empty confidence bin from its low to its high edge, as
     * tall as the bin's observed accuracy, a dot at the bin's mean confidence, and the diagonal that a
     * calibrated model follows.
     */
    static String reliability(List<EvaluationFile.Bin> bins) throws IOException {
        XYIntervalSeries bars = new XYIntervalSeries("observed accuracy");
        XYSeries dots = new XYSeries("mean confidence of the bin", false, true);
        for (EvaluationFile.Bin b : bins) {
            if (b.count() > 0 && b.accuracy() != null && b.meanConfidence() != null) {
                bars.add((b.low() + b.high()) / 2, b.low(), b.high(), b.accuracy(), 0, b.accuracy());
                dots.add(b.meanConfidence(), b.accuracy());
            }
        }
        XYIntervalSeriesCollection barData = new XYIntervalSeriesCollection();
        barData.addSeries(bars);
        XYSeries diagonal = new XYSeries("calibrated (accuracy = confidence)");
        diagonal.add(0, 0);
        diagonal.add(1, 1);
        XYSeriesCollection lines = new XYSeriesCollection();
        lines.addSeries(diagonal);
        lines.addSeries(dots);
        NumberAxis x = new NumberAxis("stated confidence");
        x.setRange(0, 1.01);
        NumberAxis y = new NumberAxis("observed accuracy");
        y.setRange(0, 1.02);
        XYBarRenderer barRenderer = new XYBarRenderer();
        barRenderer.setBarPainter(new StandardXYBarPainter());
        barRenderer.setShadowVisible(false);
        barRenderer.setDrawBarOutline(true);
        barRenderer.setSeriesPaint(0, new Color(0x7FB3D5));
        barRenderer.setSeriesOutlinePaint(0, new Color(0x2471A3));
        XYPlot plot = new XYPlot(barData, x, y, barRenderer);
        XYLineAndShapeRenderer lineRenderer = new XYLineAndShapeRenderer();
        lineRenderer.setSeriesLinesVisible(0, true);
        lineRenderer.setSeriesShapesVisible(0, false);
        lineRenderer.setSeriesPaint(0, Color.DARK_GRAY);
        lineRenderer.setSeriesStroke(0, new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                new float[] {6f, 4f}, 0f));
        lineRenderer.setSeriesLinesVisible(1, false);
        lineRenderer.setSeriesShapesVisible(1, true);
        lineRenderer.setSeriesPaint(1, new Color(0xC0392B));
        lineRenderer.setSeriesShape(1, new Ellipse2D.Double(-4, -4, 8, 8));
        plot.setDataset(1, lines);
        plot.setRenderer(1, lineRenderer);
        plot.setDatasetRenderingOrder(DatasetRenderingOrder.FORWARD);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinePaint(Color.LIGHT_GRAY);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        JFreeChart chart = new JFreeChart("reliability", JFreeChart.DEFAULT_TITLE_FONT, plot, true);
        return dataUri(chart, 700, 600);
    }

    /** Hues from blue (low h11) through green to red (high), one step per h11 value. */
    static Color h11Colour(int h11, int low, int high) {
        float f = high == low ? 0f : (float) (h11 - low) / (high - low);
        return Color.getHSBColor(0.66f * (1f - f), 0.85f, 0.9f);
    }

    private static Shape triangle(double r) {
        Path2D.Double t = new Path2D.Double();
        t.moveTo(0, -r);
        t.lineTo(r, r);
        t.lineTo(-r, r);
        t.closePath();
        return t;
    }

    private static Shape diamond(double r) {
        Path2D.Double d = new Path2D.Double();
        d.moveTo(0, -r);
        d.lineTo(r, 0);
        d.lineTo(0, r);
        d.lineTo(-r, 0);
        d.closePath();
        return d;
    }

    private static String dataUri(JFreeChart chart) throws IOException {
        return dataUri(chart, WIDTH, HEIGHT);
    }

    private static String dataUri(JFreeChart chart, int width, int height) throws IOException {
        chart.setBackgroundPaint(Color.WHITE);
        byte[] png = ChartUtils.encodeAsPNG(chart.createBufferedImage(width, height));
        return "data:image/png;base64," + Base64.getEncoder().encodeToString(png);
    }
}
