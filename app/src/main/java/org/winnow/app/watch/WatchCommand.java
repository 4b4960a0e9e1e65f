package org.winnow.app.watch;

import java.io.IOException;
import java.io.PrintWriter;
import java.time.Clock;
import java.time.Duration;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.atomic.AtomicBoolean;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.KafkaConnectionOptions;
import org.winnow.app.cli.Terminal;
import org.winnow.app.cluster.ShutdownGrace;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.RunTopics;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow watch --kafka HOST:PORT --run ID}: the whole cluster run in one place, from the snapshots
 * its stages publish: a terminal view on stderr and a web dashboard on 127.0.0.1.
 */
@Command(name = "watch", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Watch a cluster run: throughput per stage and scorer, rejections by reason, novelty, lag."})
public final class WatchCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @picocli.CommandLine.Mixin
    KafkaConnectionOptions connection = new KafkaConnectionOptions();

    @Option(names = "--run", required = true, paramLabel = "ID", description = "The run to watch.")
    String run;

    @Option(names = "--port", paramLabel = "P",
            description = "Serve the dashboard on http://127.0.0.1:P/ (default ${DEFAULT-VALUE}; 0 picks a free port).")
    int port = 7070;

    @Option(names = "--interval", paramLabel = "MS", description = "Refresh period (default ${DEFAULT-VALUE} ms).")
    long intervalMillis = 1000;

    @Option(names = "--once", description = "Read what the run has published so far, print the view on stdout, exit.")
    boolean once;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        KafkaSettings settings;
        RunTopics topics;
        try {
            settings = connection.settings();
            topics = new RunTopics(run);
            if (port < 0 || port > 65535) {
                throw new IllegalArgumentException("--port must be in 0..65535, got " + port);
            }
            if (intervalMillis < 100) {
                throw new IllegalArgumentException("--interval must be at least 100 ms, got " + intervalMillis);
            }
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "watch", e.getMessage());
        }
        try (Watcher watcher = Watcher.open(settings, topics, Clock.systemUTC())) {
            if (once) {
                PrintWriter out = spec.commandLine().getOut();
                WatchText.full(watcher.once(Duration.ofSeconds(10))).forEach(out::println);
                out.flush();
                return 0;
            }
            try (DashboardServer server = new DashboardServer(watcher::state, port)) {
                err.println("winnow watch: run " + run + " on " + connection.kafka + ", dashboard on http://127.0.0.1:"
                        + server.port() + "/");
                err.flush();
                AtomicBoolean running = new AtomicBoolean(true);
                CountDownLatch finished = new CountDownLatch(1);
                ShutdownGrace.install(() -> running.set(false), finished, Duration.ofSeconds(5));
                try {
                    boolean terminal = Terminal.stderrIsTerminal();
                    watcher.run(running, Duration.ofMillis(intervalMillis), state -> show(err, state, terminal));
                } finally {
                    finished.countDown();
                }
                return 0;
            }
        } catch (ClusterRefusedException e) {
            return Exit.badInput(err, "watch", e.getMessage());
        } catch (IOException e) {
            return Exit.badInput(err, "watch", "--port " + port + ": cannot serve on 127.0.0.1 (" + e.getMessage() + ")");
        }
    }

    /** Redraws the view in place on a terminal; otherwise one plain line per interval, for logs. */
    private static void show(PrintWriter err, WatchState state, boolean terminal) {
        if (terminal) {
            err.print("\033[H\033[2J");
            WatchText.full(state).forEach(err::println);
        } else {
            err.println("winnow watch: " + WatchText.line(state));
        }
        err.flush();
    }
}
