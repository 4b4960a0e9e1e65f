package org.winnow.pipeline.metrics;

import static org.winnow.geometry.Checks.requireArgument;

import java.util.Objects;
import org.winnow.pipeline.Reason;

/**
 * What one stage process has done so far, published periodically to its run's metrics topic. Every count
 * is cumulative over the life of this process ({@code incarnation}); a restarted process starts again from
 * zero under a new incarnation, so a reader adds up the latest snapshot of each incarnation.
 *
 * @param runId               the run
 * @param stage               the {@link StageKind#code()} of the stage
 * @param instance            the stage's name in its run (a scorer's {@code --instance})
 * @param incarnation         this process among the ones that carried {@code instance}
 * @param seq                 0 for the first snapshot of the incarnation, then 1, 2, ...
 * @param timestampMillis     when the snapshot was taken, from the stage's clock
 * @param candidates          candidates handled by this process: sent, scored or taken by the sink
 * @param candidatesPerSecond rate since the previous snapshot of this incarnation
 * @param reasons             reason codes, parallel to {@code reasonCounts} (empty for a producer)
 * @param reasonCounts        verdicts per reason
 * @param noveltyBins         candidates per novelty bin ({@link ScorerMetrics#NOVELTY_BINS} bins), or none
 */
public record MetricSnapshot(String runId, String stage, String instance, String incarnation, long seq,
        long timestampMillis, long candidates, double candidatesPerSecond, String[] reasons, long[] reasonCounts,
        long[] noveltyBins) {
    public MetricSnapshot {
        Objects.requireNonNull(runId, "runId");
        StageKind.ofCode(Objects.requireNonNull(stage, "stage"));
        Objects.requireNonNull(instance, "instance");
        Objects.requireNonNull(incarnation, "incarnation");
        Objects.requireNonNull(reasons, "reasons");
        Objects.requireNonNull(reasonCounts, "reasonCounts");
        Objects.requireNonNull(noveltyBins, "noveltyBins");
        requireArgument(seq >= 0, "snapshot seq must be non-negative: %s", seq);
        requireArgument(candidates >= 0, "candidates must be non-negative: %s", candidates);
        requireArgument(candidatesPerSecond >= 0 && Double.isFinite(candidatesPerSecond),
                "candidates per second must be finite and non-negative: %s", candidatesPerSecond);
        requireArgument(reasons.length == reasonCounts.length, "%s reasons but %s reason counts", reasons.length,
                reasonCounts.length);
        requireArgument(noveltyBins.length == 0 || noveltyBins.length == ScorerMetrics.NOVELTY_BINS,
                "novelty bins must be 0 or %s, got %s", ScorerMetrics.NOVELTY_BINS, noveltyBins.length);
        reasons = reasons.clone();
        reasonCounts = reasonCounts.clone();
        noveltyBins = noveltyBins.clone();
    }

    /** The kind of stage. */
    public StageKind kind() {
        return StageKind.ofCode(stage);
    }

    /** The count for {@code reason}, 0 when the snapshot carries none. */
    public long count(Reason reason) {
        for (int i = 0; i < reasons.length; i++) {
            if (reasons[i].equals(reason.code())) {
                return reasonCounts[i];
            }
        }
        return 0;
    }

    @Override
    public String[] reasons() {
        return reasons.clone();
    }

    @Override
    public long[] reasonCounts() {
        return reasonCounts.clone();
    }

    @Override
    public long[] noveltyBins() {
        return noveltyBins.clone();
    }
}
