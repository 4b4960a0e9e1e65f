package org.winnow.scorer.network;

import java.util.List;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * Affine input normalisation, {@code (x - mean) * scale}, fitted on the training examples so every raw
 * feature enters the network at unit scale. Stored in the model file: a candidate must be normalised
 * exactly as the examples were.
 */
public record Normalisation(double[] rowMean, double[] rowScale, double[] colMean, double[] colScale,
        double[] globalMean, double[] globalScale) {
    public Normalisation {
        Checks.requireArgument(rowMean.length == Architecture.ROW_FEATURES && rowScale.length == Architecture.ROW_FEATURES,
                "row normalisation needs %s entries, got %s", Architecture.ROW_FEATURES, rowMean.length);
        Checks.requireArgument(colMean.length == Architecture.COL_FEATURES && colScale.length == Architecture.COL_FEATURES,
                "column normalisation needs %s entries, got %s", Architecture.COL_FEATURES, colMean.length);
        Checks.requireArgument(globalMean.length == Architecture.GLOBAL_FEATURES
                        && globalScale.length == Architecture.GLOBAL_FEATURES,
                "global normalisation needs %s entries, got %s", Architecture.GLOBAL_FEATURES, globalMean.length);
    }

    /** The identity (mean 0, scale 1), used before fitting and in tests. */
    public static Normalisation identity() {
        return new Normalisation(new double[Architecture.ROW_FEATURES], ones(Architecture.ROW_FEATURES),
                new double[Architecture.COL_FEATURES], ones(Architecture.COL_FEATURES),
                new double[Architecture.GLOBAL_FEATURES], ones(Architecture.GLOBAL_FEATURES));
    }

    /**
     * Fits mean and inverse standard deviation of every raw feature over all row nodes, all column
     * nodes and all examples; a constant feature keeps scale 1 rather than dividing by zero.
     */
    public static Normalisation fit(List<Configuration> configs, long[] chis) {
        Checks.requireArgument(!configs.isEmpty(), "cannot fit a normalisation on no examples");
        Checks.requireArgument(configs.size() == chis.length, "%s configurations but %s chi values",
                configs.size(), chis.length);
        Moments rows = new Moments(Architecture.ROW_FEATURES);
        Moments cols = new Moments(Architecture.COL_FEATURES);
        Moments globals = new Moments(Architecture.GLOBAL_FEATURES);
        double[] buf = new double[Math.max(Architecture.GLOBAL_FEATURES, Architecture.ROW_FEATURES)];
        Anchor anchor = new Anchor();
        for (int i = 0; i < configs.size(); i++) {
            Configuration c = configs.get(i);
            for (int r = 0; r < c.rows(); r++) {
                FeatureEncoder.rowFeatures(c, r, buf, 0);
                rows.add(buf);
            }
            for (int j = 0; j < c.cols(); j++) {
                FeatureEncoder.colFeatures(c, j, buf, 0);
                cols.add(buf);
            }
            FeatureEncoder.globalFeatures(c, chis[i], anchor, buf, 0);
            globals.add(buf);
        }
        return new Normalisation(rows.mean(), rows.scale(), cols.mean(), cols.scale(), globals.mean(), globals.scale());
    }

    private static double[] ones(int n) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, 1.0);
        return a;
    }

    private static final class Moments {
        private final double[] sum;
        private final double[] sumSq;
        private long count;

        Moments(int width) {
            sum = new double[width];
            sumSq = new double[width];
        }

        void add(double[] x) {
            for (int i = 0; i < sum.length; i++) {
                sum[i] += x[i];
                sumSq[i] += x[i] * x[i];
            }
            count++;
        }

        double[] mean() {
            double[] m = new double[sum.length];
            for (int i = 0; i < m.length; i++) {
                m[i] = count == 0 ? 0 : sum[i] / count;
            }
            return m;
        }

        double[] scale() {
            double[] s = new double[sum.length];
            for (int i = 0; i < s.length; i++) {
                double mean = count == 0 ? 0 : sum[i] / count;
                double var = count == 0 ? 0 : Math.max(0, sumSq[i] / count - mean * mean);
                s[i] = var < 1e-12 ? 1.0 : 1.0 / Math.sqrt(var);
            }
            return s;
        }
    }
}
