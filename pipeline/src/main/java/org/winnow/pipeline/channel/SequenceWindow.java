package org.winnow.pipeline.channel;

import org.winnow.geometry.Checks;

/**
 * Bounds how many sequence numbers may be in flight between the source and the in-order end of the
 * sink. The source admits seq s only while {@code s < released + width}; the sink releases as it
 * completes records in order.
 *
 * <p>Why: scorer workers finish out of order, and the sink must write in seq order to produce the
 * same files on every run. Without this window one slow record would let the others pile up in the
 * sink's reorder buffer without limit; with it the buffer never holds more than {@code width}
 * records, and nothing deadlocks because the sink never stops taking from its channel.
 *
 * <p>Thread-safe: one admitting thread and one releasing thread.
 */
public final class SequenceWindow {
    private final int width;
    private long released;
    private Throwable failure;

    /**
     * @param start the first seq of this run (everything below is already done)
     * @param width how many seqs may be in flight, at least 1
     */
    public SequenceWindow(long start, int width) {
        Checks.requireArgument(width >= 1, "window width must be at least 1: %s", width);
        Checks.requireArgument(start >= 0, "window start must be non-negative: %s", start);
        this.width = width;
        this.released = start;
    }

    /** Blocks until {@code seq} is inside the window. */
    public synchronized void admit(long seq) throws InterruptedException {
        while (seq >= released + width && failure == null) {
            wait();
        }
        if (failure != null) {
            throw new ChannelFailedException("sequence window", failure);
        }
    }

    /** Records that every seq below {@code next} is complete. */
    public synchronized void release(long next) {
        if (next > released) {
            released = next;
            notifyAll();
        }
    }

    /** Wakes the admitting thread with a {@link ChannelFailedException}. */
    public synchronized void fail(Throwable cause) {
        if (failure == null) {
            failure = cause;
        }
        notifyAll();
    }

    /** The window's width. */
    public int width() {
        return width;
    }
}
