package org.winnow.app.watch;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Verdict;
import org.winnow.pipeline.metrics.MetricSnapshot;
import org.winnow.pipeline.metrics.ScorerMetrics;
import org.winnow.pipeline.metrics.StageKind;

/**
 * Adds up the snapshots of a run: per instance, the latest snapshot of each incarnation (counts restart
 * from zero when a process does); per stage, the sum of its instances. Thread-safe: the watch loop feeds
 * it while the web server reads it.
 */
public final class ClusterView {
    /** An instance whose last snapshot is older than this is shown as stopped, with rate 0. */
    public static final long STALE_AFTER_MILLIS = 10_000;
    /** Points of history kept for the charts. */
    public static final int HISTORY = 300;

    private final String run;
    private final Map<StageKind, Map<String, Map<String, MetricSnapshot>>> latest = new EnumMap<>(StageKind.class);
    private final Deque<WatchState.Point> history = new ArrayDeque<>();
    private WatchState.Lag lag = WatchState.Lag.UNKNOWN;
    private long refused;
    private String lastRefusal = "";

    public ClusterView(String run) {
        this.run = Objects.requireNonNull(run, "run");
        for (StageKind k : StageKind.values()) {
            latest.put(k, new TreeMap<>());
        }
    }

    /** Takes a snapshot of this run; an older snapshot of the same incarnation than one held is ignored. */
    public synchronized void accept(MetricSnapshot s) {
        if (!s.runId().equals(run)) {
            refused("a snapshot of run '" + s.runId() + "' on the metrics topic of run '" + run + "'");
            return;
        }
        Map<String, MetricSnapshot> incarnations = latest.get(s.kind()).computeIfAbsent(s.instance(),
                k -> new LinkedHashMap<>());
        MetricSnapshot held = incarnations.get(s.incarnation());
        if (held == null || held.seq() < s.seq()) {
            incarnations.put(s.incarnation(), s);
        }
    }

    /** Counts a record of the metrics topic that could not be taken. */
    public synchronized void refused(String why) {
        refused++;
        lastRefusal = why;
    }

    /** The lag read last. */
    public synchronized void lag(WatchState.Lag lag) {
        this.lag = Objects.requireNonNull(lag, "lag");
    }

    /** Appends a point to the history at the watch's time {@code nowMillis}. */
    public synchronized void tick(long nowMillis) {
        WatchState s = state(nowMillis, false);
        Map<String, Double> stages = new LinkedHashMap<>();
        for (WatchState.Stage st : s.stages()) {
            stages.put(st.stage(), st.rate());
        }
        Map<String, Double> scorers = new TreeMap<>();
        for (WatchState.Instance i : s.stage(StageKind.SCORE.code()).instances()) {
            scorers.put(i.instance(), i.rate());
        }
        history.addLast(new WatchState.Point(nowMillis, stages, scorers, lag.scorers(), lag.sink()));
        while (history.size() > HISTORY) {
            history.removeFirst();
        }
    }

    /** The state at the watch's time {@code nowMillis}. */
    public synchronized WatchState state(long nowMillis) {
        return state(nowMillis, true);
    }

    private WatchState state(long nowMillis, boolean withHistory) {
        List<WatchState.Stage> stages = new ArrayList<>();
        for (StageKind k : StageKind.values()) {
            List<WatchState.Instance> instances = new ArrayList<>();
            long total = 0;
            double rate = 0;
            for (var e : latest.get(k).entrySet()) {
                WatchState.Instance i = instance(e.getKey(), e.getValue().values(), nowMillis);
                instances.add(i);
                total += i.candidates();
                rate += i.rate();
            }
            stages.add(new WatchState.Stage(k.code(), total, rate, List.copyOf(instances)));
        }
        Map<Reason, Long> byReason = new EnumMap<>(Reason.class);
        long[] novelty = new long[ScorerMetrics.NOVELTY_BINS];
        for (Map<String, MetricSnapshot> incarnations : latest.get(StageKind.SCORE).values()) {
            for (MetricSnapshot s : incarnations.values()) {
                for (Reason r : Reason.values()) {
                    byReason.merge(r, s.count(r), Long::sum);
                }
                long[] bins = s.noveltyBins();
                for (int b = 0; b < bins.length; b++) {
                    novelty[b] += bins[b];
                }
            }
        }
        List<WatchState.ReasonCount> funnel = new ArrayList<>();
        for (Verdict v : List.of(Verdict.REJECT, Verdict.KEEP)) {
            for (Reason r : Reason.withVerdict(v)) {
                funnel.add(new WatchState.ReasonCount(r.code(), v.name().toLowerCase(Locale.ROOT),
                        byReason.getOrDefault(r, 0L)));
            }
        }
        return new WatchState(run, nowMillis, List.copyOf(stages), List.copyOf(funnel), novelty, lag,
                withHistory ? List.copyOf(history) : List.of(), refused, lastRefusal);
    }

    private static WatchState.Instance instance(String name, Iterable<MetricSnapshot> incarnations, long nowMillis) {
        long total = 0;
        int count = 0;
        MetricSnapshot newest = null;
        for (MetricSnapshot s : incarnations) {
            total += s.candidates();
            count++;
            if (newest == null || s.timestampMillis() > newest.timestampMillis()) {
                newest = s;
            }
        }
        boolean live = newest != null && nowMillis - newest.timestampMillis() <= STALE_AFTER_MILLIS;
        double rate = live ? newest.candidatesPerSecond() : 0;
        return new WatchState.Instance(name, total, rate, live, count, newest == null ? 0 : newest.timestampMillis());
    }
}
