package org.winnow.geometry;

/**
 * A configuration text that does not parse. The message names the line and column (both 1-based)
 * and what was expected there.
 */
public final class ConfigurationFormatException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;
    private final int line;
    private final int column;

    public ConfigurationFormatException(int line, int column, String problem) {
        super("line " + line + ", column " + column + ": " + problem);
        this.line = line;
        this.column = column;
    }

    /** 1-based line of the problem. */
    public int line() {
        return line;
    }

    /** 1-based column of the problem. */
    public int column() {
        return column;
    }
}
