package org.winnow.pipeline;

/**
 * Thrown when a source has more distinct candidates than the duplicate check can hold in this heap.
 * Its message is the one line a user sees.
 */
public final class KeyLimitException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    private final long limit;

    public KeyLimitException(long limit) {
        super(message("more than", limit));
        this.limit = limit;
    }

    /**
     * The one-line explanation for a source with (or that may have, as {@code what} says) more distinct
     * candidates than {@code limit}.
     */
    public static String message(String what, long limit) {
        return String.format(java.util.Locale.ROOT, "%s %,d distinct candidates, the most whose duplicate check fits "
                + "in half of this heap (-Xmx %,d MB); raise -Xmx (./winnow reads WINNOW_JAVA_OPTS) or split the input",
                what, limit, Runtime.getRuntime().maxMemory() >> 20);
    }

    /** The number of distinct candidates that was exceeded. */
    public long limit() {
        return limit;
    }
}
