package org.winnow.pipeline.local;

/** A one-process scan stopped at a failure; the cause is the first failure on any thread. */
public final class PipelineException extends Exception {
    private static final long serialVersionUID = 1L;

    PipelineException(Throwable cause) {
        super(cause.getMessage(), cause);
    }
}
