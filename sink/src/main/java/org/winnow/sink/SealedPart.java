package org.winnow.sink;

/**
 * A sealed part of a series as it was written: recorded in the checkpoint and the manifest, so that a
 * rerun, {@code winnow report} and {@code winnow verify} can tell a part that was cut, edited or replaced
 * from the one the scan committed.
 *
 * @param name   the final file name, e.g. {@code survivors-00002.tsv}
 * @param bytes  the file's length
 * @param lines  its data lines (the header lines not counted)
 * @param sha256 the SHA-256 of its bytes, lower-case hex
 */
public record SealedPart(String name, long bytes, long lines, String sha256) {}
