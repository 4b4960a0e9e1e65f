package org.winnow.kafka;

import java.util.Objects;
import org.winnow.geometry.Checks;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Verdict;

/**
 * A rejected candidate as a {@link RejectsOnWire#SLIM} run carries it on the scored topic: what the sink
 * counts and orders by, nothing it would need to write a reject line. The candidate's key travels as the
 * Kafka record key, as for a whole record.
 *
 * @param shard  the candidate's shard
 * @param seq    the candidate's seq within the shard
 * @param reason why it was rejected; always a reason with verdict {@link Verdict#REJECT}
 */
public record SlimReject(int shard, long seq, Reason reason) {
    public SlimReject {
        Checks.requireArgument(shard >= 0, "shard must be non-negative: %s", shard);
        Checks.requireArgument(seq >= 0, "seq must be non-negative: %s", seq);
        Objects.requireNonNull(reason, "reason");
        Checks.requireArgument(reason.verdict() == Verdict.REJECT, "a slim reject needs a reason to reject, not %s",
                reason.code());
    }

    /** The slim form of a rejected scored record. */
    public static SlimReject of(Scored rejected) {
        return new SlimReject(rejected.candidate().shard(), rejected.seq(), rejected.reason());
    }
}
