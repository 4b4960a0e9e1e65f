package org.winnow.scorer.model;

import org.winnow.geometry.Checks;

/**
 * Brute-force neighbour search. In the 8-dimensional embeddings used here this beats a KD-tree (see
 * docs/benchmarks.md, "Similarity model"): the tree cannot prune much in 8 dimensions and pays for
 * pointer chasing, while the scan is a tight loop over a few thousand cache-resident points.
 *
 * <p>The points are stored coordinate by coordinate ({@code columns[i][p]}) and scanned in blocks of
 * {@value #BLOCK}: for each coordinate in turn, the squared differences of the whole block are added
 * to its partial sums, a loop the JIT turns into SIMD code; then the block's sums are merged into
 * the k best. Each distance is still summed coordinate 0 first, so it is bit for bit the sum a point
 * by point scan gives. This replaced a point-by-point scan that abandoned partial sums above the
 * k-th best, which was several times slower on eight dimensions (one mispredicted branch per point,
 * no SIMD; docs/benchmarks.md, "Side by side").
 */
public final class FlatIndex implements NeighbourIndex {
    private static final int BLOCK = 256;

    private final double[][] columns;
    private final int n;
    private final int dim;
    // One scratch block per thread: the index is shared by all of a model's predictors.
    private final ThreadLocal<double[]> partial = ThreadLocal.withInitial(() -> new double[BLOCK]);

    /** Wraps {@code points} (copied) holding {@code points.length / dim} points of dimension {@code dim}. */
    public FlatIndex(double[] points, int dim) {
        Checks.requireArgument(dim >= 1, "dimension must be positive: %s", dim);
        Checks.requireArgument(points.length % dim == 0, "%s coordinates do not split into points of dimension %s",
                points.length, dim);
        this.dim = dim;
        this.n = points.length / dim;
        this.columns = new double[dim][n];
        for (int p = 0; p < n; p++) {
            for (int i = 0; i < dim; i++) {
                columns[i][p] = points[p * dim + i];
            }
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
        if (k == 0) {
            return 0;
        }
        double[] s = partial.get();
        int found = 0;
        // distance[] holds squared distances until the end, kept sorted ascending.
        for (int base = 0; base < n; base += BLOCK) {
            int len = Math.min(BLOCK, n - base);
            for (int p = 0; p < len; p++) {
                s[p] = 0;
            }
            for (int i = 0; i < dim; i++) {
                double[] c = columns[i];
                double q = query[i];
                for (int p = 0; p < len; p++) {
                    double diff = c[base + p] - q;
                    s[p] += diff * diff;
                }
            }
            for (int p = 0; p < len; p++) {
                if (base + p == exclude) {
                    continue;
                }
                double d = s[p];
                // Strictly closer than the k-th best, or room left: insert after all equal distances.
                if (found < k || d < distance[k - 1]) {
                    int pos = found < k ? found : k - 1;
                    while (pos > 0 && distance[pos - 1] > d) {
                        distance[pos] = distance[pos - 1];
                        index[pos] = index[pos - 1];
                        pos--;
                    }
                    distance[pos] = d;
                    index[pos] = base + p;
                    if (found < k) {
                        found++;
                    }
                }
            }
        }
        for (int j = 0; j < found; j++) {
            distance[j] = Math.sqrt(distance[j]);
        }
        return found;
    }
}
