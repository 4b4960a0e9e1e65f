package org.winnow.producer;

import java.util.EnumSet;
import java.util.Set;
import org.winnow.geometry.Configuration;

/**
 * One emitted matrix.
 *
 * @param sequence 0-based position in the emitting run (deterministic for given bounds, rules and shard)
 * @param configuration the canonical form
 * @param text the canonical line, the pipeline's dedup key
 * @param flagMask the identity flags as a bit mask of {@link Flag#bit()}
 */
public record EnumeratedMatrix(long sequence, Configuration configuration, String text, int flagMask) {
    /** The identity flags that hold for this matrix. */
    public Set<Flag> flags() {
        EnumSet<Flag> out = EnumSet.noneOf(Flag.class);
        for (Flag f : Flag.values()) {
            if (has(f)) {
                out.add(f);
            }
        }
        return out;
    }

    /** True iff the flag holds. */
    public boolean has(Flag f) {
        return (flagMask & f.bit()) != 0;
    }

    /** The canonical line, followed by a tab and the flags (comma-separated) when there are any. */
    public String toLine() {
        if (flagMask == 0) {
            return text;
        }
        StringBuilder sb = new StringBuilder(text.length() + 16).append(text).append('\t');
        boolean first = true;
        for (Flag f : Flag.values()) {
            if (has(f)) {
                if (!first) {
                    sb.append(',');
                }
                sb.append(f.label());
                first = false;
            }
        }
        return sb.toString();
    }
}
