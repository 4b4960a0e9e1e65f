package org.winnow.app.report;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import org.apache.commons.math3.ml.clustering.Cluster;
import org.apache.commons.math3.ml.clustering.Clusterable;
import org.apache.commons.math3.ml.clustering.DBSCANClusterer;
import org.winnow.geometry.Checks;

/**
 * Density clusters (DBSCAN, Euclidean distance in the embedding) of the novel survivors, each with its
 * medoid: the member with the smallest summed distance to the other members, a real configuration
 * that stands for the cluster.
 *
 * <p>The radius is the reference's own spacing: the median distance from a reference point to its
 * nearest other reference point (over an even sample of at most 2,000 reference points when the
 * reference is larger). Two novel survivors are then neighbours when they sit as close as
 * two typical neighbouring reference examples, which makes the radius follow the model's scale
 * without a hand-set number. A point is a core point with at least {@link #MIN_NEIGHBOURS} others
 * within the radius, so the smallest cluster has {@code MIN_NEIGHBOURS + 1} members; isolated
 * novel survivors are counted as noise.
 *
 * @param radius      the neighbourhood radius used
 * @param clusters    the clusters, largest first (ties: smaller medoid index first)
 * @param clustered   how many points fell in some cluster
 * @param noise       how many points fell in none
 */
record NoveltyClusters(double radius, List<Group> clusters, int clustered, int noise) {
    /** Other points a core point needs within the radius. */
    static final int MIN_NEIGHBOURS = 2;

    /**
     * One cluster.
     *
     * @param members indices into the clustered points, ascending
     * @param medoid  index (into the clustered points) of the medoid
     */
    record Group(int[] members, int medoid) {
        int size() {
            return members.length;
        }
    }

    private record Indexed(int index, double[] point) implements Clusterable {
        @Override
        public double[] getPoint() {
            return point;
        }
    }

    /**
     * The median, over {@code queries}, of the distance to the nearest point of {@code all} at a
     * positive distance: the query itself and identical embeddings are left out. NaN when no query
     * has such a neighbour.
     */
    static double spacing(double[][] queries, double[][] all) {
        double[] nearest = new double[queries.length];
        int count = 0;
        for (double[] q : queries) {
            double best = Double.POSITIVE_INFINITY;
            for (double[] x : all) {
                double d = distance(q, x);
                if (d > 0 && d < best) {
                    best = d;
                }
            }
            if (best < Double.POSITIVE_INFINITY) {
                nearest[count++] = best;
            }
        }
        if (count == 0) {
            return Double.NaN;
        }
        double[] s = Arrays.copyOf(nearest, count);
        Arrays.sort(s);
        return count % 2 == 1 ? s[count / 2] : (s[count / 2 - 1] + s[count / 2]) / 2;
    }

    /** Clusters {@code points} with the given radius (positive and finite). */
    static NoveltyClusters find(double[][] points, double radius) {
        Checks.requireArgument(radius > 0 && radius < Double.POSITIVE_INFINITY, "radius must be positive: %s", radius);
        List<Indexed> in = new ArrayList<>(points.length);
        for (int i = 0; i < points.length; i++) {
            in.add(new Indexed(i, points[i]));
        }
        List<Group> groups = new ArrayList<>();
        int clustered = 0;
        for (Cluster<Indexed> c : new DBSCANClusterer<Indexed>(radius, MIN_NEIGHBOURS).cluster(in)) {
            int[] members = c.getPoints().stream().mapToInt(Indexed::index).sorted().toArray();
            groups.add(new Group(members, medoid(points, members)));
            clustered += members.length;
        }
        groups.sort(Comparator.comparingInt(Group::size).reversed().thenComparingInt(Group::medoid));
        return new NoveltyClusters(radius, List.copyOf(groups), clustered, points.length - clustered);
    }

    /** The member with the least summed distance to the others (ties: the smaller index). */
    static int medoid(double[][] points, int[] members) {
        Checks.requireArgument(members.length >= 1, "a medoid needs at least one member");
        int best = members[0];
        double bestSum = Double.POSITIVE_INFINITY;
        for (int a : members) {
            double sum = 0;
            for (int b : members) {
                sum += distance(points[a], points[b]);
            }
            if (sum < bestSum) {
                bestSum = sum;
                best = a;
            }
        }
        return best;
    }

    static double distance(double[] x, double[] y) {
        double s = 0;
        for (int j = 0; j < x.length; j++) {
            double d = x[j] - y[j];
            s += d * d;
        }
        return Math.sqrt(s);
    }
}
