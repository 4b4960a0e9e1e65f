package org.winnow.scorer.model;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.winnow.geometry.Checks;

/**
 * Exact neighbour search for anchored embeddings, whose last coordinate is an integer (the h11
 * estimate times {@link Architecture#ANCHOR_SCALE}). The points are grouped by that coordinate, one
 * {@link FlatIndex} per value; a query scans its own group first, then the groups outwards in order of
 * anchor difference, and stops once that difference alone exceeds the k-th best distance (a distance is
 * at least its difference in any one coordinate). With a reference spread over twenty h11 values the
 * scan touches a few groups instead of every point.
 *
 * <p>Within a group the anchor coordinate is the same for every point, so a group stores only the
 * learned coordinates and adds the anchor's squared difference to each point's sum at the end, where a
 * scan over all coordinates adds it (the anchor is the last coordinate).
 *
 * <p>Results are those of one {@link FlatIndex} over all points, bit for bit: each group keeps its
 * points in reference order and sums coordinates in the same order, and the groups' results are merged
 * on squared distances, equal ones by the lower reference index, as the sequential scan ranks them
 * (tested against it, ties included). Merging on the square roots, as an earlier version did, could
 * swap two points: distinct squared distances can share a rounded square root, and the index then
 * decided where the flat scan's squared distance did. The stopping test compares squared distances too
 * and is exact in floating point: a point's squared distance is its anchor term plus a non-negative
 * sum, and rounding is monotone, so it is never below its anchor term.
 */
final class AnchoredIndex implements NeighbourIndex {
    private final int n;
    private final int dim;
    /** Coordinates stored per point in a group: all but the anchor. */
    private final int stored;
    private final double[] anchors;
    private final FlatIndex[] groups;
    private final int[][] members;
    private final int[] groupOf;
    private final int[] localIndex;
    private final ThreadLocal<Scratch> scratch = ThreadLocal.withInitial(Scratch::new);

    private static final class Scratch {
        int[] index = new int[0];
        double[] distance = new double[0];

        void ensure(int k) {
            if (index.length < k) {
                index = new int[k];
                distance = new double[k];
            }
        }
    }

    AnchoredIndex(double[] points, int dim) {
        Checks.requireArgument(dim >= 1, "dimension must be positive: %s", dim);
        Checks.requireArgument(points.length % dim == 0, "%s coordinates do not split into points of dimension %s",
                points.length, dim);
        this.dim = dim;
        this.n = points.length / dim;
        double[] values = new double[n];
        for (int i = 0; i < n; i++) {
            values[i] = points[i * dim + dim - 1];
        }
        this.anchors = Arrays.stream(values).distinct().sorted().toArray();
        List<List<Integer>> byGroup = new ArrayList<>();
        for (int g = 0; g < anchors.length; g++) {
            byGroup.add(new ArrayList<>());
        }
        this.groupOf = new int[n];
        this.localIndex = new int[n];
        for (int i = 0; i < n; i++) {
            int g = Arrays.binarySearch(anchors, values[i]);
            groupOf[i] = g;
            localIndex[i] = byGroup.get(g).size();
            byGroup.get(g).add(i);
        }
        // A one-dimensional point is its anchor: its group stores that coordinate and adds no tail.
        this.stored = dim > 1 ? dim - 1 : 1;
        this.groups = new FlatIndex[anchors.length];
        this.members = new int[anchors.length][];
        for (int g = 0; g < anchors.length; g++) {
            members[g] = byGroup.get(g).stream().mapToInt(Integer::intValue).toArray();
            double[] mine = new double[members[g].length * stored];
            for (int p = 0; p < members[g].length; p++) {
                System.arraycopy(points, members[g][p] * dim, mine, p * stored, stored);
            }
            groups[g] = new FlatIndex(mine, stored);
        }
    }

    @Override
    public int size() {
        return n;
    }

    @Override
    public int dim() {
        return dim;
    }

    @Override
    public int search(double[] query, int k, int exclude, int[] index, double[] distance) {
        Checks.requireArgument(k >= 0, "k must not be negative: %s", k);
        if (k == 0 || n == 0) {
            return 0;
        }
        Scratch s = scratch.get();
        s.ensure(k);
        double a = query[dim - 1];
        int right = Arrays.binarySearch(anchors, a);
        if (right < 0) {
            right = -right - 1;
        }
        int left = right - 1;
        int found = 0;
        while (left >= 0 || right < anchors.length) {
            int g;
            if (left < 0) {
                g = right++;
            } else if (right >= anchors.length) {
                g = left--;
            } else if (a - anchors[left] <= anchors[right] - a) {
                g = left--;
            } else {
                g = right++;
            }
            double diff = anchors[g] - a; // the flat scan's last term: coordinate minus query, squared
            double tail = diff * diff;
            if (found == k && tail > distance[k - 1]) {
                break; // every further group is at least this far away
            }
            int localExclude = exclude >= 0 && groupOf[exclude] == g ? localIndex[exclude] : -1;
            int got = groups[g].searchSquared(query, k, localExclude, s.index, s.distance, dim > 1 ? tail : 0.0);
            for (int j = 0; j < got; j++) {
                found = insert(members[g][s.index[j]], s.distance[j], k, found, index, distance);
            }
        }
        // distance[] held squared distances so far.
        for (int j = 0; j < found; j++) {
            distance[j] = Math.sqrt(distance[j]);
        }
        return found;
    }

    /** Inserts (reference index, distance) into the k best, ordered by distance then index. */
    private static int insert(int ref, double d, int k, int found, int[] index, double[] distance) {
        if (found == k && !(d < distance[k - 1] || (d == distance[k - 1] && ref < index[k - 1]))) {
            return found;
        }
        int pos = found < k ? found : k - 1;
        while (pos > 0 && (distance[pos - 1] > d || (distance[pos - 1] == d && index[pos - 1] > ref))) {
            distance[pos] = distance[pos - 1];
            index[pos] = index[pos - 1];
            pos--;
        }
        distance[pos] = d;
        index[pos] = ref;
        return found < k ? found + 1 : found;
    }
}
