package org.winnow.scorer.reference;

import org.winnow.geometry.Checks;

/**
 * The labelled examples a frozen model votes with: their configurations (text form), exact chi,
 * Hodge labels and embeddings ({@code size * dim} doubles, point after point).
 */
public record ReferenceSet(String[] configs, long[] chi, int[][] hodge, double[] embeddings, int dim) {
    public ReferenceSet {
        int n = configs.length;
        Checks.requireArgument(chi.length == n && hodge.length == n,
                "reference arrays disagree: %s configurations, %s chi, %s labels", n, chi.length, hodge.length);
        Checks.requireArgument(embeddings.length == (long) n * dim,
                "reference embeddings hold %s values, expected %s x %s", embeddings.length, n, dim);
    }

    public int size() {
        return configs.length;
    }

    public int h11(int i) {
        return hodge[i][0];
    }
}
