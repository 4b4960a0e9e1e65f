package org.winnow.pipeline;

/** Thrown under {@link BadInputPolicy#FAIL} at the first unusable piece of input. */
public final class BadInputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    private final long line;

    public BadInputException(long line, String problem) {
        super("line " + line + ": " + problem);
        this.line = line;
    }

    /** The 1-based line number of the bad input. */
    public long line() {
        return line;
    }
}
