package org.winnow.pipeline;

import io.micrometer.core.instrument.MeterRegistry;

/**
 * What a running {@link Stage} instance may use: its place among the workers, the meter registry and
 * the way downstream. One context per stage instance; it is used from that instance's thread only.
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
}
