package org.winnow.app.scan;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.OptionalLong;
import java.util.function.LongSupplier;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;

/**
 * Prints the live status of a scan to standard error: a progress bar with the status as its message
 * when a person is watching a terminal, otherwise one plain line every {@link #PLAIN_PERIOD_MS} ms,
 * which keeps logs of batch runs readable.
 */
public final class StatusPrinter implements AutoCloseable {
    /** Period of the plain status lines. */
    public static final long PLAIN_PERIOD_MS = 10_000;
    private static final long BAR_PERIOD_MS = 1_000;

    private final Thread thread;

    private StatusPrinter(Thread thread) {
        this.thread = thread;
    }

    /** Starts printing {@code status} on a daemon thread. */
    public static StatusPrinter start(ScanStatus status, PrintStream err, LongSupplier nanoTime) {
        OptionalLong size = status.size();
        boolean terminal = stderrIsTerminal();
        status.start(nanoTime.getAsLong());
        Thread t = new Thread(() -> {
            try {
                if (terminal) {
                    try (ProgressBar bar = new ProgressBarBuilder().setTaskName("scan")
                            .setInitialMax(size.orElse(-1)).setConsumer(new ConsoleProgressBarConsumer(err)).build()) {
                        while (!Thread.currentThread().isInterrupted()) {
                            bar.setExtraMessage(status.line(nanoTime.getAsLong()));
                            bar.stepTo(status.processed());
                            Thread.sleep(BAR_PERIOD_MS);
                        }
                    }
                } else {
                    while (true) {
                        Thread.sleep(PLAIN_PERIOD_MS);
                        err.println("winnow scan: " + status.line(nanoTime.getAsLong()));
                        err.flush();
                    }
                }
            } catch (InterruptedException e) {
                // Asked to stop: the scan is over.
            }
        }, "winnow-status");
        t.setDaemon(true);
        t.start();
        return new StatusPrinter(t);
    }

    @Override
    public void close() throws InterruptedException {
        thread.interrupt();
        thread.join(2_000);
    }

    private static boolean stderrIsTerminal() {
        try {
            String target = Files.readSymbolicLink(Path.of("/proc/self/fd/2")).toString();
            return target.startsWith("/dev/pts/") || target.startsWith("/dev/tty");
        } catch (IOException | UnsupportedOperationException | SecurityException e) {
            return System.console() != null;
        }
    }
}
