package org.winnow.sink;

import java.util.Locale;
import org.winnow.geometry.Checks;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;

/**
 * One line of a survivors file: {@code config chi h11 h11_confidence h21 novelty kept_because
 * nearest_reference}, tab-separated. {@code h21} is {@value #UNDETERMINED} where the model does not
 * determine it; {@code nearest_reference} is {@value #UNDETERMINED} when there is none.
 */
public record SurvivorLine(String config, long chi, int h11, double confidence, Integer h21, double novelty,
        Reason keptBecause, String nearestReference) {
    /** The column names, in order. */
    public static final String COLUMNS = "config\tchi\th11\th11_confidence\th21\tnovelty\tkept_because\tnearest_reference";
    /** Written for a value that is not determined. */
    public static final String UNDETERMINED = "-";

    /** The line of a kept record. */
    public static String format(Scored s) {
        Checks.requireArgument(s.verdict() == org.winnow.pipeline.Verdict.KEEP, "not a survivor: %s", s.reason().code());
        String ref = s.prediction().nearestReference();
        return s.candidate().config().toText() + '\t' + s.invariants().chi() + '\t' + s.prediction().h11() + '\t'
                + fraction(s.prediction().confidence()) + '\t' + (s.prediction().h21() == null ? UNDETERMINED : s.prediction().h21())
                + '\t' + fraction(s.novelty()) + '\t' + s.reason().code() + '\t' + (ref.isEmpty() ? UNDETERMINED : ref);
    }

    /** Parses a data line; {@link IllegalArgumentException} naming the problem otherwise. */
    public static SurvivorLine parse(String line) {
        String[] f = line.split("\t", -1);
        Checks.requireArgument(f.length == 8, "a survivor line has 8 fields, found %d: %s", f.length, line);
        Reason r = Reason.ofCode(f[6]);
        Checks.requireArgument(r.verdict() == org.winnow.pipeline.Verdict.KEEP, "not a keep reason: %s", f[6]);
        return new SurvivorLine(f[0], Long.parseLong(f[1]), Integer.parseInt(f[2]), Double.parseDouble(f[3]),
                f[4].equals(UNDETERMINED) ? null : Integer.valueOf(f[4]), Double.parseDouble(f[5]), r,
                f[7].equals(UNDETERMINED) ? "" : f[7]);
    }

    /** Six decimals: finer than any vote share or p-value of a practical reference set. */
    static String fraction(double x) {
        return String.format(Locale.ROOT, "%.6f", x);
    }
}
