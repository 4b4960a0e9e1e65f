package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Density clusters against a brute-force DBSCAN oracle built from its definition: core points are
 * those with enough neighbours, clusters are the connected components of core points within the
 * radius, border points join a cluster of one of their core neighbours, the rest is noise (common
 * practice, no source).
 */
class NoveltyClustersTest {
    private static double[][] blobs(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        List<double[]> pts = new ArrayList<>();
        double[][] centres = {{0, 0, 0}, {3, 0, 1}, {0, 4, -1}};
        int[] sizes = {40, 15, 6};
        for (int c = 0; c < centres.length; c++) {
            for (int i = 0; i < sizes[c]; i++) {
                pts.add(new double[] {centres[c][0] + 0.3 * rnd.nextDouble(), centres[c][1] + 0.3 * rnd.nextDouble(),
                    centres[c][2] + 0.3 * rnd.nextDouble()});
            }
        }
        for (int i = 0; i < 30; i++) {
            pts.add(new double[] {-5 + 12 * rnd.nextDouble(), -5 + 12 * rnd.nextDouble(), -5 + 12 * rnd.nextDouble()});
        }
        return pts.toArray(double[][]::new);
    }

    @Test
    void clustersMatchTheBruteForceDefinition() {
        for (long seed = 1; seed <= 5; seed++) {
            double[][] x = blobs(seed);
            for (double radius : new double[] {0.08, 0.15, 0.6}) {
                NoveltyClusters got = NoveltyClusters.find(x, radius);
                int n = x.length;
                boolean[] core = new boolean[n];
                for (int i = 0; i < n; i++) {
                    int k = 0;
                    for (int j = 0; j < n; j++) {
                        k += j != i && NoveltyClusters.distance(x[i], x[j]) <= radius ? 1 : 0;
                    }
                    core[i] = k >= NoveltyClusters.MIN_NEIGHBOURS;
                }
                int[] comp = new int[n];
                java.util.Arrays.fill(comp, -1);
                int comps = 0;
                for (int i = 0; i < n; i++) {
                    if (!core[i] || comp[i] >= 0) {
                        continue;
                    }
                    List<Integer> stack = new ArrayList<>(List.of(i));
                    comp[i] = comps;
                    while (!stack.isEmpty()) {
                        int a = stack.remove(stack.size() - 1);
                        for (int b = 0; b < n; b++) {
                            if (core[b] && comp[b] < 0 && NoveltyClusters.distance(x[a], x[b]) <= radius) {
                                comp[b] = comps;
                                stack.add(b);
                            }
                        }
                    }
                    comps++;
                }
                assertEquals(comps, got.clusters().size(), "clusters at radius " + radius);
                Map<Integer, Integer> clusterOf = new HashMap<>();
                for (int c = 0; c < got.clusters().size(); c++) {
                    for (int m : got.clusters().get(c).members()) {
                        assertTrue(clusterOf.put(m, c) == null, "a point in two clusters");
                    }
                }
                // the core points are partitioned exactly as the oracle's components
                Map<Integer, Integer> compToCluster = new HashMap<>();
                for (int i = 0; i < n; i++) {
                    if (core[i]) {
                        Integer c = clusterOf.get(i);
                        assertTrue(c != null, "core point " + i + " unclustered");
                        Integer before = compToCluster.putIfAbsent(comp[i], c);
                        assertTrue(before == null || before.equals(c), "a component split");
                    } else {
                        Set<Integer> reachable = new HashSet<>();
                        for (int j = 0; j < n; j++) {
                            if (core[j] && NoveltyClusters.distance(x[i], x[j]) <= radius) {
                                reachable.add(comp[j]);
                            }
                        }
                        Integer c = clusterOf.get(i);
                        if (reachable.isEmpty()) {
                            assertTrue(c == null, "noise point " + i + " clustered");
                        } else {
                            assertTrue(c != null, "border point " + i + " left out");
                        }
                    }
                }
                assertEquals(comps, new HashSet<>(compToCluster.values()).size(), "two components merged");
                for (int i = 0; i < n; i++) {
                    if (!core[i] && clusterOf.containsKey(i)) {
                        int c = clusterOf.get(i);
                        boolean ok = false;
                        for (int j = 0; j < n; j++) {
                            ok |= core[j] && clusterOf.get(j) == c && NoveltyClusters.distance(x[i], x[j]) <= radius;
                        }
                        assertTrue(ok, "border point " + i + " joined a cluster with no core neighbour");
                    }
                }
                assertEquals(n, got.clustered() + got.noise());
                assertEquals(clusterOf.size(), got.clustered());
                for (int c = 1; c < got.clusters().size(); c++) {
                    assertTrue(got.clusters().get(c - 1).size() >= got.clusters().get(c).size(), "largest first");
                }
                for (NoveltyClusters.Group g : got.clusters()) {
                    assertTrue(g.size() >= NoveltyClusters.MIN_NEIGHBOURS + 1, "smallest cluster size");
                    checkMedoid(x, g);
                }
            }
        }
    }

    private static void checkMedoid(double[][] x, NoveltyClusters.Group g) {
        double best = Double.POSITIVE_INFINITY;
        for (int a : g.members()) {
            double s = 0;
            for (int b : g.members()) {
                s += NoveltyClusters.distance(x[a], x[b]);
            }
            best = Math.min(best, s);
        }
        double s = 0;
        boolean member = false;
        for (int b : g.members()) {
            s += NoveltyClusters.distance(x[g.medoid()], x[b]);
            member |= b == g.medoid();
        }
        assertTrue(member, "the medoid is a member");
        assertEquals(best, s, 1e-12, "the medoid has the least summed distance");
    }

    @Test
    void wellSeparatedBlobsComeOutAsTheBlobs() {
        double[][] x = blobs(11);
        // each blob fits in a cube of side 0.3 (diagonal 0.52), and the blob centres are more than 3 apart
        NoveltyClusters got = NoveltyClusters.find(x, 0.6);
        int[][] blobRanges = {{0, 40}, {40, 55}, {55, 61}};
        Set<Integer> used = new HashSet<>();
        for (int[] r : blobRanges) {
            Integer cluster = null;
            for (int c = 0; c < got.clusters().size(); c++) {
                for (int m : got.clusters().get(c).members()) {
                    if (m == r[0]) {
                        cluster = c;
                    }
                }
            }
            assertTrue(cluster != null, "blob starting at " + r[0] + " found");
            assertTrue(used.add(cluster), "two blobs in one cluster");
            Set<Integer> members = new HashSet<>();
            for (int m : got.clusters().get(cluster).members()) {
                members.add(m);
            }
            for (int i = r[0]; i < r[1]; i++) {
                assertTrue(members.contains(i), "point " + i + " with its blob");
            }
        }
    }

    @Test
    void medoidAndSpacingByHand() {
        double[][] line = {{0}, {1}, {2}, {3}, {10}};
        // summed distances 16, 13, 12, 13, 44
        assertEquals(2, NoveltyClusters.medoid(line, new int[] {0, 1, 2, 3, 4}));
        // nearest positive distances 1, 1, 2, 2 (the two 3s are identical and do not count as neighbours)
        double[][] pts = {{0}, {1}, {3}, {3}};
        assertEquals(1.5, NoveltyClusters.spacing(pts, pts), 1e-12);
        assertTrue(Double.isNaN(NoveltyClusters.spacing(new double[][] {{2}, {2}}, new double[][] {{2}, {2}})));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> NoveltyClusters.find(pts, 0));
        assertTrue(e.getMessage().contains("radius must be positive: 0.0"), e.getMessage());
    }
}
