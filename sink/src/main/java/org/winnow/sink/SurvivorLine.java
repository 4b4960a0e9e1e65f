package org.winnow.sink;

import java.util.Locale;
import org.winnow.geometry.Checks;
import org.winnow.geometry.hodge.Basis;
import org.winnow.pipeline.HodgeValues;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Verdict;

/**
 * One line of a survivors file (format 2): {@code config chi}, then for each of h11, h21, h31, h22 its
 * value, basis ({@code proved}, {@code bounded LO..HI} or {@code estimated}) and confidence, then
 * {@code novelty kept_because nearest_reference}, tab-separated. A value the model does not determine (h31
 * and h22 of a three-fold) is {@value #UNDETERMINED} in all three of its columns; so is an absent
 * {@code nearest_reference}. Format-1 lines ({@code config chi h11 h11_confidence h21 novelty kept_because
 * nearest_reference}) are still read, every value as estimated: they did not say how a value was known.
 */
public record SurvivorLine(String config, long chi, PredictedValue h11Value, PredictedValue h21Value,
        PredictedValue h31Value, PredictedValue h22Value, double novelty, Reason keptBecause, String nearestReference)
        implements HodgeValues {
    /** The column names, in order. */
    public static final String COLUMNS = "config\tchi\t" + valueColumns() + "\tnovelty\tkept_because\tnearest_reference";
    /** The column names of format 1. */
    public static final String COLUMNS_V1 = "config\tchi\th11\th11_confidence\th21\tnovelty\tkept_because\tnearest_reference";
    /** Written for a value that is not determined. */
    public static final String UNDETERMINED = "-";

    static String valueColumns() {
        StringBuilder sb = new StringBuilder();
        for (String v : new String[] {"h11", "h21", "h31", "h22"}) {
            sb.append(sb.length() == 0 ? "" : "\t").append(v).append('\t').append(v).append("_basis\t").append(v)
                    .append("_confidence");
        }
        return sb.toString();
    }

    /** The line of a kept record. */
    public static String format(Scored s) {
        Checks.requireArgument(s.verdict() == Verdict.KEEP, "not a survivor: %s", s.reason().code());
        String ref = s.prediction().nearestReference();
        return s.candidate().config().toText() + '\t' + s.invariants().chi() + '\t' + values(s.prediction()) + '\t'
                + fraction(s.novelty()) + '\t' + s.reason().code() + '\t' + (ref.isEmpty() ? UNDETERMINED : ref);
    }

    /** The twelve value columns of an estimate. */
    static String values(Prediction e) {
        return value(e.h11Value()) + '\t' + value(e.h21Value()) + '\t' + value(e.h31Value()) + '\t' + value(e.h22Value());
    }

    private static String value(PredictedValue v) {
        if (v == null) {
            return UNDETERMINED + '\t' + UNDETERMINED + '\t' + UNDETERMINED;
        }
        return v.value() + "\t" + v.describeBasis() + '\t' + fraction(v.confidence());
    }

    /**
     * Parses a data line of format 2 or 1; {@link IllegalArgumentException} naming the problem in one short line
     * otherwise. Numbers are ASCII digits, novelty and confidences decimals in [0, 1], h11 fits an int.
     */
    public static SurvivorLine parse(String line) {
        try {
            String[] f = line.split("\t", -1);
            if (f.length == 8) {
                Reason r = keepReason(f[6]);
                double c = LineFields.share(f[3], "h11_confidence");
                return checked(new SurvivorLine(f[0], LineFields.integer(f[1], "chi"), old(f[2], c),
                        f[4].equals(UNDETERMINED) ? null : old(f[4], c), null, null, LineFields.share(f[5], "novelty"), r,
                        f[7].equals(UNDETERMINED) ? "" : f[7]));
            }
            Checks.requireArgument(f.length == 17, "a survivor line has 17 fields (8 in format 1), found %d", f.length);
            return checked(new SurvivorLine(f[0], LineFields.integer(f[1], "chi"), parseValue(f, 2), parseValue(f, 5),
                    parseValue(f, 8), parseValue(f, 11), LineFields.share(f[14], "novelty"), keepReason(f[15]),
                    f[16].equals(UNDETERMINED) ? "" : f[16]));
        } catch (IllegalArgumentException | ArithmeticException e) {
            throw new IllegalArgumentException(e instanceof ArithmeticException ? "a Hodge value beyond 2^31 - 1"
                    : LineFields.brief(e.getMessage()), e);
        }
    }

    private static SurvivorLine checked(SurvivorLine s) {
        requireInts(s.h11Value(), s.h21Value(), s.h31Value(), s.h22Value());
        return s;
    }

    /** h11 given, and every given value (readers take them as ints) within an int. */
    static void requireInts(PredictedValue h11, PredictedValue... others) {
        Checks.requireArgument(h11 != null, "h11 must be given");
        Math.toIntExact(h11.value());
        for (PredictedValue v : others) {
            if (v != null) {
                Math.toIntExact(v.value());
            }
        }
    }

    private static Reason keepReason(String code) {
        Reason r = Reason.ofCode(code);
        Checks.requireArgument(r.verdict() == Verdict.KEEP, "not a keep reason: %s", code);
        return r;
    }

    /** A format-1 value: nothing said how it was known, so it reads as estimated. */
    static PredictedValue old(String value, double confidence) {
        return new PredictedValue(LineFields.integer(value, "a value"), Basis.ESTIMATED, 0, Long.MAX_VALUE,
                Math.min(confidence, Math.nextDown(1.0)));
    }

    /** The value at columns {@code at..at+2}, or null when undetermined. */
    static PredictedValue parseValue(String[] f, int at) {
        if (f[at].equals(UNDETERMINED)) {
            return null;
        }
        LineFields.integer(f[at], "a value");
        double c = LineFields.share(f[at + 2], "a confidence");
        String b = f[at + 1];
        if (b.startsWith("bounded ")) {
            int dots = b.indexOf("..");
            if (dots > 0) {
                LineFields.integer(b.substring("bounded ".length(), dots), "a bound");
                LineFields.integer(b.substring(dots + 2), "a bound");
            }
        }
        return PredictedValue.parse(f[at], b, Double.toString(c));
    }

    /** Six decimals: finer than any vote share or p-value of a practical reference set. */
    static String fraction(double x) {
        return String.format(Locale.ROOT, "%.6f", x);
    }
}
