package org.winnow.producer;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CancellationException;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.locks.Condition;
import java.util.concurrent.locks.ReentrantLock;
import java.util.function.BooleanSupplier;
import java.util.function.Consumer;
import java.util.function.LongPredicate;
import org.winnow.geometry.Configuration;

/**
 * The search tree walked by several threads, with the output of the one-thread walk in its order.
 *
 * <p>Every worker walks the tree above the unit depth (a small part of the work) and so meets every unit
 * in generation order. Units are grouped into batches of {@link #BATCH} consecutive numbers; a worker
 * that meets a batch claims it by a compare-and-set of one counter from that batch to the next, and
 * descends only into the units of the batches it claimed. A worker arriving at a batch has passed every
 * earlier one, each claimed by itself or by another, so the batch it meets is either claimed already or
 * the next in line: the batches are handed out whole, once, to whoever gets there first, which balances
 * subtrees of very different sizes without a plan. Each claimed batch's matrices are collected in a list
 * (built into {@link Configuration}s and text on the worker); the calling thread hands the lists to the
 * consumer in batch order, numbering them as it goes, so the output is the one-thread output, sequence
 * numbers included. Workers stop claiming while more than {@link #MAX_PENDING} matrices wait to be
 * handed out, which bounds the memory whatever the size of the space (the batch the consumer waits for
 * is always in progress or done, so this never deadlocks).
 */
final class ParallelWalk {
    /** Units per batch: small enough to balance, large enough that claims and hand-offs cost nothing. */
    static final int BATCH = 4;
    /** Matrices that may wait for the consumer before workers pause. */
    static final int MAX_PENDING = 1 << 15;

    /** A matrix built by a worker, numbered by the calling thread. */
    private record Item(Configuration configuration, String text, int flags) {}

    private final Bounds bounds;
    private final ExclusionSet rules;
    private final ShardSpec shard;
    private final int threads;

    private final AtomicLong nextClaim = new AtomicLong();
    private final ReentrantLock lock = new ReentrantLock();
    private final Condition posted = lock.newCondition();
    private final Condition drained = lock.newCondition();
    private final Map<Long, List<Item>> ready = new HashMap<>();
    private long pending;
    private long nextToEmit;
    private int finished;
    private Throwable failure;
    private volatile boolean cancelled;

    ParallelWalk(Bounds bounds, ExclusionSet rules, ShardSpec shard, int threads) {
        this.bounds = bounds;
        this.rules = rules;
        this.shard = shard;
        this.threads = threads;
    }

    /**
     * Walks the space on {@code threads} workers and hands every kept matrix to {@code out} on the calling
     * thread, in the one-thread order.
     *
     * @return the number of matrices handed out
     * @throws CancellationException if the calling thread is interrupted (its flag is set again)
     */
    long run(Consumer<? super EnumeratedMatrix> out) {
        List<Runnable> bodies = new ArrayList<>();
        for (int i = 0; i < threads; i++) {
            bodies.add(new Worker());
        }
        List<Thread> workers = start(bodies);
        long seq = 0;
        try {
            for (long batch = 0;; batch++) {
                List<Item> items = await(batch);
                if (items == null) {
                    break;
                }
                for (Item it : items) {
                    out.accept(new EnumeratedMatrix(seq++, it.configuration(), it.text(), it.flags()));
                }
                lock.lock();
                try {
                    pending -= items.size();
                    nextToEmit = batch + 1;
                    drained.signalAll();
                } finally {
                    lock.unlock();
                }
            }
        } catch (RuntimeException | Error e) {
            stop(workers, false);
            throw e;
        }
        stop(workers, true);
        return seq;
    }

    /**
     * Counts what {@link #run} would hand out, per number of rows, asking {@code stop} at every counted
     * matrix (from the worker threads).
     */
    long[] count(BooleanSupplier stop) {
        long[][] byRows = new long[threads][bounds.maxRows() + 1];
        List<Runnable> bodies = new ArrayList<>();
        for (int i = 0; i < threads; i++) {
            bodies.add(new Counter(byRows[i], stop));
        }
        List<Thread> workers = start(bodies);
        try {
            lock.lock();
            try {
                while (finished < threads && failure == null) {
                    posted.await();
                }
            } finally {
                lock.unlock();
            }
        } catch (InterruptedException e) {
            stop(workers, false);
            Thread.currentThread().interrupt();
            throw new CancellationException("count interrupted");
        }
        stop(workers, true);
        long[] total = new long[bounds.maxRows() + 1];
        for (long[] part : byRows) {
            for (int m = 0; m < total.length; m++) {
                total[m] += part[m];
            }
        }
        return total;
    }

