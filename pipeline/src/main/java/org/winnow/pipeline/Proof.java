package org.winnow.pipeline;

import java.util.Locale;

/** What the opt-in proof step did for one candidate. */
public enum Proof {
    /** No proof step ran: it is off, or the verdict did not rest on an unproved value. */
    NOT_ATTEMPTED,
    /** The exact backend proved every value the rules name. */
    SETTLED,
    /** The engine finished within the budget but left a named value unproved (bounded, or refused). */
    UNSETTLED,
    /** The budget ran out first; the values are what the cheap tuple and the vote gave. */
    OUT_OF_TIME;

    /** The lower-case code used in manifests and metric tags: {@code settled}, {@code out-of-time}, ... */
    public String code() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }
}
