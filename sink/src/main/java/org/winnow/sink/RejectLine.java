package org.winnow.sink;

import org.winnow.geometry.Checks;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Verdict;

/**
 * One line of a rejects file: {@code config chi h11 h11_confidence h21 novelty rejected_because},
 * tab-separated, with {@value SurvivorLine#UNDETERMINED} for an undetermined {@code h21}.
 */
public record RejectLine(String config, long chi, int h11, double confidence, Integer h21, double novelty,
        Reason rejectedBecause) {
    /** The column names, in order. */
    public static final String COLUMNS = "config\tchi\th11\th11_confidence\th21\tnovelty\trejected_because";

    /** The line of a rejected record. */
    public static String format(Scored s) {
        Checks.requireArgument(s.verdict() == Verdict.REJECT, "not a reject: %s", s.reason().code());
        return s.candidate().config().toText() + '\t' + s.invariants().chi() + '\t' + s.prediction().h11() + '\t'
                + SurvivorLine.fraction(s.prediction().confidence()) + '\t'
                + (s.prediction().h21() == null ? SurvivorLine.UNDETERMINED : s.prediction().h21()) + '\t'
                + SurvivorLine.fraction(s.novelty()) + '\t' + s.reason().code();
    }

    /** Parses a data line. */
    public static RejectLine parse(String line) {
        String[] f = line.split("\t", -1);
        Checks.requireArgument(f.length == 7, "a reject line has 7 fields, found %d: %s", f.length, line);
        Reason r = Reason.ofCode(f[6]);
        Checks.requireArgument(r.verdict() == Verdict.REJECT, "not a reject reason: %s", f[6]);
        return new RejectLine(f[0], Long.parseLong(f[1]), Integer.parseInt(f[2]), Double.parseDouble(f[3]),
                f[4].equals(SurvivorLine.UNDETERMINED) ? null : Integer.valueOf(f[4]), Double.parseDouble(f[5]), r);
    }
}
