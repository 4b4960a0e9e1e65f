package org.winnow.pipeline;

import io.micrometer.core.instrument.MeterRegistry;
import java.util.Objects;

/**
 * What a running {@link Stage} instance may use: its place among the workers, the meter registry and
 * the way downstream. One context per stage instance; it is used from that instance's thread only.
 * Runners make theirs with {@link #of}, {@link #single} or {@link #terminal} rather than by hand.
 *
 * @param <O> the type of record the stage forwards
 */
public interface StageContext<O> {
    /** The stage's name, as used in metric tags and thread names. */
    String stageName();

    /** This instance's index among the stage's workers, 0-based. */
    int worker();

    /** How many instances of the stage run. */
    int workers();

    /** The registry every instance of the run reports to. */
    MeterRegistry registry();

    /** Hands a record to the next stage; blocks while the next stage is full (backpressure). */
    void forward(O record) throws InterruptedException;

    /** Where a context's records go. */
    @FunctionalInterface
    interface Downstream<O> {
        void forward(O record) throws InterruptedException;
    }

    /** The context of worker {@code worker} of {@code workers}, forwarding to {@code downstream}. */
    static <O> StageContext<O> of(String stageName, int worker, int workers, MeterRegistry registry,
            Downstream<O> downstream) {
        return new Basic<>(stageName, worker, workers, registry, downstream);
    }

    /** The context of a stage that runs as one instance (worker 0 of 1). */
    static <O> StageContext<O> single(String stageName, MeterRegistry registry, Downstream<O> downstream) {
        return of(stageName, 0, 1, registry, downstream);
    }

    /** The context of a single last stage, which forwards nothing: forwarding is a programming error. */
    static StageContext<Void> terminal(String stageName, MeterRegistry registry) {
        return single(stageName, registry, record -> {
            throw new IllegalStateException("the " + stageName + " forwards nothing");
        });
    }

    /** The one implementation behind the factories. */
    record Basic<O>(String stageName, int worker, int workers, MeterRegistry registry, Downstream<O> downstream)
            implements StageContext<O> {
        public Basic {
            Objects.requireNonNull(stageName, "stageName");
            Objects.requireNonNull(registry, "registry");
            Objects.requireNonNull(downstream, "downstream");
            if (worker < 0 || worker >= workers) {
                throw new IllegalArgumentException("worker must be in [0, " + workers + "): " + worker);
            }
        }

        @Override
        public void forward(O record) throws InterruptedException {
            downstream.forward(record);
        }
    }
}
