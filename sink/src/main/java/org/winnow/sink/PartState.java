package org.winnow.sink;

import java.util.List;

/**
 * Where a series of rolled files stands at a checkpoint.
 *
 * @param sealed     parts 1..sealed are complete; each is under its final name or about to be renamed
 * @param openBytes  length of the open part's partial file (part sealed + 1); 0 when none is open
 * @param openLines  data lines in the open part
 * @param totalLines data lines in all parts
 * @param openSha256 SHA-256 of the open part's first {@code openBytes} bytes (lower-case hex), or the empty
 *                   string when none is open; a rerun checks it before it continues the part
 * @param parts      the sealed parts 1..sealed, in order, with their lengths and digests
 */
public record PartState(int sealed, long openBytes, long openLines, long totalLines, String openSha256,
        List<SealedPart> parts) {
    /** A series with nothing written. */
    public static final PartState EMPTY = new PartState(0, 0, 0, 0, "", List.of());
}
