package org.winnow.app.cluster;

import java.time.Duration;
import java.util.Objects;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;

/**
 * Lets SIGTERM stop a long-running command cleanly: a shutdown hook asks the work to stop, then waits, up to
 * a grace period, until the command says it has finished. The hook must not wait for the main thread to
 * end: once the JVM shuts down, main's own {@code System.exit} blocks until every hook has run, so a hook
 * that joins main only ever runs out its timeout (that cost every stopped scorer 15 s).
 */
public final class ShutdownGrace {
    private ShutdownGrace() {
    }

    /**
     * Installs the hook: on shutdown it runs {@code stop} and waits for {@code finished} at most {@code grace}.
     * The command counts {@code finished} down when its work and clean-up are over, however they ended.
     */
    public static void install(Runnable stop, CountDownLatch finished, Duration grace) {
        Objects.requireNonNull(stop, "stop");
        Objects.requireNonNull(finished, "finished");
        Objects.requireNonNull(grace, "grace");
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            stop.run();
            try {
                finished.await(grace.toMillis(), TimeUnit.MILLISECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "winnow-shutdown"));
    }
}
