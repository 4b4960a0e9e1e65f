package org.winnow.sink;

import org.winnow.geometry.Checks;
import org.winnow.pipeline.HodgeValues;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Verdict;

/**
 * One line of a rejects file (format 2): {@code config chi}, the value, basis and confidence of each of
 * h11, h21, h31, h22 as in {@link SurvivorLine}, then {@code novelty rejected_because}, tab-separated.
 * Format-1 lines ({@code config chi h11 h11_confidence h21 novelty rejected_because}) are still read,
 * every value as estimated.
 */
public record RejectLine(String config, long chi, PredictedValue h11Value, PredictedValue h21Value,
        PredictedValue h31Value, PredictedValue h22Value, double novelty, Reason rejectedBecause) implements HodgeValues {
    /** The column names, in order. */
    public static final String COLUMNS = "config\tchi\t" + SurvivorLine.valueColumns() + "\tnovelty\trejected_because";

    /** The line of a rejected record. */
    public static String format(Scored s) {
        Checks.requireArgument(s.verdict() == Verdict.REJECT, "not a reject: %s", s.reason().code());
        return s.candidate().config().toText() + '\t' + s.invariants().chi() + '\t' + SurvivorLine.values(s.prediction())
                + '\t' + SurvivorLine.fraction(s.novelty()) + '\t' + s.reason().code();
    }

    /** Parses a data line of format 2 or 1, as strictly as {@link SurvivorLine#parse}. */
    public static RejectLine parse(String line) {
        try {
            String[] f = line.split("\t", -1);
            RejectLine r;
            if (f.length == 7) {
                double c = LineFields.share(f[3], "h11_confidence");
                r = new RejectLine(f[0], LineFields.integer(f[1], "chi"), SurvivorLine.old(f[2], c),
                        f[4].equals(SurvivorLine.UNDETERMINED) ? null : SurvivorLine.old(f[4], c), null, null,
                        LineFields.share(f[5], "novelty"), rejectReason(f[6]));
            } else {
                Checks.requireArgument(f.length == 16, "a reject line has 16 fields (7 in format 1), found %d", f.length);
                r = new RejectLine(f[0], LineFields.integer(f[1], "chi"), SurvivorLine.parseValue(f, 2),
                        SurvivorLine.parseValue(f, 5), SurvivorLine.parseValue(f, 8), SurvivorLine.parseValue(f, 11),
                        LineFields.share(f[14], "novelty"), rejectReason(f[15]));
            }
            SurvivorLine.requireInts(r.h11Value(), r.h21Value(), r.h31Value(), r.h22Value());
            return r;
        } catch (IllegalArgumentException | ArithmeticException e) {
            throw new IllegalArgumentException(e instanceof ArithmeticException ? "a Hodge value beyond 2^31 - 1"
                    : LineFields.brief(e.getMessage()), e);
        }
    }

    private static Reason rejectReason(String code) {
        Reason r = Reason.ofCode(code);
        Checks.requireArgument(r.verdict() == Verdict.REJECT, "not a reject reason: %s", code);
        return r;
    }
}
