package org.winnow.pipeline;

/**
 * One step of a scan that consumes records of type {@code I} and may forward records of type
 * {@code O} downstream through its {@link StageContext}.
 *
 * <p>Lifecycle and threading, as the runner ({@link org.winnow.pipeline.local.LocalPipeline}, or a
 * Kafka process later) drives it:
 * <ol>
 *   <li>{@link #open} once, on the thread that will call {@link #accept}, before any record;</li>
 *   <li>{@link #accept} once per record, always on that same thread, never concurrently; a stage that
 *       runs on N workers has N instances, one per thread, so an instance needs no locking;</li>
 *   <li>{@link #finish} once, on that thread, after the last record of a stream that ended normally;
 *       it may still forward records and is where a sink commits its final files;</li>
 *   <li>{@link #close} exactly once on every path, normal or failed, after the others; it releases
 *       resources and must not commit anything, so that a failed run leaves only what was already
 *       committed.</li>
 * </ol>
 * An exception from any method fails the whole run; the runner then calls {@link #close} on every
 * stage it opened.
 */
public interface Stage<I, O> {
    /** Prepares per-thread state; called once before the first record. */
    default void open(StageContext<O> ctx) throws Exception {}

    /** Handles one record; may call {@link StageContext#forward} any number of times. */
    void accept(I record) throws Exception;

    /** Called after the last record when the stream ended normally. */
    default void finish() throws Exception {}

    /** Releases resources; called once on every path. Never commits. */
    default void close() throws Exception {}
}
