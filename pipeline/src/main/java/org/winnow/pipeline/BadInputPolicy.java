package org.winnow.pipeline;

/** What to do with a piece of input that cannot be used. */
public enum BadInputPolicy {
    /** Count it, remember its line number for the manifest, and go on. */
    SKIP,
    /** Stop the run with an error naming the line. */
    FAIL
}
