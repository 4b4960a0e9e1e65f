package org.winnow.scorer.index;

import org.winnow.geometry.Checks;

/**
 * Brute-force neighbour search. In the 8-dimensional embeddings used here this beats a KD-tree (see
 * docs/benchmarks.md, "Similarity model"): the tree cannot prune much in 8 dimensions and pays for
 * pointer chasing, while the scan is a tight loop over a few thousand cache-resident points.
 *
 * <p>The points are kept in blocks of {@value #BLOCK}, each block coordinate by coordinate
 * ({@code blocks[b][i][p]}). A query first adds, coordinate after coordinate, the squared differences
 * of a whole block to the block's partial sums (a loop over equal indices of two arrays, which the
 * JIT turns into SIMD code), then merges the block's sums into the k best. Each distance is still
 * summed coordinate 0 first, so it is bit for bit the sum a point-by-point scan gives. This replaced
 * a point-by-point scan that abandoned partial sums above the k-th best, several times slower on eight
 * dimensions (a mispredicted branch per point, no SIMD; docs/benchmarks.md, "Side by side").
 */
public final class FlatIndex implements NeighbourIndex {
    private static final int BLOCK = 256;

    private final double[][][] blocks;
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
        this.blocks = new double[(n + BLOCK - 1) / BLOCK][dim][];
        for (int b = 0; b < blocks.length; b++) {
            int len = Math.min(BLOCK, n - b * BLOCK);
            for (int i = 0; i < dim; i++) {
                double[] c = new double[len];
                for (int p = 0; p < len; p++) {
                    c[p] = points[(b * BLOCK + p) * dim + i];
                }
                blocks[b][i] = c;
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
        int found = searchSquared(query, k, exclude, index, distance, 0.0);
        for (int j = 0; j < found; j++) {
            distance[j] = Math.sqrt(distance[j]);
        }
        return found;
    }

    /**
     * The search on squared distances, each plus {@code tail} (a last coordinate's squared difference that
     * is the same for every point, which the caller keeps out of the stored points), added after the
     * stored coordinates as a scan over all coordinates would add it; {@code k} at least 1. Equal
     * distances come in increasing index.
     */
    int searchSquared(double[] query, int k, int exclude, int[] index, double[] distance, double tail) {
        double[] s = partial.get();
        int found = 0;
        double bound = Double.POSITIVE_INFINITY; // the k-th best once k are found
        // distance[] holds squared distances, kept sorted ascending.
        for (int b = 0; b < blocks.length; b++) {
            double[][] block = blocks[b];
            int len = block[0].length;
            double[] c0 = block[0];
            double q0 = query[0];
            for (int p = 0; p < len; p++) {
                double diff = c0[p] - q0;
                s[p] = diff * diff;
            }
            for (int i = 1; i < dim; i++) {
                double[] c = block[i];
                double q = query[i];
                for (int p = 0; p < len; p++) {
                    double diff = c[p] - q;
                    s[p] += diff * diff;
                }
            }
            int base = b * BLOCK;
            for (int p = 0; p < len; p++) {
                double d = s[p] + tail;
                // Strictly closer than the k-th best, or room left: insert after all equal distances.
                if ((d < bound || found < k) && base + p != exclude) {
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
                    if (found == k) {
                        bound = distance[k - 1];
                    }
                }
            }
        }
        return found;
    }
}
