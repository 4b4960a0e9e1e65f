package org.winnow.app.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/** Whether standard error goes to a terminal (Java 17 can only ask this of stdin and stdout together). */
public final class Terminal {
    private Terminal() {}

    /** True iff file descriptor 2 is a terminal device; false where this cannot be told (not Linux). */
    public static boolean stderrIsTerminal() {
        try {
            String target = Files.readSymbolicLink(Path.of("/proc/self/fd/2")).toString();
            return target.startsWith("/dev/pts/") || target.startsWith("/dev/tty");
        } catch (IOException | UnsupportedOperationException | SecurityException e) {
            return System.console() != null;
        }
    }
}
