package org.winnow.geometry.canonical;

import org.winnow.geometry.Configuration;

/**
 * Canonical forms of configuration matrices under row and column permutations (see
 * {@link CanonicalSearch} for the definition and the algorithm). Two configurations have the same
 * canonical form iff one is a row and column permutation of the other; the canonical text is the
 * dedup key of the pipeline.
 *
 * <p>Thread-safe: each thread uses its own search instance.
 */
public final class CanonicalForm {
    private static final ThreadLocal<CanonicalSearch> SEARCH = ThreadLocal.withInitial(CanonicalSearch::new);

    private CanonicalForm() {}

    /** The canonical representative of the configuration's permutation class. */
    public static Configuration canonical(Configuration c) {
        int m = c.rows();
        int k = c.cols();
        int[] outN = new int[m];
        int[][] outQ = new int[m][k];
        SEARCH.get().canonicalize(c.dims(), c.degrees(), m, k, outN, outQ);
        return Configuration.of(outN, outQ);
    }

    /** The text of the canonical representative: the byte-exact dedup key. */
    public static String canonicalText(Configuration c) {
        return canonical(c).toText();
    }

    /** True iff the configuration is its own canonical form (stops at the first level that proves otherwise). */
    public static boolean isCanonical(Configuration c) {
        return SEARCH.get().isCanonical(c.dims(), c.degrees(), c.rows(), c.cols());
    }
}
