package org.winnow.pipeline;

/** What the scorer decided about a candidate. */
public enum Verdict {
    /** The candidate goes to the survivors file. */
    KEEP,
    /** A rule excludes the candidate; the reason says which. */
    REJECT
}
