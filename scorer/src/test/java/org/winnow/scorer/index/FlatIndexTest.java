package org.winnow.scorer.index;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.Arrays;
import java.util.Comparator;
import java.util.SplittableRandom;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;

/** The flat scan against a brute-force oracle (sort everything), then the degenerate inputs. */
class FlatIndexTest {
    @Test
    void agreesWithSortingOracleOnRandomData() {
        SplittableRandom rng = new SplittableRandom(42);
        for (int trial = 0; trial < 40; trial++) {
            int dim = 1 + rng.nextInt(9);
            int n = 1 + rng.nextInt(300);
            double[] pts = new double[n * dim];
            for (int i = 0; i < pts.length; i++) {
                // Coarse grid values make exact ties common, which exercises the tie-break.
                pts[i] = trial % 2 == 0 ? rng.nextDouble() : rng.nextInt(3);
            }
            FlatIndex index = new FlatIndex(pts, dim);
            for (int qi = 0; qi < 20; qi++) {
                double[] q = new double[dim];
                for (int i = 0; i < dim; i++) {
                    q[i] = trial % 2 == 0 ? rng.nextDouble() : rng.nextInt(3);
                }
                int k = 1 + rng.nextInt(12);
                int exclude = rng.nextInt(4) == 0 ? rng.nextInt(n) : -1;
                check(index, pts, dim, q, k, exclude);
            }
        }
    }

    @Test
    void agreesWithSortingOracleAcrossSeveralScanBlocks() {
        SplittableRandom rng = new SplittableRandom(7);
        int dim = 8;
        int n = 1000; // four blocks of the scan, the last one partial
        double[] pts = new double[n * dim];
        for (int i = 0; i < pts.length; i++) {
            pts[i] = rng.nextInt(4) == 0 ? rng.nextInt(2) : rng.nextDouble();
        }
        FlatIndex index = new FlatIndex(pts, dim);
        for (int qi = 0; qi < 50; qi++) {
            double[] q = new double[dim];
            for (int i = 0; i < dim; i++) {
                q[i] = qi % 3 == 0 ? pts[(qi * 17 % n) * dim + i] : rng.nextDouble();
            }
            check(index, pts, dim, q, 1 + rng.nextInt(12), qi % 2 == 0 ? 255 + rng.nextInt(3) : -1);
        }
    }

    @Test
    void emptyIndexFindsNothing() {
        FlatIndex index = new FlatIndex(new double[0], 3);
        assertEquals(0, index.size());
        assertEquals(0, index.search(new double[3], 5, -1, new int[5], new double[5]));
    }

    @Test
    void singlePointIsFoundUnlessExcluded() {
        FlatIndex index = new FlatIndex(new double[] {3, 4}, 2);
        int[] idx = new int[2];
        double[] dist = new double[2];
        assertEquals(1, index.search(new double[] {0, 0}, 2, -1, idx, dist));
        assertEquals(0, idx[0]);
        assertEquals(5.0, dist[0], 0);
        assertEquals(0, index.search(new double[] {0, 0}, 2, 0, idx, dist));
    }

    @Test
    void duplicatesComeInIndexOrder() {
        double[] pts = {1, 1, 0, 0, 1, 1, 1, 1};
        FlatIndex index = new FlatIndex(pts, 2);
        int[] idx = new int[3];
        double[] dist = new double[3];
        assertEquals(3, index.search(new double[] {1, 1}, 3, -1, idx, dist));
        assertArrayEquals(new int[] {0, 2, 3}, idx);
        assertArrayEquals(new double[] {0, 0, 0}, dist, 0);
    }

    @Test
    void kZeroFindsNothingAndRaggedInputIsRefused() {
        FlatIndex index = new FlatIndex(new double[] {1, 2}, 2);
        assertEquals(0, index.search(new double[] {0, 0}, 0, -1, new int[0], new double[0]));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new FlatIndex(new double[] {1, 2, 3}, 2));
        assertEquals("3 coordinates do not split into points of dimension 2", e.getMessage());
    }

    private static void check(FlatIndex index, double[] pts, int dim, double[] q, int k, int exclude) {
        int n = pts.length / dim;
        double[] all = new double[n];
        for (int p = 0; p < n; p++) {
            double s = 0;
            for (int i = 0; i < dim; i++) {
                double d = pts[p * dim + i] - q[i];
                s += d * d;
            }
            all[p] = s; // squared, as the index orders them
        }
        int[] expected = IntStream.range(0, n).filter(p -> p != exclude).boxed()
                .sorted(Comparator.<Integer>comparingDouble(p -> all[p]).thenComparingInt(p -> p))
                .limit(k).mapToInt(Integer::intValue).toArray();
        int[] idx = new int[k];
        double[] dist = new double[k];
        int found = index.search(q, k, exclude, idx, dist);
        assertEquals(expected.length, found);
        assertArrayEquals(expected, Arrays.copyOf(idx, found));
        for (int i = 0; i < found; i++) {
            assertEquals(Math.sqrt(all[expected[i]]), dist[i], 1e-12);
        }
    }
}
