package org.winnow.pipeline;

import java.util.Locale;
import java.util.Objects;
import org.winnow.geometry.Checks;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.KnownValue;

/**
 * One predicted Hodge number with how it is known and how sure the model is.
 *
 * @param value      the prediction
 * @param basis      PROVED (a theorem: the prediction is the value), BOUNDED (the true value is proved to lie
 *                   in {@code lo..hi}; the prediction is a vote inside it) or ESTIMATED (nothing proved)
 * @param lo         proved lower bound ({@code value} when proved, 0 when estimated)
 * @param hi         proved upper bound ({@code value} when proved, {@link Long#MAX_VALUE} when estimated)
 * @param confidence 1 for a proved value; otherwise the model's shrunk vote share, below 1
 */
public record PredictedValue(long value, Basis basis, long lo, long hi, double confidence) {
    public PredictedValue {
        Objects.requireNonNull(basis, "basis");
        Checks.requireArgument(confidence >= 0 && confidence <= 1, "confidence must be in [0, 1]: %s", confidence);
        Checks.requireArgument(lo <= value && value <= hi, "value %s outside its bounds %s..%s", value, lo, hi);
        Checks.requireArgument(basis != Basis.PROVED || (lo == hi && confidence == 1),
                "a proved value has no interval and confidence 1: %s..%s, %s", lo, hi, confidence);
        Checks.requireArgument(basis == Basis.PROVED || confidence < 1,
                "only a proved value has confidence 1: %s %s", basis.label(), confidence);
        Checks.requireArgument(basis != Basis.BOUNDED || lo < hi, "a bounded value needs a proper interval: %s..%s", lo, hi);
    }

    /** A theorem. */
    public static PredictedValue proved(long value) {
        return new PredictedValue(value, Basis.PROVED, value, value, 1.0);
    }

    /**
     * The model's {@code guess} for a value known as {@code known}: the known value itself when proved,
     * else the guess (clamped into the proved interval when bounded) with {@code confidence}.
     */
    public static PredictedValue of(KnownValue known, long guess, double confidence) {
        return switch (known.basis()) {
            case PROVED -> proved(known.value());
            case BOUNDED -> new PredictedValue(Math.max(known.lo(), Math.min(known.hi(), guess)), Basis.BOUNDED, known.lo(),
                    known.hi(), confidence);
            case ESTIMATED -> estimated(guess, confidence);
        };
    }

    /** A value with no proof behind it (never negative: Hodge numbers are not). */
    public static PredictedValue estimated(long value, double confidence) {
        return new PredictedValue(Math.max(0, value), Basis.ESTIMATED, 0, Long.MAX_VALUE, confidence);
    }

    /** True iff the value is a theorem. */
    public boolean isProved() {
        return basis == Basis.PROVED;
    }

    /** True iff the proved interval lies wholly outside {@code [from, to]} (a proved value is its own interval). */
    public boolean provedOutside(long from, long to) {
        return basis != Basis.ESTIMATED && (hi < from || lo > to);
    }

    /** {@code proved}, {@code bounded LO..HI} or {@code estimated}: the basis column of files and reports. */
    public String describeBasis() {
        return basis == Basis.BOUNDED ? "bounded " + lo + ".." + hi : basis.label();
    }

    /** Parses what {@link #describeBasis()} wrote, with the value and confidence columns beside it. */
    public static PredictedValue parse(String value, String basis, String confidence) {
        long v = Long.parseLong(value.trim());
        // Six decimals round a share just below 1 up to 1.000000; only a proof has confidence 1.
        double c = Math.min(Double.parseDouble(confidence.trim()), Math.nextDown(1.0));
        String b = basis.trim();
        if (b.startsWith("bounded ")) {
            String range = b.substring("bounded ".length());
            int dots = range.indexOf("..");
            Checks.requireArgument(dots > 0, "a bounded basis reads 'bounded LO..HI': %s", b);
            return new PredictedValue(v, Basis.BOUNDED, Long.parseLong(range.substring(0, dots)),
                    Long.parseLong(range.substring(dots + 2)), c);
        }
        Basis parsed = Basis.valueOf(b.toUpperCase(Locale.ROOT));
        Checks.requireArgument(parsed != Basis.BOUNDED, "a bounded basis needs its interval: %s", b);
        return parsed == Basis.PROVED ? proved(v) : estimated(v, c);
    }
}
