package org.winnow.scorer.index;

/**
 * Exact k-nearest-neighbour search in Euclidean space over a fixed point set. Implementations fill the
 * caller's buffers and allocate nothing per query; results come nearest first, equal distances in
 * increasing point index, so every implementation agrees with a brute-force scan exactly.
 */
public interface NeighbourIndex {
    /** Number of points. */
    int size();

    /** Dimension of every point. */
    int dim();

    /**
     * Finds the {@code k} points nearest to {@code query}, skipping point {@code exclude} (or none if
     * it is negative), writing their indices and Euclidean distances to {@code index[0..]} and
     * {@code distance[0..]}.
     *
     * @return the number of neighbours written, {@code min(k, size - excluded)}
     */
    int search(double[] query, int k, int exclude, int[] index, double[] distance);
}
