package org.winnow.kafka;

import java.util.Objects;
import org.winnow.geometry.Checks;
import org.winnow.pipeline.SourceReport;

/**
 * How far a producer has got with one shard, written to the plan topic in the same transaction as the
 * candidates it accounts for. The last committed progress of a shard is where a restarted producer resumes
 * and, once {@code report.done()}, what the sink reconciles its counts against.
 *
 * @param shard   the shard
 * @param nextSeq every seq below this has been committed to the candidates topic
 * @param report  the source's counts up to that point
 */
public record ShardProgress(int shard, long nextSeq, SourceReport report) {
    public ShardProgress {
        Checks.requireArgument(shard >= 0, "shard must be non-negative: %s", shard);
        Checks.requireArgument(nextSeq >= 0, "next seq must be non-negative: %s", nextSeq);
        Objects.requireNonNull(report, "report");
    }

    /** The record key of a shard's progress on the plan topic. */
    public static String key(int shard) {
        return "progress/" + shard;
    }
}
