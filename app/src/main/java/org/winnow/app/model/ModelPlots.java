package org.winnow.app.model;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.geom.Ellipse2D;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Map;
import java.util.TreeMap;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.stat.correlation.Covariance;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.annotations.XYTextAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.SymbolAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.LookupPaintScale;
import org.jfree.chart.renderer.xy.XYBlockRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.PaintScaleLegend;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.data.xy.DefaultXYZDataset;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;

/**
 * The two evaluation pictures, drawn headless with JFreeChart: the embedding projected on its first
 * two principal axes, coloured by h11, and the confusion matrix as a heat map with counts.
 */
final class ModelPlots {
    private static final int WIDTH = 1000;
    private static final int HEIGHT = 800;

    private ModelPlots() {}

    /**
     * Projects {@code embeddings} (one per row) on the two leading principal axes and writes a scatter
     * plot, one colour per h11; points of {@code holdoutClass} (may be null) are drawn as their own series.
     */
    static void embedding(double[][] embeddings, int[] h11, Integer holdoutClass, String title, Path png)
            throws IOException {
        double[][] xy = project2d(embeddings);
        Map<Integer, XYSeries> series = new TreeMap<>();
        for (int i = 0; i < xy.length; i++) {
            int c = h11[i];
            series.computeIfAbsent(c, k -> new XYSeries(holdoutClass != null && k.equals(holdoutClass)
                    ? "h11=" + k + " (held out)" : "h11=" + k, false, true)).add(xy[i][0], xy[i][1]);
        }
        XYSeriesCollection data = new XYSeriesCollection();
        series.values().forEach(data::addSeries);
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(false, true);
        int s = 0;
        for (Integer c : series.keySet()) {
            float hue = (float) s / Math.max(1, series.size());
            renderer.setSeriesPaint(s, Color.getHSBColor(hue, 0.85f, 0.85f));
            renderer.setSeriesShape(s, new Ellipse2D.Double(-2.5, -2.5, 5, 5));
            if (c.equals(holdoutClass)) {
                renderer.setSeriesPaint(s, Color.BLACK);
                renderer.setSeriesShape(s, new Ellipse2D.Double(-4, -4, 8, 8));
            }
            s++;
        }
        XYPlot plot = new XYPlot(data, new NumberAxis("principal axis 1"), new NumberAxis("principal axis 2"),
                renderer);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinePaint(Color.LIGHT_GRAY);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        JFreeChart chart = new JFreeChart(title, JFreeChart.DEFAULT_TITLE_FONT, plot, true);
        chart.setBackgroundPaint(Color.WHITE);
        ChartUtils.saveChartAsPNG(png.toFile(), chart, WIDTH, HEIGHT);
    }

    /** Writes the confusion matrix as a heat map (log colour scale) with the count in every non-empty cell. */
    static void confusion(int[] classes, int[][] counts, String title, Path png) throws IOException {
        int n = classes.length;
        double[][] xyz = new double[3][n * n];
        int max = 1;
        for (int t = 0; t < n; t++) {
            for (int p = 0; p < n; p++) {
                int i = t * n + p;
                xyz[0][i] = p;
                xyz[1][i] = t;
                xyz[2][i] = counts[t][p] == 0 ? Double.NaN : Math.log10(counts[t][p]);
                max = Math.max(max, counts[t][p]);
            }
        }
        DefaultXYZDataset data = new DefaultXYZDataset();
        data.addSeries("counts", xyz);
        String[] labels = Arrays.stream(classes).mapToObj(Integer::toString).toArray(String[]::new);
        SymbolAxis predicted = new SymbolAxis("predicted h11", labels);
        SymbolAxis truth = new SymbolAxis("true h11", labels);
        truth.setInverted(true);
        double top = Math.max(1e-9, Math.log10(max));
        LookupPaintScale scale = new LookupPaintScale(0, top + 1e-9, Color.WHITE);
        int steps = 32;
        for (int i = 0; i < steps; i++) {
            float f = (float) i / (steps - 1);
            scale.add(top * i / steps, new Color(1f - 0.85f * f, 1f - 0.6f * f, 1f - 0.2f * f));
        }
        XYBlockRenderer renderer = new XYBlockRenderer();
        renderer.setPaintScale(scale);
        XYPlot plot = new XYPlot(data, predicted, truth, renderer);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        plot.setOutlineStroke(new BasicStroke(1f));
        Font font = new Font(Font.SANS_SERIF, Font.PLAIN, n > 20 ? 9 : 12);
        for (int t = 0; t < n; t++) {
            for (int p = 0; p < n; p++) {
                if (counts[t][p] > 0) {
                    XYTextAnnotation a = new XYTextAnnotation(Integer.toString(counts[t][p]), p, t);
                    a.setFont(font);
                    a.setPaint(t == p ? Color.WHITE : Color.BLACK);
                    plot.addAnnotation(a);
                }
            }
        }
        JFreeChart chart = new JFreeChart(title, JFreeChart.DEFAULT_TITLE_FONT, plot, false);
        NumberAxis legendAxis = new NumberAxis("log10 count");
        PaintScaleLegend legend = new PaintScaleLegend(scale, legendAxis);
        legend.setPosition(RectangleEdge.RIGHT);
        chart.addSubtitle(legend);
        chart.setBackgroundPaint(Color.WHITE);
        ChartUtils.saveChartAsPNG(png.toFile(), chart, WIDTH, HEIGHT);
    }

    /** Coordinates on the two leading principal axes (fewer than two points or dimensions: zeros pad). */
    static double[][] project2d(double[][] x) {
        int n = x.length;
        int d = n == 0 ? 0 : x[0].length;
        double[][] out = new double[n][2];
        if (n < 2 || d == 0) {
            return out;
        }
        RealMatrix cov = new Covariance(x, false).getCovarianceMatrix();
        EigenDecomposition eig = new EigenDecomposition(cov);
        double[] values = eig.getRealEigenvalues();
        Integer[] order = new Integer[d];
        for (int i = 0; i < d; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(values[b], values[a]));
        double[] mean = new double[d];
        for (double[] row : x) {
            for (int j = 0; j < d; j++) {
                mean[j] += row[j] / n;
            }
        }
        for (int axis = 0; axis < Math.min(2, d); axis++) {
            double[] v = eig.getEigenvector(order[axis]).toArray();
            for (int i = 0; i < n; i++) {
                double s = 0;
                for (int j = 0; j < d; j++) {
                    s += (x[i][j] - mean[j]) * v[j];
                }
                out[i][axis] = s;
            }
        }
        return out;
    }
}
