package org.winnow.pipeline;

import java.util.Objects;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * One configuration on its way through a scan.
 *
 * @param config the configuration in canonical form
 * @param key    the dedup and partition key, see {@link CandidateKeys}
 * @param shard  the shard of the space it came from (0 in a single-process scan)
 * @param seq    its position in the source's output, 0-based and gap-free within a shard; the sink
 *               writes in this order, which makes every run's files identical
 */
public record Candidate(Configuration config, String key, int shard, long seq) {
    public Candidate {
        Objects.requireNonNull(config, "config");
        Objects.requireNonNull(key, "key");
        Checks.requireArgument(shard >= 0, "shard must be non-negative: %s", shard);
        Checks.requireArgument(seq >= 0, "seq must be non-negative: %s", seq);
    }
}
