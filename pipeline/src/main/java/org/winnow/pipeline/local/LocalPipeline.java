package org.winnow.pipeline.local;

import io.micrometer.core.instrument.MeterRegistry;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.IntFunction;
import org.winnow.geometry.Checks;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Sequencer;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.Stage;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.channel.BoundedChannel;
import org.winnow.pipeline.channel.ChannelFailedException;
import org.winnow.pipeline.channel.SequenceWindow;
import org.winnow.pipeline.metrics.ChannelMetrics;
import org.winnow.pipeline.metrics.SourceMetrics;

/**
 * Wires a source, N scorer stage instances and one sink stage over bounded channels in this JVM.
 *
 * <p>Threads: one source thread pushes through a {@link Sequencer} into the {@code candidates}
 * channel; N worker threads each own one scorer {@link Stage} and forward into the {@code scored}
 * channel; one sink thread puts the scored records back into seq order and calls the sink stage in
 * that order, gap-free from the resume point. Memory is bounded by the two channel capacities and the
 * {@link SequenceWindow} width, whatever the relative speeds.
 *
 * <p>The first failure on any thread fails the channels and the window, so every other thread stops
 * at its next hand-over; every opened stage is closed, no stage is finished, and {@link #run} throws
 * {@link PipelineException} with the first failure as its cause.
 */
public final class LocalPipeline {
    /**
     * @param workers       scorer threads, at least 1
     * @param queueCapacity capacity of each channel, at least 1
     * @param window        most seqs in flight between source and sink, at least 1
     */
    public record Options(int workers, int queueCapacity, int window) {
        public Options {
            Checks.requireArgument(workers >= 1, "workers must be at least 1: %s", workers);
            Checks.requireArgument(queueCapacity >= 1, "queue capacity must be at least 1: %s", queueCapacity);
            Checks.requireArgument(window >= 1, "window must be at least 1: %s", window);
        }

        /** Defaults: one worker per processor, 1024-record channels, a window of 8192. */
        public Options() {
            this(Runtime.getRuntime().availableProcessors(), 1024, 8192);
        }
    }

    /** What a run produced: the source's counts and the channels' high-water marks. */
    public record Result(SourceReport source, int maxCandidateDepth, int maxScoredDepth, int maxReorderDepth) {}

    private final Options options;
    private final MeterRegistry registry;

    public LocalPipeline(Options options, MeterRegistry registry) {
        this.options = Objects.requireNonNull(options, "options");
        this.registry = Objects.requireNonNull(registry, "registry");
    }

