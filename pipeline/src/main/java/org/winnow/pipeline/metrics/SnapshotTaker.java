package org.winnow.pipeline.metrics;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import java.time.Clock;
import java.util.Objects;
import org.winnow.pipeline.Reason;

/**
 * Turns the Micrometer meters of one stage process into {@link MetricSnapshot}s, so that the snapshots,
 * the Prometheus endpoint and the live status read the same numbers. Called from one thread at a time.
 */
public final class SnapshotTaker {
    private final String runId;
    private final StageKind kind;
    private final String instance;
    private final String incarnation;
    private final MeterRegistry registry;
    private final Clock clock;
    private long seq;
    private long lastMillis;
    private long lastCandidates;

    /**
     * @param incarnation names this process among those that carried {@code instance} (see {@link #incarnation})
     * @param clock       the time stamped on each snapshot and used for the rate
     */
    public SnapshotTaker(String runId, StageKind kind, String instance, String incarnation, MeterRegistry registry,
            Clock clock) {
        this.runId = Objects.requireNonNull(runId, "runId");
        this.kind = Objects.requireNonNull(kind, "kind");
        this.instance = Objects.requireNonNull(instance, "instance");
        this.incarnation = Objects.requireNonNull(incarnation, "incarnation");
        this.registry = Objects.requireNonNull(registry, "registry");
        this.clock = Objects.requireNonNull(clock, "clock");
        this.lastMillis = clock.millis();
    }

    /** An incarnation name for this process: its pid and start time, unique enough on one host. */
    public static String incarnation(ProcessHandle process, Clock clock) {
        return process.pid() + "@" + clock.millis();
    }

    /** The snapshot of the meters now. */
    public synchronized MetricSnapshot take() {
        long now = clock.millis();
        Reason[] all = Reason.values();
        String[] reasons = new String[kind == StageKind.PRODUCE ? 0 : all.length];
        long[] counts = new long[reasons.length];
        long candidates = 0;
        if (kind == StageKind.PRODUCE) {
            candidates = count(registry.find(SourceMetrics.SENT).counter());
        } else {
            String meter = kind == StageKind.SCORE ? ScorerMetrics.VERDICTS : SinkMetrics.RECORDS;
            for (int i = 0; i < all.length; i++) {
                reasons[i] = all[i].code();
                counts[i] = count(registry.find(meter).tag(ScorerMetrics.TAG_REASON, all[i].code()).counter());
                candidates += counts[i];
            }
        }
        long[] novelty = kind == StageKind.SCORE ? noveltyBins() : new long[0];
        double rate = now > lastMillis ? Math.max(0, candidates - lastCandidates) * 1000.0 / (now - lastMillis) : 0;
        MetricSnapshot s = new MetricSnapshot(runId, kind.code(), instance, incarnation, seq++, now, candidates, rate,
                reasons, counts, novelty);
        lastMillis = now;
        lastCandidates = candidates;
        return s;
    }

    private long[] noveltyBins() {
        long[] bins = new long[ScorerMetrics.NOVELTY_BINS];
        for (int i = 0; i < bins.length; i++) {
            bins[i] = count(registry.find(ScorerMetrics.NOVELTY).tag(ScorerMetrics.TAG_BIN, ScorerMetrics.binLabel(i))
                    .counter());
        }
        return bins;
    }

    private static long count(Counter c) {
        return c == null ? 0 : (long) c.count();
    }
}
