package org.winnow.producer;

import org.winnow.geometry.Checks;

/**
 * Shard {@code index} of {@code count} (0-based): the search tree is cut into many small subtrees,
 * numbered in generation order, and this shard owns those whose number is {@code index} modulo
 * {@code count}. Shards are disjoint and their union is the whole space.
 */
public record ShardSpec(int index, int count) {
    /** The whole space. */
    public static final ShardSpec ALL = new ShardSpec(0, 1);

    public ShardSpec {
        Checks.requireArgument(count >= 1, "shard count must be at least 1, got %d", count);
        Checks.requireArgument(index >= 0 && index < count, "shard index must be in 0..%d, got %d", count - 1, index);
    }

    /** Parses {@code i/N}. */
    public static ShardSpec parse(String text) {
        int slash = text == null ? -1 : text.indexOf('/');
        Checks.requireArgument(slash > 0, "shard must be written i/N, got '%s'", text);
        try {
            return new ShardSpec(Integer.parseInt(text.substring(0, slash).trim()),
                    Integer.parseInt(text.substring(slash + 1).trim()));
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("shard must be written i/N with integers, got '" + text + "'", e);
        }
    }

    /** True iff the subtree with this number belongs to the shard. */
    public boolean owns(long subtree) {
        return subtree % count == index;
    }

    @Override
    public String toString() {
        return index + "/" + count;
    }
}
