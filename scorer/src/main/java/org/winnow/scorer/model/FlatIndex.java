package org.winnow.scorer.model;

import org.winnow.geometry.Checks;

/**
 * Brute-force neighbour search over points stored contiguously ({@code n * dim} doubles, one point
 * after the other), so a query streams through memory in order. In the 8-dimensional embeddings used
 * here this beats a KD-tree (see docs/benchmarks.md, "Similarity model"): the tree cannot prune much
 * in 8 dimensions and pays for pointer chasing, while the scan is a tight loop over a few thousand
 * cache-resident points. A partial distance is abandoned as soon as it exceeds the current k-th best.
 */
public final class FlatIndex implements NeighbourIndex {
    private final double[] points;
    private final int n;
    private final int dim;

    /** Wraps {@code points} (copied) holding {@code points.length / dim} points of dimension {@code dim}. */
    public FlatIndex(double[] points, int dim) {
        Checks.requireArgument(dim >= 1, "dimension must be positive: %s", dim);
        Checks.requireArgument(points.length % dim == 0, "%s coordinates do not split into points of dimension %s",
                points.length, dim);
        this.points = points.clone();
        this.dim = dim;
        this.n = points.length / dim;
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
        if (k == 0) {
            return 0;
        }
        int found = 0;
        // distance[] holds squared distances until the end, kept sorted ascending.
        for (int p = 0; p < n; p++) {
            if (p == exclude) {
                continue;
            }
            double bound = found == k ? distance[k - 1] : Double.POSITIVE_INFINITY;
            int off = p * dim;
            double s = 0;
            int i = 0;
            for (; i < dim && s <= bound; i++) {
                double diff = points[off + i] - query[i];
                s += diff * diff;
            }
            // Strictly closer than the k-th best, or room left: insert after all equal distances.
            if (i == dim && (found < k || s < bound)) {
                int pos = found < k ? found : k - 1;
                while (pos > 0 && distance[pos - 1] > s) {
                    distance[pos] = distance[pos - 1];
                    index[pos] = index[pos - 1];
                    pos--;
                }
                distance[pos] = s;
                index[pos] = p;
                if (found < k) {
                    found++;
                }
            }
        }
        for (int j = 0; j < found; j++) {
            distance[j] = Math.sqrt(distance[j]);
        }
        return found;
    }
}