    /**
     * Runs the scan to the end of the source or the first failure.
     *
     * @param source     where candidates come from
     * @param policy     what to do with unusable input
     * @param resumeFrom the first seq not yet committed by the sink
     * @param scorers    makes the scorer stage instance of worker i
     * @param sink       the sink stage; it sees every seq from {@code resumeFrom} on, in order
     * @param sequencer  receives the sequencer before the source starts, so that others (the sink's
     *                   manifest, the live status) can read its report while the run goes on
     */
    public Result run(CandidateSource source, BadInputPolicy policy, long resumeFrom,
            IntFunction<Stage<Candidate, Scored>> scorers, Stage<Scored, Void> sink,
            java.util.function.Consumer<Sequencer> sequencer) throws PipelineException, InterruptedException {
        int n = options.workers();
        BoundedChannel<Candidate> candidates = new BoundedChannel<>("candidates", options.queueCapacity(), 1);
        BoundedChannel<Scored> scored = new BoundedChannel<>("scored", options.queueCapacity(), n);
        ChannelMetrics.bind(registry, candidates);
        ChannelMetrics.bind(registry, scored);
        SequenceWindow window = new SequenceWindow(resumeFrom, options.window());
        Reorder reorder = new Reorder(resumeFrom);
        ChannelMetrics.bindReorder(registry, reorder::depth);
        AtomicReference<Throwable> failure = new AtomicReference<>();
        Runnable failAll = () -> {
            Throwable cause = failure.get();
            candidates.fail(cause);
            scored.fail(cause);
            window.fail(cause);
        };

        Sequencer seq = new Sequencer(resumeFrom, 0, policy, c -> {
            window.admit(c.seq());
            candidates.send(c);
        }, new SourceMetrics(registry), !source.distinct());
        sequencer.accept(seq);

        List<Thread> threads = new ArrayList<>();
        threads.add(thread("winnow-source", failure, failAll, () -> {
            source.run(seq);
            seq.markDone();
            candidates.senderDone();
        }));
        for (int i = 0; i < n; i++) {
            Stage<Candidate, Scored> stage = scorers.apply(i);
            int worker = i;
            threads.add(thread("winnow-scorer-" + i, failure, failAll, () -> {
                try (Closer ignored = new Closer(stage)) {
                    stage.open(StageContext.of("scorer", worker, n, registry, scored::send));
                    for (Candidate c = candidates.receive(); c != null; c = candidates.receive()) {
                        stage.accept(c);
                    }
                    stage.finish();
                }
                scored.senderDone();
            }));
        }
        threads.add(thread("winnow-sink", failure, failAll, () -> {
            try (Closer ignored = new Closer(sink)) {
                sink.open(StageContext.terminal("sink", registry));
                for (Scored s = scored.receive(); s != null; s = scored.receive()) {
                    reorder.put(s);
                    for (Scored next = reorder.next(); next != null; next = reorder.next()) {
                        sink.accept(next);
                    }
                    window.release(reorder.expected());
                }
                Checks.requireState(reorder.depth() == 0, "the scored stream ended with a gap before seq %s",
                        reorder.expected());
                sink.finish();
            }
        }));
        threads.forEach(Thread::start);
        try {
            for (Thread t : threads) {
                t.join();
            }
        } catch (InterruptedException e) {
            failure.compareAndSet(null, e);
            failAll.run();
            for (Thread t : threads) {
                t.join();
            }
            throw e;
        }
        Throwable cause = failure.get();
        if (cause != null) {
            throw new PipelineException(cause);
        }
        return new Result(seq.report(), candidates.maxDepth(), scored.maxDepth(), reorder.maxDepth());
    }

    private interface Body {
        void run() throws Exception;
    }

    private static Thread thread(String name, AtomicReference<Throwable> failure, Runnable failAll, Body body) {
        Thread t = new Thread(() -> {
            try {
                body.run();
            } catch (ChannelFailedException e) {
                // Another thread failed first; its failure is the one reported.
                failure.compareAndSet(null, e);
                failAll.run();
            } catch (Throwable e) {
                failure.compareAndSet(null, e);
                failAll.run();
            }
        }, name);
        t.setDaemon(true);
        return t;
    }

    /** Closes a stage on every path; a close failure after a body failure is attached, not lost. */
    private static final class Closer implements AutoCloseable {
        private final Stage<?, ?> stage;

        Closer(Stage<?, ?> stage) {
            this.stage = stage;
        }

        @Override
        public void close() throws Exception {
            stage.close();
        }
    }

    /** Holds out-of-order records until their predecessors arrive. Sink thread only, except depth(). */
    private static final class Reorder {
        private final Map<Long, Scored> pending = new HashMap<>();
        private volatile long expected;
        private volatile int depth;
        private int maxDepth;

        Reorder(long start) {
            this.expected = start;
        }

        void put(Scored s) {
            Checks.requireState(s.seq() >= expected && pending.putIfAbsent(s.seq(), s) == null,
                    "seq %s arrived twice", s.seq());
            depth = pending.size();
            maxDepth = Math.max(maxDepth, depth);
        }

        Scored next() {
            Scored s = pending.remove(expected);
            if (s != null) {
                expected++;
                depth = pending.size();
            }
            return s;
        }

        long expected() {
            return expected;
        }

        int depth() {
            return depth;
        }

        int maxDepth() {
            return maxDepth;
        }
    }
}
