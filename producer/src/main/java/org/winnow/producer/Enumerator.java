package org.winnow.producer;

import java.util.List;
import java.util.concurrent.CancellationException;
import java.util.function.BooleanSupplier;
import java.util.function.Consumer;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * Streams the canonical configuration matrices of a space, each permutation class exactly once,
 * in a deterministic order (ambients by number of rows, then n descending; within an ambient the
 * generation order), with memory independent of the size of the space.
 *
 * <p>For an ETA, {@link #count} gives the exact total of a run; it walks the same tree without
 * building output objects and costs roughly the same as a run (a few seconds for the three-fold
 * space). Instances hold no state between calls and may be shared; each call runs on the calling
 * thread.
 */
public final class Enumerator {
    /**
     * Runs the enumeration and pushes every kept matrix to {@code out}, on the calling thread.
     *
     * @return the number of matrices pushed
     */
    public long run(Bounds bounds, RuleSet rules, ShardSpec shard, Consumer<? super EnumeratedMatrix> out) {
        Checks.requireArgument(bounds != null && rules != null && shard != null && out != null,
                "bounds, rules, shard and consumer are required");
        long[] seq = new long[1];
        SearchTree.Leaf leaf = (n, q, m, k, flags) -> {
            int[] dims = new int[m];
            int[][] degrees = new int[m][k];
            for (int r = 0; r < m; r++) {
                dims[r] = n[r];
                System.arraycopy(q[r], 0, degrees[r], 0, k);
            }
            Configuration c = Configuration.of(dims, degrees);
            out.accept(new EnumeratedMatrix(seq[0]++, c, c.toText(), flags));
        };
        walk(bounds, rules, shard, leaf);
        return seq[0];
    }

    /** Counts what {@link #run} would emit, per number of rows. */
    public EnumerationCounts count(Bounds bounds, RuleSet rules, ShardSpec shard) {
        return count(bounds, rules, shard, () -> false);
    }

    /**
     * Counts what {@link #run} would emit, giving up as soon as {@code stop} says so (it is asked at
     * every counted matrix), for a count that runs beside a scan and is no longer wanted when the scan ends.
     *
     * @throws CancellationException when stopped before the end
     */
    public EnumerationCounts count(Bounds bounds, RuleSet rules, ShardSpec shard, BooleanSupplier stop) {
        Checks.requireArgument(bounds != null && rules != null && shard != null && stop != null,
                "bounds, rules, shard and stop are required");
        long[] byRows = new long[bounds.maxRows() + 1];
        walk(bounds, rules, shard, (n, q, m, k, flags) -> {
            if (stop.getAsBoolean()) {
                throw new CancellationException("count stopped after " + java.util.Arrays.stream(byRows).sum());
            }
            byRows[m]++;
        });
        return new EnumerationCounts(byRows);
    }

    /** The ambients (non-increasing n-vectors) searched for these bounds, in search order. */
    public static List<int[]> ambients(Bounds bounds) {
        return Ambients.list(bounds);
    }

    private static void walk(Bounds bounds, RuleSet rules, ShardSpec shard, SearchTree.Leaf leaf) {
        SearchTree tree = new SearchTree(bounds, rules, shard, leaf);
        for (int[] dims : Ambients.list(bounds)) {
            tree.run(dims);
        }
    }
}
