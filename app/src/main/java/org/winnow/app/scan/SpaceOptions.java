package org.winnow.app.scan;

import org.winnow.producer.Bounds;
import org.winnow.producer.ExclusionSet;
import org.winnow.producer.ShardSpec;
import org.winnow.producer.source.EnumeratedSpace;
import picocli.CommandLine.Option;

/**
 * The bounds, rule set and shard of an enumeration, as one picocli mixin shared by {@code enumerate}
 * and {@code scan}, so that both commands spell a space the same way. Every option is optional: an
 * absent one takes the default of {@link Bounds#complete}, and {@link #given()} tells whether any was
 * named at all (scan uses that to choose between bounds and an input file).
 */
public final class SpaceOptions {
    static final int DEFAULT_DIM = 3;
    static final String DEFAULT_RULES = "lossless";

    @Option(names = "--dim", paramLabel = "D", description = "Dimension of the Calabi-Yau, 1..4 (default 3).")
    Integer dim;

    @Option(names = "--min-rows", paramLabel = "M", description = "Fewest rows (default 1).")
    Integer minRows;

    @Option(names = "--max-rows", paramLabel = "M", description = "Most rows (default min(5d, 16)).")
    Integer maxRows;

    @Option(names = "--max-cols", paramLabel = "K", description = "Most columns (default 24).")
    Integer maxCols;

    @Option(names = "--max-n", paramLabel = "N", description = "Largest projective factor P^N (default 2d+1).")
    Integer maxN;

    @Option(names = "--max-entry", paramLabel = "E", description = "Largest degree (default 2d+2).")
    Integer maxEntry;

    // --rules is the older spelling, kept working; "rules" otherwise means the scorer's keep rules.
    @Option(names = {"--exclusions", "--rules"}, paramLabel = "NAME",
            description = "Enumeration exclusion set: base, split, lossless, short (default lossless).")
    String rules;

    @Option(names = "--no-products", description = "Drop block-diagonal matrices (products).")
    boolean noProducts;

    @Option(names = "--shard", paramLabel = "i/N", description = "Only shard i of N (0-based); shards are disjoint and cover the space.")
    String shard;

    /** True iff any of these options was given. */
    public boolean given() {
        return dim != null || minRows != null || maxRows != null || maxCols != null || maxN != null || maxEntry != null
                || rules != null || noProducts || shard != null;
    }

    /**
     * The space these options describe.
     *
     * @throws IllegalArgumentException with a one-line message naming the bad value
     */
    public EnumeratedSpace space() {
        int d = dim == null ? DEFAULT_DIM : dim;
        if (d < 1 || d > Bounds.MAX_DIM) {
            throw new IllegalArgumentException("dim must be in 1.." + Bounds.MAX_DIM + ", got " + d);
        }
        Bounds c = Bounds.complete(d);
        Bounds bounds = new Bounds(d, or(minRows, c.minRows()), or(maxRows, c.maxRows()), or(maxCols, c.maxCols()),
                or(maxN, c.maxN()), or(maxEntry, c.maxEntry()));
        ExclusionSet ruleSet = ExclusionSet.byName(rules == null ? DEFAULT_RULES : rules);
        if (noProducts) {
            ruleSet = ruleSet.withoutProducts();
        }
        return new EnumeratedSpace(bounds, ruleSet, shard == null ? ShardSpec.ALL : ShardSpec.parse(shard));
    }

    private static int or(Integer value, int fallback) {
        return value == null ? fallback : value;
    }
}
