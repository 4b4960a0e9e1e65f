package org.winnow.geometry.cohomology;

import org.winnow.geometry.Checks;

/**
 * A closed integer interval {@code [lo, hi]} that is proved to contain an unknown value; exact iff
 * {@code lo == hi}.
 */
public record Interval(long lo, long hi) {
    public Interval {
        Checks.requireArgument(lo <= hi, "empty interval [%d, %d]", lo, hi);
    }

    /** The one-point interval. */
    public static Interval exact(long v) {
        return new Interval(v, v);
    }

    /** True iff the value is determined. */
    public boolean isExact() {
        return lo == hi;
    }

    /** The value of an exact interval. */
    public long value() {
        Checks.requireState(isExact(), "interval [%d, %d] is not exact", lo, hi);
        return lo;
    }

    public Interval plus(Interval o) {
        return new Interval(Math.addExact(lo, o.lo), Math.addExact(hi, o.hi));
    }

    public Interval minus(Interval o) {
        return new Interval(Math.subtractExact(lo, o.hi), Math.subtractExact(hi, o.lo));
    }

    public Interval plus(long c) {
        return new Interval(Math.addExact(lo, c), Math.addExact(hi, c));
    }

    public Interval times(long c) {
        Checks.requireArgument(c >= 0, "only nonnegative scaling keeps the orientation: %d", c);
        return new Interval(Math.multiplyExact(lo, c), Math.multiplyExact(hi, c));
    }

    /** The intersection; throws {@link IllegalStateException} if it is empty (contradictory proofs). */
    public Interval intersect(Interval o) {
        long l = Math.max(lo, o.lo);
        long h = Math.min(hi, o.hi);
        Checks.requireState(l <= h, "contradictory intervals [%d, %d] and [%d, %d]", lo, hi, o.lo, o.hi);
        return new Interval(l, h);
    }

    /** True iff v lies in the interval. */
    public boolean contains(long v) {
        return lo <= v && v <= hi;
    }

    @Override
    public String toString() {
        return isExact() ? Long.toString(lo) : "[" + lo + ", " + hi + "]";
    }
}
