package org.winnow.scorer.rules;

import java.util.Arrays;
import java.util.Objects;
import java.util.stream.Collectors;
import org.winnow.pipeline.Keepable;

/**
 * Keep only candidates whose invariant lies in {@code [lo, hi]}. Written {@code h11=4..6};
 * {@code chi=-60..0}; {@code h11=5} for a single value; {@code h11=4..} or {@code h11=..6} for one-sided
 * ranges.
 */
public record RangeRule(Keepable invariant, long lo, long hi) {
    public RangeRule {
        Objects.requireNonNull(invariant, "invariant");
        if (lo > hi) {
            throw new RuleException(String.format("rule '%s': empty range, %d > %d", text(invariant, lo, hi), lo, hi));
        }
    }

    /** Parses {@code INVARIANT=LO..HI}; every error is one line naming the rule. */
    public static RangeRule parse(String rule) {
        String text = rule == null ? "" : rule.trim();
        int eq = text.indexOf('=');
        if (eq < 0) {
            throw new RuleException(String.format("rule '%s': expected INVARIANT=LO..HI, such as h11=4..6", text));
        }
        String label = text.substring(0, eq);
        Keepable invariant = Keepable.ofLabel(label).orElseThrow(() -> new RuleException(String.format(
                "rule '%s': unknown invariant '%s' (known: %s)", text, label.trim(),
                Arrays.stream(Keepable.values()).map(Keepable::label).collect(Collectors.joining(", ")))));
        String range = text.substring(eq + 1).trim();
        int dots = range.indexOf("..");
        long lo;
        long hi;
        if (dots < 0) {
            lo = number(range, text);
            hi = lo;
        } else {
            String left = range.substring(0, dots).trim();
            String right = range.substring(dots + 2).trim();
            if (left.isEmpty() && right.isEmpty()) {
                throw new RuleException(String.format("rule '%s': the range needs at least one bound", text));
            }
            lo = left.isEmpty() ? Long.MIN_VALUE : number(left, text);
            hi = right.isEmpty() ? Long.MAX_VALUE : number(right, text);
        }
        return new RangeRule(invariant, lo, hi);
    }

    private static long number(String s, String rule) {
        try {
            return Long.parseLong(s.trim());
        } catch (NumberFormatException e) {
            throw new RuleException(String.format("rule '%s': '%s' is not a whole number", rule, s.trim()));
        }
    }

    /** True iff {@code value} lies in the range. */
    public boolean contains(long value) {
        return value >= lo && value <= hi;
    }

    @Override
    public String toString() {
        return text(invariant, lo, hi);
    }

    private static String text(Keepable invariant, long lo, long hi) {
        String l = lo == Long.MIN_VALUE ? "" : Long.toString(lo);
        String h = hi == Long.MAX_VALUE ? "" : Long.toString(hi);
        return invariant.label() + "=" + (lo == hi ? l : l + ".." + h);
    }
}
