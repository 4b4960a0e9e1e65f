package org.winnow.app.watch;

import java.time.Clock;
import java.time.Duration;
import java.util.Objects;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.function.Consumer;
import org.winnow.app.cluster.ClusterScorer;
import org.winnow.app.cluster.ClusterSink;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunTopics;

/** The watch loop of one run: snapshots in, lag read, a point of history per interval. */
public final class Watcher implements AutoCloseable {
    private final RunAdmin admin;
    private final ClusterView view;
    private final SnapshotFeed feed;
    private final LagProbe lag;
    private final Clock clock;

    private Watcher(RunAdmin admin, RunTopics run, Clock clock) {
        this.admin = admin;
        this.clock = clock;
        this.view = new ClusterView(run.runId());
        this.feed = new SnapshotFeed(admin.settings(), run, view);
        this.lag = new LagProbe(admin.admin(), run, ClusterScorer.group(run), ClusterSink.group(run),
                admin.settings().connectTimeout().toMillis());
    }

    /**
     * Connects to the run.
     *
     * @throws org.winnow.kafka.ClusterRefusedException when no broker answers or the run does not exist
     */
    public static Watcher open(KafkaSettings settings, RunTopics run, Clock clock) {
        Objects.requireNonNull(clock, "clock");
        RunAdmin admin = RunAdmin.connect(settings);
        try {
            admin.requireRun(run);
            return new Watcher(admin, run, clock);
        } catch (RuntimeException e) {
            admin.close();
            throw e;
        }
    }

    /** Reads every snapshot published so far and the lag now, once. */
    public WatchState once(Duration timeout) {
        feed.readToEnd(timeout);
        return tick();
    }

    /**
     * Watches until {@code running} turns false, handing the state to {@code onTick} every {@code interval}.
     */
    public void run(AtomicBoolean running, Duration interval, Consumer<WatchState> onTick) {
        long next = System.nanoTime();
        while (running.get()) {
            feed.poll(Duration.ofMillis(Math.min(200, Math.max(1, interval.toMillis()))));
            if (System.nanoTime() >= next) {
                onTick.accept(tick());
                next = System.nanoTime() + interval.toNanos();
            }
        }
    }

    /** The state now, as the dashboard serves it. */
    public WatchState state() {
        return view.state(clock.millis());
    }

    private WatchState tick() {
        view.lag(lag.read());
        long now = clock.millis();
        view.tick(now);
        return view.state(now);
    }

    @Override
    public void close() {
        feed.close();
        admin.close();
    }
}
