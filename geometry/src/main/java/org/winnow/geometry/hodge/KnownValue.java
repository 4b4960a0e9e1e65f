package org.winnow.geometry.hodge;

import org.winnow.geometry.Checks;
import org.winnow.geometry.cohomology.Interval;

/**
 * A Hodge number with how it is known: the value lies in {@code [lo, hi]}; {@link Basis#PROVED} iff
 * {@code lo == hi == value} and the value is a theorem; {@link Basis#BOUNDED}: {@code [lo, hi]} is a
 * proved interval with {@code lo < hi}, and the value is the best guess in it; {@link Basis#ESTIMATED}:
 * no proof, and {@code [lo, hi] = [0, Long.MAX_VALUE]} (nothing is proved beyond non-negativity).
 */
public record KnownValue(long value, Basis basis, long lo, long hi) {
    public KnownValue {
        Checks.requireArgument(basis != null, "basis is required (value %d)", value);
        Checks.requireArgument(lo <= value && value <= hi, "value %d outside [%d, %d]", value, lo, hi);
        switch (basis) {
            case PROVED -> Checks.requireArgument(lo == hi, "a proved value needs lo == hi: [%d, %d]", lo, hi);
            case BOUNDED -> Checks.requireArgument(lo < hi, "a bounded value needs lo < hi: [%d, %d]", lo, hi);
            case ESTIMATED -> Checks.requireArgument(lo == 0 && hi == Long.MAX_VALUE,
                    "an estimated value carries no bounds: [%d, %d]", lo, hi);
        }
    }

    /** A proved value. */
    public static KnownValue proved(long value) {
        return new KnownValue(value, Basis.PROVED, value, value);
    }

    /** An unproved guess. */
    public static KnownValue estimated(long value) {
        return new KnownValue(Math.max(0, value), Basis.ESTIMATED, 0, Long.MAX_VALUE);
    }

    /**
     * The value known to lie in the proved interval {@code proved} with {@code guess} as best guess:
     * PROVED when the interval is a point, else BOUNDED with the guess clamped into it.
     */
    public static KnownValue within(Interval proved, long guess) {
        if (proved.isExact()) {
            return proved(proved.lo());
        }
        return new KnownValue(Math.max(proved.lo(), Math.min(proved.hi(), guess)), Basis.BOUNDED, proved.lo(), proved.hi());
    }

    /** True iff the value is a theorem. */
    public boolean isProved() {
        return basis == Basis.PROVED;
    }

    /** The proved interval, or null for an estimate. */
    public Interval interval() {
        return basis == Basis.ESTIMATED ? null : new Interval(lo, hi);
    }

    /** {@code 8}, {@code 8 (bounded 6..9)} or {@code 8 (estimated)}. */
    @Override
    public String toString() {
        return switch (basis) {
            case PROVED -> Long.toString(value);
            case BOUNDED -> value + " (bounded " + lo + ".." + hi + ")";
            case ESTIMATED -> value + " (estimated)";
        };
    }
}
