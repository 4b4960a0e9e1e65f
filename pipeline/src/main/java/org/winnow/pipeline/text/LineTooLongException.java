package org.winnow.pipeline.text;

import java.io.IOException;

/**
 * A line longer than the reader allows: the input is not a text file of lines (a device such as
 * {@code /dev/zero}, a binary file, a file with its line breaks lost). The message is one line naming
 * the input and the line number.
 */
public final class LineTooLongException extends IOException {
    private static final long serialVersionUID = 1L;

    private final String input;
    private final long line;
    private final String reason;

    public LineTooLongException(String input, long line, int limit) {
        this(input, line, "longer than " + limit + " characters; is it a text file with one entry a line?");
    }

    private LineTooLongException(String input, long line, String reason) {
        super(input + " line " + line + ": " + reason);
        this.input = input;
        this.line = line;
        this.reason = reason;
    }

    /** The message without the input's name and the line number. */
    public String reason() {
        return reason;
    }

    /** The name of the input as given to the reader. */
    public String input() {
        return input;
    }

    /** The 1-based number of the line that was too long. */
    public long line() {
        return line;
    }
}
