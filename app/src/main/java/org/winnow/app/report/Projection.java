package org.winnow.app.report;

import java.util.Arrays;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.winnow.geometry.Checks;

/**
 * A linear map onto the two leading principal axes of a point set (its largest-variance directions),
 * fitted once and then applied to other points, so that survivors land in the reference's own plane.
 *
 * @param mean  the fitted points' mean
 * @param axes  two orthonormal directions, the leading one first (a zero row where the points span fewer dimensions)
 * @param variance the variance along each axis
 */
record Projection(double[] mean, double[][] axes, double[] variance) {
    /** Fits the principal axes of {@code points} (at least one point, all of the same width). */
    static Projection fit(double[][] points) {
        Checks.requireArgument(points.length >= 1, "a projection needs at least one point, got %s", points.length);
        int d = points[0].length;
        Checks.requireArgument(d >= 1, "points need at least one coordinate, got %s", d);
        int n = points.length;
        double[] mean = new double[d];
        for (double[] p : points) {
            Checks.requireArgument(p.length == d, "every point needs %s coordinates, got %s", d, p.length);
            for (int j = 0; j < d; j++) {
                mean[j] += p[j] / n;
            }
        }
        double[][] cov = new double[d][d];
        for (double[] p : points) {
            for (int a = 0; a < d; a++) {
                double da = p[a] - mean[a];
                for (int b = a; b < d; b++) {
                    cov[a][b] += da * (p[b] - mean[b]) / n;
                }
            }
        }
        for (int a = 0; a < d; a++) {
            for (int b = 0; b < a; b++) {
                cov[a][b] = cov[b][a];
            }
        }
        // The covariance is symmetric, so the decomposition gives real eigenvalues and orthonormal vectors.
        EigenDecomposition eig = new EigenDecomposition(new Array2DRowRealMatrix(cov, false));
        double[] values = eig.getRealEigenvalues();
        Integer[] order = new Integer[d];
        for (int i = 0; i < d; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (x, y) -> Double.compare(values[y], values[x]));
        double[][] axes = new double[2][d];
        double[] variance = new double[2];
        for (int k = 0; k < Math.min(2, d); k++) {
            axes[k] = eig.getEigenvector(order[k]).toArray();
            variance[k] = Math.max(0, values[order[k]]);
            // Fix the sign (largest coordinate positive) so the picture does not flip between runs.
            int big = 0;
            for (int j = 1; j < d; j++) {
                if (Math.abs(axes[k][j]) > Math.abs(axes[k][big])) {
                    big = j;
                }
            }
            if (axes[k][big] < 0) {
                for (int j = 0; j < d; j++) {
                    axes[k][j] = -axes[k][j];
                }
            }
        }
        return new Projection(mean, axes, variance);
    }

    /** The point's coordinates on the two axes. */
    double[] apply(double[] point) {
        Checks.requireArgument(point.length == mean.length, "the projection takes %s coordinates, got %s",
                mean.length, point.length);
        double[] xy = new double[2];
        for (int k = 0; k < 2; k++) {
            double s = 0;
            for (int j = 0; j < mean.length; j++) {
                s += (point[j] - mean[j]) * axes[k][j];
            }
            xy[k] = s;
        }
        return xy;
    }
}
