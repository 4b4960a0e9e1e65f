package org.winnow.pipeline.channel;

/** Thrown to a thread blocked on a channel or window when another thread of the run has failed. */
public final class ChannelFailedException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    ChannelFailedException(String name, Throwable cause) {
        super(name + ": the run failed elsewhere", cause);
    }
}