    private List<Thread> start(List<Runnable> bodies) {
        List<Thread> workers = new ArrayList<>(threads);
        for (int i = 0; i < threads; i++) {
            Runnable r = bodies.get(i);
            Thread t = new Thread(() -> {
                try {
                    r.run();
                } catch (Throwable e) {
                    lock.lock();
                    try {
                        if (failure == null && !(e instanceof Cancelled)) {
                            failure = e;
                        }
                    } finally {
                        lock.unlock();
                    }
                } finally {
                    lock.lock();
                    try {
                        finished++;
                        posted.signalAll();
                    } finally {
                        lock.unlock();
                    }
                }
            }, "enumerate-" + i);
            t.setDaemon(true);
            workers.add(t);
            t.start();
        }
        return workers;
    }

    /**
     * Cancels the workers (a no-op when they are done) and waits for them; with {@code rethrow}, a worker's
     * failure is thrown here (without, the caller is already throwing its own).
     */
    private void stop(List<Thread> workers, boolean rethrow) {
        cancelled = true;
        lock.lock();
        try {
            drained.signalAll();
        } finally {
            lock.unlock();
        }
        boolean interrupted = false;
        for (Thread t : workers) {
            while (true) {
                try {
                    t.join();
                    break;
                } catch (InterruptedException e) {
                    interrupted = true;
                }
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        lock.lock();
        try {
            if (failure != null && rethrow) {
                Throwable f = failure;
                failure = null;
                if (f instanceof RuntimeException re) {
                    throw re;
                }
                if (f instanceof Error er) {
                    throw er;
                }
                throw new IllegalStateException("enumeration worker failed: " + f, f);
            }
        } finally {
            lock.unlock();
        }
    }

    /** The matrices of {@code batch}, or null after the last batch. */
    private List<Item> await(long batch) {
        lock.lock();
        try {
            while (true) {
                if (failure != null) {
                    return null;
                }
                List<Item> items = ready.remove(batch);
                if (items != null) {
                    return items;
                }
                if (finished == threads) {
                    // Every batch met was claimed and posted; none is missing unless past the last unit.
                    return null;
                }
                posted.await();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new CancellationException("enumeration interrupted");
        } finally {
            lock.unlock();
        }
    }

    /** Thrown inside a worker to leave the tree once the walk is cancelled. */
    private static final class Cancelled extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Cancelled() {
            super(null, null, false, false);
        }
    }

    /** Claims batches as it meets them; the part common to enumeration and counting. */
    private abstract class Claimer implements Runnable, LongPredicate {
        private long batch = -1;
        private boolean mine;

        @Override
        public final boolean test(long unit) {
            if (cancelled) {
                throw new Cancelled();
            }
            long b = unit / BATCH;
            if (b != batch) {
                if (mine) {
                    finish(batch);
                }
                batch = b;
                mine = claim(b);
            }
            return mine && shard.owns(unit);
        }

        private boolean claim(long b) {
            if (nextClaim.get() != b) {
                return false;
            }
            beforeClaim(b);
            return nextClaim.compareAndSet(b, b + 1);
        }

        /** Called before claiming batch {@code b}; may wait. */
        void beforeClaim(long b) {}

        /** The worker's batch {@code b} is complete. */
        abstract void finish(long b);

        @Override
        public final void run() {
            SearchTree tree = new SearchTree(bounds, rules, this, this::leaf);
            for (int[] dims : Ambients.list(bounds)) {
                tree.run(dims);
            }
            if (mine) {
                finish(batch);
                mine = false;
            }
        }

        abstract void leaf(int[] n, int[][] q, int m, int k, int flags);
    }

    private final class Worker extends Claimer {
        private List<Item> items = new ArrayList<>();

        @Override
        void beforeClaim(long b) {
            lock.lock();
            try {
                while (pending > MAX_PENDING && b > nextToEmit && !cancelled) {
                    drained.awaitUninterruptibly();
                }
            } finally {
                lock.unlock();
            }
            if (cancelled) {
                throw new Cancelled();
            }
        }

        @Override
        void finish(long b) {
            List<Item> done = items;
            items = new ArrayList<>();
            lock.lock();
            try {
                ready.put(b, done);
                pending += done.size();
                posted.signalAll();
            } finally {
                lock.unlock();
            }
        }

        @Override
        void leaf(int[] n, int[][] q, int m, int k, int flags) {
            int[] dims = new int[m];
            int[][] degrees = new int[m][k];
            for (int r = 0; r < m; r++) {
                dims[r] = n[r];
                System.arraycopy(q[r], 0, degrees[r], 0, k);
            }
            Configuration c = Configuration.of(dims, degrees);
            items.add(new Item(c, c.toText(), flags));
        }
    }

    private final class Counter extends Claimer {
        private final long[] byRows;
        private final BooleanSupplier stop;

        Counter(long[] byRows, BooleanSupplier stop) {
            this.byRows = byRows;
            this.stop = stop;
        }

        @Override
        void finish(long b) {}

        @Override
        void leaf(int[] n, int[][] q, int m, int k, int flags) {
            if (stop.getAsBoolean()) {
                throw new CancellationException("count stopped");
            }
            byRows[m]++;
        }
    }
}
