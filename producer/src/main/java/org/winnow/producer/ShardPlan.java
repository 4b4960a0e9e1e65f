package org.winnow.producer;

import java.util.ArrayList;
import java.util.List;
import org.winnow.geometry.Checks;

/**
 * A list of shard descriptors covering the space once, for a cluster that hands them out one at a
 * time (a work queue balances the uneven shards better than a fixed assignment). Text form: one
 * descriptor {@code i/N} a line.
 */
public record ShardPlan(List<ShardSpec> shards) {
    public ShardPlan {
        shards = List.copyOf(shards);
        Checks.requireArgument(!shards.isEmpty(), "a shard plan needs at least one shard");
        int count = shards.get(0).count();
        Checks.requireArgument(shards.size() == count, "a plan of %d shards lists %d", count, shards.size());
        for (int i = 0; i < count; i++) {
            Checks.requireArgument(shards.get(i).equals(new ShardSpec(i, count)),
                    "shard %d of the plan is %s, expected %d/%d", i, shards.get(i), i, count);
        }
    }

    /** The plan of {@code count} round-robin shards. */
    public static ShardPlan of(int count) {
        List<ShardSpec> list = new ArrayList<>();
        for (int i = 0; i < count; i++) {
            list.add(new ShardSpec(i, count));
        }
        return new ShardPlan(list);
    }

    /** One descriptor a line. */
    public String toText() {
        StringBuilder sb = new StringBuilder();
        for (ShardSpec s : shards) {
            sb.append(s).append('\n');
        }
        return sb.toString();
    }

    /** Reads {@link #toText()} back; blank lines are ignored. */
    public static ShardPlan parse(String text) {
        List<ShardSpec> list = new ArrayList<>();
        for (String line : text.split("\n", -1)) {
            if (!line.isBlank()) {
                list.add(ShardSpec.parse(line.trim()));
            }
        }
        return new ShardPlan(list);
    }
}
