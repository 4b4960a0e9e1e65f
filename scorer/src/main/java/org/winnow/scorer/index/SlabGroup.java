package org.winnow.scorer.index;

import java.util.Arrays;
import java.util.Comparator;
import org.winnow.geometry.Checks;

/**
 * One anchor group of {@link AnchoredIndex}: its points sorted along the stored coordinate of widest
 * spread (the "axis") and cut into slabs of {@value #SLAB} consecutive points, each slab stored coordinate
 * by coordinate for a loop the JIT vectorises. A query scans the slab its own axis value falls in, then
 * the slabs outwards, nearer side first, and stops on a side once the axis gap to that side's next slab
 * alone exceeds the k-th best squared distance: every point beyond is at least that far in one
 * coordinate, so at least that far in all. Where the k nearest lie within about one spread of the query
 * along the axis, this skips the slabs outside that window instead of scanning the whole group.
 *
 * <p>Exact, bit for bit the flat scan's answer. Each point's squared distance is summed in the flat
 * scan's order (stored coordinate 0 first, then the caller's tail term), so it is the same double. The
 * stopping test needs no slack: a sum of non-negative terms rounded after each addition is never below
 * any one of its rounded terms (rounding is monotone), the axis term of every point beyond a slab edge
 * is at least the edge's (same subtraction and square, monotone in the coordinate), and the test
 * stops only when that bound is strictly above the k-th best, so no point that could enter or tie is
 * skipped. Points are visited out of reference order, so equal distances are ranked by reference index
 * explicitly, as the flat scan ranks them.
 */
final class SlabGroup {
    /** Points per slab: small enough to skip at a fine grain, long enough for a vectorised loop. */
    static final int SLAB = 32;

    private final int stored;
    private final int axis;
    /** {@code slabs[s][i][p]}: coordinate i of the p-th point of slab s. */
    private final double[][][] slabs;
    /** {@code ids[s][p]}: the caller's id (reference index) of the p-th point of slab s. */
    private final int[][] ids;
    /** Axis value of each slab's first and last point (the smallest and the largest). */
    private final double[] lo;
    private final double[] hi;

    /**
     * @param points   {@code pointIds.length} points of dimension {@code stored}, point by point
     * @param pointIds the id of each point, reported by {@link #search}; ties are ranked by it
     */
    SlabGroup(double[] points, int stored, int[] pointIds) {
        Checks.requireArgument(stored >= 1, "stored coordinates must be positive: %s", stored);
        Checks.requireArgument(points.length == (long) pointIds.length * stored,
                "%s coordinates are not %s points of dimension %s", points.length, pointIds.length, stored);
        this.stored = stored;
        int n = pointIds.length;
        this.axis = widest(points, stored, n);
        Integer[] order = new Integer[n];
        for (int p = 0; p < n; p++) {
            order[p] = p;
        }
        int ax = axis;
        Arrays.sort(order, Comparator.<Integer>comparingDouble(p -> points[p * stored + ax]).thenComparingInt(p -> p));
        int count = (n + SLAB - 1) / SLAB;
        this.slabs = new double[count][stored][];
        this.ids = new int[count][];
        this.lo = new double[count];
        this.hi = new double[count];
        for (int s = 0; s < count; s++) {
            int len = Math.min(SLAB, n - s * SLAB);
            ids[s] = new int[len];
            for (int i = 0; i < stored; i++) {
                slabs[s][i] = new double[len];
            }
            for (int p = 0; p < len; p++) {
                int src = order[s * SLAB + p];
                ids[s][p] = pointIds[src];
                for (int i = 0; i < stored; i++) {
                    slabs[s][i][p] = points[src * stored + i];
                }
            }
            lo[s] = slabs[s][axis][0];
            hi[s] = slabs[s][axis][len - 1];
        }
    }

