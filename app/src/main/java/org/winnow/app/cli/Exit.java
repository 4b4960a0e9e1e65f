package org.winnow.app.cli;

import java.io.PrintWriter;

/**
 * The exit codes every winnow command uses, and the one error path for refusing bad input: a single
 * line on standard error, prefixed by the command's name, then exit code {@link #BAD_INPUT}.
 */
public final class Exit {
    /** Success. */
    public static final int OK = 0;
    /** A run that stopped part way; what was committed stays and a rerun continues. */
    public static final int STOPPED = 1;
    /** Bad input or options; picocli also uses 2 for options it cannot parse. */
    public static final int BAD_INPUT = 2;

    private Exit() {}

    /**
     * Prints {@code winnow COMMAND: MESSAGE} on {@code err} and returns {@link #BAD_INPUT}, so that a
     * command can {@code return Exit.badInput(...)} in one statement.
     */
    public static int badInput(PrintWriter err, String command, String message) {
        err.println("winnow " + command + ": " + message);
        err.flush();
        return BAD_INPUT;
    }
}
