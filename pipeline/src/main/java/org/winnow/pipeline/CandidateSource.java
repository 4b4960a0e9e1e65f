package org.winnow.pipeline;

import java.util.OptionalLong;

/**
 * Where candidates come from: an enumeration of a bounded space or a file of configurations.
 *
 * <p>A source always pushes everything it holds from the start, in the same order on every run, so
 * that positions are stable; resumption skips what was already done downstream, in
 * {@link Sequencer}, not here.
 */
public interface CandidateSource {
    /**
     * Pushes every item in a deterministic order. Called once, on one thread.
     *
     * @throws Exception when the source cannot be read; a bad item is reported, not thrown
     */
    void run(SourceListener out) throws Exception;

    /** The number of items {@link #run} will push, when known in advance (for an ETA). */
    default OptionalLong size() {
        return OptionalLong.empty();
    }

    /**
     * True iff the source never pushes two items with the same canonical text (an enumeration of
     * canonical forms). The {@link Sequencer} then keeps no set of seen keys, whose memory would
     * otherwise grow with the number of distinct candidates.
     */
    default boolean distinct() {
        return false;
    }

    /** A one-line description for the manifest, such as the bounds or the input file. */
    String description();
}