    /** The coordinate with the largest variance (the first of equal ones). */
    private static int widest(double[] points, int stored, int n) {
        int best = 0;
        double bestVar = -1;
        for (int i = 0; i < stored; i++) {
            double mean = 0;
            for (int p = 0; p < n; p++) {
                mean += points[p * stored + i];
            }
            mean /= Math.max(n, 1);
            double var = 0;
            for (int p = 0; p < n; p++) {
                double d = points[p * stored + i] - mean;
                var += d * d;
            }
            if (var > bestVar) {
                bestVar = var;
                best = i;
            }
        }
        return best;
    }

    /** Number of points. */
    int size() {
        int n = 0;
        for (int[] s : ids) {
            n += s.length;
        }
        return n;
    }

    /**
     * Merges this group's points into the caller's k best: {@code index[0..found)} and
     * {@code distance[0..found)} hold ids and squared distances, ascending by distance then id. Each
     * point's squared distance is its stored coordinates' squared differences from {@code query} summed
     * in order, plus {@code tail}. The point with id {@code exclude} is skipped.
     *
     * @param scratch at least {@value #SLAB} doubles
     * @return the new number found, at most {@code k} (at least 1)
     */
    int search(double[] query, int k, int exclude, int[] index, double[] distance, int found, double tail,
            double[] scratch) {
        int count = slabs.length;
        if (count == 0) {
            return found;
        }
        double qa = query[axis];
        // The last slab whose smallest axis value is at most the query's (the first slab if none is).
        int first = 0;
        int a = 0;
        int b = count - 1;
        while (a <= b) {
            int mid = (a + b) >>> 1;
            if (lo[mid] <= qa) {
                first = mid;
                a = mid + 1;
            } else {
                b = mid - 1;
            }
        }
        found = scan(first, query, k, exclude, index, distance, found, tail, scratch);
        int left = first - 1;
        int right = first + 1;
        while (left >= 0 || right < count) {
            // Slabs left of the first have every axis value at most hi[left] <= qa; right of it, at least
            // lo[right] > qa. Their squared gaps bound every point's distance from below.
            double gl = Double.POSITIVE_INFINITY;
            if (left >= 0) {
                double d = hi[left] - qa;
                gl = d < 0 ? d * d : 0;
            }
            double gr = Double.POSITIVE_INFINITY;
            if (right < count) {
                double d = lo[right] - qa;
                gr = d > 0 ? d * d : 0;
            }
            double g = Math.min(gl, gr);
            if (found == k && g > distance[k - 1]) {
                break; // both sides are at least this far, and only get farther
            }
            if (left >= 0 && (right >= count || gl <= gr)) {
                found = scan(left--, query, k, exclude, index, distance, found, tail, scratch);
            } else {
                found = scan(right++, query, k, exclude, index, distance, found, tail, scratch);
            }
        }
        return found;
    }

    private int scan(int slab, double[] query, int k, int exclude, int[] index, double[] distance, int found,
            double tail, double[] s) {
        double[][] block = slabs[slab];
        int[] id = ids[slab];
        int len = id.length;
        double[] c0 = block[0];
        double q0 = query[0];
        for (int p = 0; p < len; p++) {
            double diff = c0[p] - q0;
            s[p] = diff * diff;
        }
        for (int i = 1; i < stored; i++) {
            double[] c = block[i];
            double q = query[i];
            for (int p = 0; p < len; p++) {
                double diff = c[p] - q;
                s[p] += diff * diff;
            }
        }
        for (int p = 0; p < len; p++) {
            double d = s[p] + tail;
            int ref = id[p];
            if (found == k && !(d < distance[k - 1] || (d == distance[k - 1] && ref < index[k - 1]))) {
                continue;
            }
            if (ref == exclude) {
                continue;
            }
            int pos = found < k ? found : k - 1;
            while (pos > 0 && (distance[pos - 1] > d || (distance[pos - 1] == d && index[pos - 1] > ref))) {
                distance[pos] = distance[pos - 1];
                index[pos] = index[pos - 1];
                pos--;
            }
            distance[pos] = d;
            index[pos] = ref;
            if (found < k) {
                found++;
            }
        }
        return found;
    }
}
