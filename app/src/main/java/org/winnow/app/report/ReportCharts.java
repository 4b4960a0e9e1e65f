package org.winnow.app.report;

import java.awt.Color;
import java.io.IOException;
import java.util.Base64;
import java.util.Map;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.data.category.DefaultCategoryDataset;
import org.jfree.data.statistics.HistogramDataset;

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

    private static String dataUri(JFreeChart chart) throws IOException {
        chart.setBackgroundPaint(Color.WHITE);
        byte[] png = ChartUtils.encodeAsPNG(chart.createBufferedImage(WIDTH, HEIGHT));
        return "data:image/png;base64," + Base64.getEncoder().encodeToString(png);
    }
}
