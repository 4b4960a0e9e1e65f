package org.winnow.app.watch;

import java.util.List;
import java.util.Map;

/**
 * What {@code winnow watch} shows at one moment; the dashboard's JSON endpoint serves exactly this record.
 *
 * @param run         the run id
 * @param nowMillis   the watch's clock
 * @param stages      produce, score and sink, in that order, each with its instances
 * @param funnel      the scorers' verdicts by reason, rejections first
 * @param novelty     scored candidates per novelty bin, bin i covering ((i - 1) / N, i / N]
 * @param lag         consumer lag now
 * @param history     the last points of throughput and lag, oldest first
 * @param refused     records on the metrics topic that were refused (another run, bad bytes)
 * @param lastRefusal why the last one was refused, or "" when none was
 */
public record WatchState(String run, long nowMillis, List<Stage> stages, List<ReasonCount> funnel, long[] novelty,
        Lag lag, List<Point> history, long refused, String lastRefusal) {

    /** One stage summed over its instances. */
    public record Stage(String stage, long candidates, double rate, List<Instance> instances) {
    }

    /**
     * One named instance, summed over its incarnations (a restarted process counts again from zero).
     *
     * @param live whether its last snapshot is recent (within {@link ClusterView#STALE_AFTER_MILLIS})
     */
    public record Instance(String instance, long candidates, double rate, boolean live, int incarnations,
            long lastMillis) {
    }

    /** Verdicts for one reason. */
    public record ReasonCount(String reason, String verdict, long count) {
    }

    /**
     * Records not yet consumed by the scorers' group and by the sink; null where the group has no
     * committed offsets yet (not started).
     */
    public record Lag(Long scorers, Long sink) {
        public static final Lag UNKNOWN = new Lag(null, null);
    }

    /** One point of the history: rates per stage and per scorer instance, and lag. */
    public record Point(long t, Map<String, Double> stages, Map<String, Double> scorers, Long lagScorers,
            Long lagSink) {
    }

    /** The stage named {@code code}. */
    public Stage stage(String code) {
        return stages.stream().filter(s -> s.stage().equals(code)).findFirst().orElseThrow(
                () -> new IllegalArgumentException("no stage '" + code + "'"));
    }
}
