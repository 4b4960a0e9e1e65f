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
    public long run(Bounds bounds, ExclusionSet rules, ShardSpec shard, Consumer<? super EnumeratedMatrix> out) {
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

    /**
     * Runs the enumeration on {@code threads} worker threads and pushes every kept matrix to {@code out} on
     * the calling thread, in the same order and with the same sequence numbers as {@link #run(Bounds,
     * ExclusionSet, ShardSpec, Consumer)}; one thread is that method. The workers build the configurations and
     * their text, so the calling thread's consumer overlaps with the search.
     *
     * @return the number of matrices pushed
     * @throws CancellationException if the calling thread is interrupted while it waits (its interrupt
     *     flag is set again); the workers are stopped before this returns or throws
     */
    public long run(Bounds bounds, ExclusionSet rules, ShardSpec shard, int threads,
            Consumer<? super EnumeratedMatrix> out) {
        Checks.requireArgument(threads >= 1, "threads must be at least 1, got %s", threads);
        if (threads == 1) {
            return run(bounds, rules, shard, out);
        }
        Checks.requireArgument(bounds != null && rules != null && shard != null && out != null,
                "bounds, rules, shard and consumer are required");
        return new ParallelWalk(bounds, rules, shard, threads).run(out);
    }

    /**
     * Counts on {@code threads} worker threads what {@link #run} would emit; {@code stop} is asked from
     * the workers.
     *
     * @throws CancellationException when stopped before the end
     */
    public EnumerationCounts count(Bounds bounds, ExclusionSet rules, ShardSpec shard, int threads, BooleanSupplier stop) {
        Checks.requireArgument(threads >= 1, "threads must be at least 1, got %s", threads);
        if (threads == 1) {
            return count(bounds, rules, shard, stop);
        }
        Checks.requireArgument(bounds != null && rules != null && shard != null && stop != null,
                "bounds, rules, shard and stop are required");
        return new EnumerationCounts(new ParallelWalk(bounds, rules, shard, threads).count(stop));
    }

    /** Counts what {@link #run} would emit, per number of rows. */
    public EnumerationCounts count(Bounds bounds, ExclusionSet rules, ShardSpec shard) {
        return count(bounds, rules, shard, () -> false);
    }

    /**
     * Counts what {@link #run} would emit, giving up as soon as {@code stop} says so (it is asked at
     * every counted matrix), for a count that runs beside a scan and is no longer wanted when the scan ends.
     *
     * @throws CancellationException when stopped before the end
     */
    public EnumerationCounts count(Bounds bounds, ExclusionSet rules, ShardSpec shard, BooleanSupplier stop) {
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

    private static void walk(Bounds bounds, ExclusionSet rules, ShardSpec shard, SearchTree.Leaf leaf) {
        SearchTree tree = new SearchTree(bounds, rules, shard, leaf);
        for (int[] dims : Ambients.list(bounds)) {
            tree.run(dims);
        }
    }
}
