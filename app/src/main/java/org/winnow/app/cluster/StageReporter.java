package org.winnow.app.cluster;

import io.micrometer.core.instrument.MeterRegistry;
import java.time.Clock;
import java.time.Duration;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RunTopics;
import org.winnow.pipeline.metrics.SnapshotTaker;
import org.winnow.pipeline.metrics.StageKind;

/** Starts the periodic metric snapshots of one cluster stage process; {@code winnow watch} reads them. */
public final class StageReporter {
    /** How often a stage publishes its snapshot: often enough for a live chart, rare enough to cost nothing. */
    public static final Duration PERIOD = Duration.ofSeconds(2);

    private StageReporter() {
    }

    /**
     * Publishes snapshots of {@code registry}'s stage meters as {@code kind}/{@code instance} of {@code run}
     * every {@code period}. Start it once the run exists, so the metrics topic does too.
     */
    public static MetricsPublisher start(KafkaSettings kafka, RunTopics run, StageKind kind, String instance,
            MeterRegistry registry, Clock clock, Duration period) {
        SnapshotTaker taker = new SnapshotTaker(run.runId(), kind, instance,
                SnapshotTaker.incarnation(ProcessHandle.current(), clock), registry, clock);
        return MetricsPublisher.start(kafka, run, taker::take, period);
    }
}
