package org.winnow.app.scan;

import java.nio.file.Path;
import java.time.Clock;
import org.winnow.sink.DirectoryLock;

/**
 * A child process that takes a scan directory's lock exactly as {@code winnow scan} does (the same call, the
 * same holder note) and holds it until its standard input ends or it is killed; the two-process lock test
 * needs a holder that stays put for as long as the test takes, whatever the machine's load.
 */
public final class LockHolder {
    private LockHolder() {}

    public static void main(String[] args) throws Exception {
        try (DirectoryLock lock = DirectoryLock.acquire(Path.of(args[0]), "winnow scan " + args[1], Clock.systemUTC())) {
            System.out.println("holding");
            System.out.flush();
            while (System.in.read() >= 0) {
                // hold until the parent closes our standard input or kills us
            }
        }
    }
}
