package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The principal axes against a brute-force search over directions (common practice, no source). */
class ProjectionTest {
    private static double[][] anisotropic(long seed, int n) {
        SplittableRandom rnd = new SplittableRandom(seed);
        double[][] x = new double[n][3];
        for (double[] p : x) {
            double a = 3 * gaussian(rnd);
            double b = 1.5 * gaussian(rnd);
            double c = 0.4 * gaussian(rnd);
            // a rotated and shifted ellipsoid, so the axes are not the coordinate axes
            p[0] = 0.6 * a - 0.8 * b + 5;
            p[1] = 0.8 * a * 0.6 + 0.6 * b * 0.6 - 0.8 * c - 2;
            p[2] = 0.8 * a * 0.8 + 0.6 * b * 0.8 + 0.6 * c;
        }
        return x;
    }

    private static double gaussian(SplittableRandom rnd) {
        return Math.sqrt(-2 * Math.log(1 - rnd.nextDouble())) * Math.cos(2 * Math.PI * rnd.nextDouble());
    }

    private static double variance(double[][] x, double[] dir) {
        double mean = 0;
        for (double[] p : x) {
            mean += dot(p, dir) / x.length;
        }
        double v = 0;
        for (double[] p : x) {
            double d = dot(p, dir) - mean;
            v += d * d / x.length;
        }
        return v;
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    @Test
    void theAxesMaximiseTheVarianceOverEveryDirectionTried() {
        for (long seed = 1; seed <= 2; seed++) {
            double[][] x = anisotropic(seed, 200);
            Projection p = Projection.fit(x);
            double[] a1 = p.axes()[0];
            double[] a2 = p.axes()[1];
            assertEquals(1, dot(a1, a1), 1e-9);
            assertEquals(1, dot(a2, a2), 1e-9);
            assertEquals(0, dot(a1, a2), 1e-9);
            assertEquals(variance(x, a1), p.variance()[0], 1e-9);
            assertEquals(variance(x, a2), p.variance()[1], 1e-9);
            // brute force: every direction on a one-degree grid of the half sphere
            double best = 0;
            for (int i = 0; i <= 90; i++) {
                double theta = Math.PI * i / 180;
                for (int j = 0; j < 360; j++) {
                    double phi = 2 * Math.PI * j / 360;
                    double[] d = {Math.sin(theta) * Math.cos(phi), Math.sin(theta) * Math.sin(phi), Math.cos(theta)};
                    best = Math.max(best, variance(x, d));
                }
            }
            assertTrue(p.variance()[0] >= best - 1e-9, "first axis beats the grid");
            assertTrue(p.variance()[0] <= best * (1 + 1e-3), "the grid comes close to the first axis");
            // the second axis: the best direction orthogonal to the first, over a tenth-degree circle
            double[] u = orthogonalUnit(a1);
            double[] w = cross(a1, u);
            double best2 = 0;
            for (int j = 0; j < 1800; j++) {
                double t = Math.PI * j / 1800;
                double[] d = {Math.cos(t) * u[0] + Math.sin(t) * w[0], Math.cos(t) * u[1] + Math.sin(t) * w[1],
                    Math.cos(t) * u[2] + Math.sin(t) * w[2]};
                best2 = Math.max(best2, variance(x, d));
            }
            assertTrue(p.variance()[1] >= best2 - 1e-9 && p.variance()[1] <= best2 * (1 + 1e-4), "second axis");
            // applying the map is centring then projecting
            double[] xy = p.apply(x[7]);
            double[] c = x[7].clone();
            for (int k = 0; k < 3; k++) {
                c[k] -= p.mean()[k];
            }
            assertArrayEquals(new double[] {dot(c, a1), dot(c, a2)}, xy, 1e-12);
        }
    }

    @Test
    void degeneratePointSetsGiveZeroVarianceAndStayFinite() {
        Projection single = Projection.fit(new double[][] {{1, 2, 3}});
        assertArrayEquals(new double[] {0, 0}, single.variance(), 0);
        assertArrayEquals(new double[] {0, 0}, single.apply(new double[] {1, 2, 3}), 1e-12);
        // one coordinate: the second axis does not exist and projects everything to 0
        Projection line = Projection.fit(new double[][] {{0}, {2}, {4}});
        assertEquals(8.0 / 3, line.variance()[0], 1e-12);
        assertArrayEquals(new double[] {3, 0}, line.apply(new double[] {5}), 1e-12);
    }

    private static double[] orthogonalUnit(double[] a) {
        double[] e = Math.abs(a[0]) < 0.9 ? new double[] {1, 0, 0} : new double[] {0, 1, 0};
        double[] u = cross(a, e);
        double n = Math.sqrt(dot(u, u));
        return new double[] {u[0] / n, u[1] / n, u[2] / n};
    }

    private static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }
}
