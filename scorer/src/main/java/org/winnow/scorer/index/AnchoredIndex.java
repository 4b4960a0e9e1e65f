package org.winnow.scorer.index;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.winnow.geometry.Checks;

/**
 * Exact neighbour search for anchored embeddings, whose last coordinate is an integer (the h11
 * estimate times {@link org.winnow.scorer.network.Architecture#ANCHOR_SCALE}). The points are grouped by that coordinate, one
 * {@link SlabGroup} per value; a query scans its own group first, then the groups outwards in order of
 * anchor difference, and stops once that difference alone exceeds the k-th best distance (a distance is
 * at least its difference in any one coordinate). With a reference spread over twenty h11 values the
 * scan touches a few groups instead of every point; within a group, {@link SlabGroup} skips in the same
 * way the slabs that lie too far along its widest learned coordinate.
 *
 * <p>Within a group the anchor coordinate is the same for every point, so a group stores only the
 * learned coordinates and adds the anchor's squared difference to each point's sum at the end, where a
 * scan over all coordinates adds it (the anchor is the last coordinate).
 *
 * <p>Results are those of one {@link FlatIndex} over all points, bit for bit: each point's squared
 * distance is summed in the same order, and the k best are kept on squared distances, equal ones by the
 * lower reference index, as the sequential scan ranks them (tested against it, ties included). Ranking
 * on the square roots, as an earlier version did, could swap two points: distinct squared distances can
 * share a rounded square root, and the index then decided where the flat scan's squared distance did.
 * The stopping tests compare squared distances too and are exact in floating point: a point's squared
 * distance is a sum of non-negative rounded terms, and rounding is monotone, so it is never below any
 * one of them.
 */
public final class AnchoredIndex implements NeighbourIndex {
    private final int n;
    private final int dim;
    /** Coordinates stored per point in a group: all but the anchor. */
    private final int stored;
    private final double[] anchors;
    private final SlabGroup[] groups;
    // One scratch slab per thread: the index is shared by all of a model's predictors.
    private final ThreadLocal<double[]> scratch = ThreadLocal.withInitial(() -> new double[SlabGroup.SLAB]);

    public AnchoredIndex(double[] points, int dim) {
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
        for (int i = 0; i < n; i++) {
            byGroup.get(Arrays.binarySearch(anchors, values[i])).add(i);
        }
        // A one-dimensional point is its anchor: its group stores that coordinate and adds no tail.
        this.stored = dim > 1 ? dim - 1 : 1;
        this.groups = new SlabGroup[anchors.length];
        for (int g = 0; g < anchors.length; g++) {
            int[] members = byGroup.get(g).stream().mapToInt(Integer::intValue).toArray();
            double[] mine = new double[members.length * stored];
            for (int p = 0; p < members.length; p++) {
                System.arraycopy(points, members[p] * dim, mine, p * stored, stored);
            }
            groups[g] = new SlabGroup(mine, stored, members);
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
        double[] s = scratch.get();
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
            found = groups[g].search(query, k, exclude, index, distance, found, dim > 1 ? tail : 0.0, s);
        }
        // distance[] held squared distances so far.
        for (int j = 0; j < found; j++) {
            distance[j] = Math.sqrt(distance[j]);
        }
        return found;
    }
}
