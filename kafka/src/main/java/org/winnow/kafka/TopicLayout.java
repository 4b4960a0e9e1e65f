package org.winnow.kafka;

import static org.winnow.geometry.Checks.requireArgument;

/**
 * How the run's data topics are laid out. {@code partitions} bounds how many scorers (or producers) of
 * one group can work at once; {@code replication} is 1 on a single broker and usually 3 on a cluster.
 */
public record TopicLayout(int partitions, short replication) {
    /** The most partitions a run may ask for; far above what one run on a few machines can use. */
    public static final int MAX_PARTITIONS = 1024;

    public TopicLayout {
        requireArgument(partitions >= 1 && partitions <= MAX_PARTITIONS,
                "partitions must be in 1..%s: %s", MAX_PARTITIONS, partitions);
        requireArgument(replication >= 1, "replication factor must be at least 1: %s", replication);
    }

    /** One broker, {@code partitions} partitions. */
    public static TopicLayout singleBroker(int partitions) {
        return new TopicLayout(partitions, (short) 1);
    }
}
