package org.winnow.sink;

/**
 * Where a series of rolled files stands at a checkpoint.
 *
 * @param sealed     parts 1..sealed are complete; each is under its final name or about to be renamed
 * @param openBytes  length of the open part's partial file (part sealed + 1); 0 when none is open
 * @param openLines  data lines in the open part
 * @param totalLines data lines in all parts
 */
public record PartState(int sealed, long openBytes, long openLines, long totalLines) {
    /** A series with nothing written. */
    public static final PartState EMPTY = new PartState(0, 0, 0, 0);
}
