package org.winnow.scorer.index;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class AnchoredIndexTest {
    /** Points with an integer last coordinate, some of them repeated so that distances tie. */
    private static double[] points(SplittableRandom rng, int n, int dim) {
        double[] p = new double[n * dim];
        for (int i = 0; i < n; i++) {
            if (i > 0 && rng.nextInt(6) == 0) {
                System.arraycopy(p, rng.nextInt(i) * dim, p, i * dim, dim);
                continue;
            }
            for (int d = 0; d < dim - 1; d++) {
                p[i * dim + d] = rng.nextGaussian() * (rng.nextBoolean() ? 0.1 : 2.0);
            }
            p[i * dim + dim - 1] = rng.nextInt(15);
        }
        return p;
    }

    @Test
    void findsExactlyWhatTheFlatScanFinds() {
        SplittableRandom rng = new SplittableRandom(31);
        for (int round = 0; round < 6; round++) {
            int dim = 2 + round % 4;
            int n = 1 + rng.nextInt(700);
            double[] p = points(rng, n, dim);
            FlatIndex flat = new FlatIndex(p, dim);
            AnchoredIndex anchored = new AnchoredIndex(p, dim);
            for (int query = 0; query < 300; query++) {
                double[] q = new double[dim];
                if (rng.nextBoolean()) {
                    System.arraycopy(p, rng.nextInt(n) * dim, q, 0, dim); // a reference point itself: ties
                } else {
                    for (int d = 0; d < dim - 1; d++) {
                        q[d] = rng.nextGaussian();
                    }
                    q[dim - 1] = rng.nextInt(-3, 19) + (rng.nextBoolean() ? 0 : rng.nextDouble());
                }
                int k = 1 + rng.nextInt(9);
                int exclude = rng.nextBoolean() ? -1 : rng.nextInt(n);
                int[] fi = new int[k];
                double[] fd = new double[k];
                int[] ai = new int[k];
                double[] ad = new double[k];
                int fFound = flat.search(q, k, exclude, fi, fd);
                int aFound = anchored.search(q, k, exclude, ai, ad);
                assertEquals(fFound, aFound);
                assertArrayEquals(Arrays.copyOf(fi, fFound), Arrays.copyOf(ai, aFound), "query " + query);
                assertArrayEquals(Arrays.copyOf(fd, fFound), Arrays.copyOf(ad, aFound), 0.0, "query " + query);
            }
        }
    }

    @Test
    void findsExactlyWhatTheFlatScanFindsOnLargeGroupsWithManyTies() {
        // Thousands of points on a coarse grid: groups of hundreds of points cut into many leaves, and
        // many distinct points at exactly equal distances from a query, so the index order must decide.
        SplittableRandom rng = new SplittableRandom(77);
        for (int round = 0; round < 4; round++) {
            int dim = 3 + round * 2;
            int n = 2000 + rng.nextInt(6000);
            double[] p = new double[n * dim];
            for (int i = 0; i < n; i++) {
                for (int d = 0; d < dim - 1; d++) {
                    p[i * dim + d] = rng.nextInt(-6, 7) * 0.25 + (round == 3 ? rng.nextGaussian() * 1e-3 : 0);
                }
                p[i * dim + dim - 1] = rng.nextInt(4) + (round % 2 == 0 ? 0 : 10 * rng.nextInt(2));
            }
            FlatIndex flat = new FlatIndex(p, dim);
            AnchoredIndex anchored = new AnchoredIndex(p, dim);
            for (int query = 0; query < 400; query++) {
                double[] q = new double[dim];
                for (int d = 0; d < dim - 1; d++) {
                    q[d] = rng.nextBoolean() ? rng.nextInt(-7, 8) * 0.25 : rng.nextGaussian();
                }
                q[dim - 1] = rng.nextInt(-1, 6);
                int k = 1 + rng.nextInt(query % 10 == 0 ? 300 : 12);
                int exclude = rng.nextBoolean() ? -1 : rng.nextInt(n);
                compare(flat, anchored, q, k, exclude);
            }
        }
    }

    @Test
    void findsExactlyWhatTheFlatScanFindsWhenSlabsAreSkipped() {
        // Groups of hundreds to thousands of clustered points with a small k, so that most slabs lie
        // beyond the k-th distance along the sorting axis and are skipped; the axis values repeat across
        // slab edges (a coarse grid on the widest coordinate) and queries sit exactly on those values, so
        // the edge tests meet equal gaps and equal distances. Also one stored coordinate (dimension 2)
        // and the anchor alone (dimension 1).
        SplittableRandom rng = new SplittableRandom(2026);
        for (int round = 0; round < 8; round++) {
            int dim = round < 2 ? round + 1 : 3 + rng.nextInt(7);
            int n = 300 + rng.nextInt(4000);
            int groups = 1 + rng.nextInt(4);
            double[] p = new double[n * dim];
            for (int i = 0; i < n; i++) {
                for (int d = 0; d < dim - 1; d++) {
                    double spread = d == 0 ? 1.0 : 0.2;
                    p[i * dim + d] = d == 0 && round % 2 == 0 ? rng.nextInt(-20, 21) * 0.05
                            : rng.nextGaussian() * spread;
                }
                p[i * dim + dim - 1] = rng.nextInt(groups);
            }
            FlatIndex flat = new FlatIndex(p, dim);
            AnchoredIndex anchored = new AnchoredIndex(p, dim);
            for (int query = 0; query < 300; query++) {
                double[] q = new double[dim];
                if (query % 3 == 0) {
                    System.arraycopy(p, rng.nextInt(n) * dim, q, 0, dim); // on a point, hence on a slab's values
                } else {
                    for (int d = 0; d < dim - 1; d++) {
                        q[d] = rng.nextGaussian() * (d == 0 ? 1.5 : 0.25);
                    }
                    q[dim - 1] = rng.nextInt(-1, groups + 1);
                }
                int k = 1 + rng.nextInt(query % 7 == 0 ? 80 : 8);
                int exclude = rng.nextBoolean() ? -1 : rng.nextInt(n);
                compare(flat, anchored, q, k, exclude);
            }
        }
    }

    @Test
    void findsEveryPointWhenAskedForMoreThanThereAre() {
        SplittableRandom rng = new SplittableRandom(3);
        double[] p = points(rng, 90, 4);
        AnchoredIndex anchored = new AnchoredIndex(p, 4);
        int[] idx = new int[120];
        double[] dist = new double[120];
        assertEquals(90, anchored.search(new double[] {0, 0, 0, 40}, 120, -1, idx, dist));
        assertEquals(89, anchored.search(new double[] {0, 0, 0, 40}, 120, 5, idx, dist));
        compare(new FlatIndex(p, 4), anchored, new double[] {0.5, -1, 2, 7}, 120, 17);
    }

    private static void compare(FlatIndex flat, AnchoredIndex anchored, double[] q, int k, int exclude) {
        int[] fi = new int[k];
        double[] fd = new double[k];
        int[] ai = new int[k];
        double[] ad = new double[k];
        int fFound = flat.search(q, k, exclude, fi, fd);
        int aFound = anchored.search(q, k, exclude, ai, ad);
        assertEquals(fFound, aFound);
        assertArrayEquals(Arrays.copyOf(fi, fFound), Arrays.copyOf(ai, aFound), () -> Arrays.toString(q) + " k " + k);
        assertArrayEquals(Arrays.copyOf(fd, fFound), Arrays.copyOf(ad, aFound), 0.0, () -> Arrays.toString(q));
    }
}
