package org.winnow.producer;

import java.util.EnumSet;
import java.util.Locale;
import java.util.Set;
import org.winnow.geometry.Checks;

/**
 * Which flagged matrices the enumeration drops (its exclusions; not to be confused with the scorer's
 * keep rules). The base rules (B1-B4: Calabi-Yau, column sums at least 2, strict Hall, no (1,1) column
 * on two P^1 rows) always hold; an exclusion set adds exclusions by flag. The names (base, split,
 * lossless, short) are those of the {@code --exclusions} option (also spelt {@code --rules}).
 *
 * @param name the name given on the command line
 * @param excludedMask bit mask of {@link Flag}s whose matrices are dropped
 */
public record ExclusionSet(String name, int excludedMask) {
    /** Every permutation class under the base rules. */
    public static final ExclusionSet BASE = new ExclusionSet("base", 0);
    /** Base plus no ineffective splits. */
    public static final ExclusionSet SPLIT = new ExclusionSet("split", Flag.EK.bit());
    /** Split plus no conics and no P^1 row pairs: every dropped matrix has a smaller (m, K) twin kept. */
    public static final ExclusionSet LOSSLESS = new ExclusionSet("lossless", Flag.EK.bit() | Flag.C.bit() | Flag.Q3P.bit());
    /** Split plus no conics and no quadric-surface columns: the shortest list, lossless checked for d = 3 only. */
    public static final ExclusionSet SHORT = new ExclusionSet("short", Flag.EK.bit() | Flag.C.bit() | Flag.Q3S.bit());

    public ExclusionSet {
        Checks.requireArgument(name != null && !name.isBlank(), "a rule set needs a name");
        Checks.requireArgument((excludedMask & Flag.Q3S.bit()) == 0 || (excludedMask & Flag.Q3P.bit()) == 0,
                "rule set %s excludes both quadric forms Q3s and Q3p, which loses classes", name);
    }

    /** The named rule sets in documentation order. */
    public static ExclusionSet[] named() {
        return new ExclusionSet[] {BASE, SPLIT, LOSSLESS, SHORT};
    }

    /** Looks a rule set up by name (case-insensitive). */
    public static ExclusionSet byName(String name) {
        for (ExclusionSet r : named()) {
            if (r.name.equals(name.toLowerCase(Locale.ROOT))) {
                return r;
            }
        }
        throw new IllegalArgumentException("unknown rule set '" + name + "', expected base, split, lossless or short");
    }

    /** This rule set with products (block-diagonal matrices) dropped as well. */
    public ExclusionSet withoutProducts() {
        return new ExclusionSet(name + "-no-products", excludedMask | Flag.BD.bit());
    }

    /** True iff a matrix with these flags is dropped. */
    public boolean drops(int flagMask) {
        return (flagMask & excludedMask) != 0;
    }

    /** The excluded flags. */
    public Set<Flag> excluded() {
        EnumSet<Flag> out = EnumSet.noneOf(Flag.class);
        for (Flag f : Flag.values()) {
            if ((excludedMask & f.bit()) != 0) {
                out.add(f);
            }
        }
        return out;
    }
}
