package org.winnow.producer.source;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;
import org.winnow.producer.Bounds;
import org.winnow.producer.ExclusionSet;
import org.winnow.producer.ShardSpec;

/**
 * A space the producer enumerates: its bounds, its rule set and the shard of it.
 *
 * @param bounds the bounds
 * @param rules  the enumeration rule set (not the keep rules of the scan)
 * @param shard  the part of the space, {@link ShardSpec#ALL} for all of it
 */
public record EnumeratedSpace(Bounds bounds, ExclusionSet rules, ShardSpec shard) {
    public EnumeratedSpace {
        Objects.requireNonNull(bounds, "bounds");
        Objects.requireNonNull(rules, "rules");
        Objects.requireNonNull(shard, "shard");
    }

    /**
     * One line that names the space completely; it is part of the run id, so two scans of different
     * spaces never share a directory. The rule set's mask is included as well as its name so that a
     * change in what a named rule set excludes changes the id.
     */
    public String key() {
        return String.format(java.util.Locale.ROOT, "dim %d, rows %d..%d, cols <= %d, n <= %d, entries <= %d, rules %s"
                + " (mask %d), shard %s", bounds.dim(), bounds.minRows(), bounds.maxRows(), bounds.maxCols(),
                bounds.maxN(), bounds.maxEntry(), rules.name(), rules.excludedMask(), shard);
    }

    /** The bounds as the manifest records them: every limit, the rule set with its exclusions, the shard. */
    public Map<String, Object> manifestValue() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("dim", bounds.dim());
        m.put("minRows", bounds.minRows());
        m.put("maxRows", bounds.maxRows());
        m.put("maxCols", bounds.maxCols());
        m.put("maxN", bounds.maxN());
        m.put("maxEntry", bounds.maxEntry());
        m.put("ruleSet", rules.name());
        m.put("excludes", rules.excluded().stream().map(f -> f.label()).toList());
        m.put("shard", shard.toString());
        return m;
    }
}
