package org.winnow.sink;

import java.time.Instant;
import java.util.Map;

/**
 * The last committed point of a scan directory, written atomically as {@code checkpoint.json}.
 *
 * @param formatVersion  {@link ScanFiles#FORMAT_VERSION}
 * @param runId          the scan it belongs to; a rerun with other inputs is refused
 * @param nextSeq        every seq below this is accounted for in the files and counts
 * @param counts         records per reason code
 * @param survivors      the survivors series
 * @param rejects        the rejects series (empty when not written)
 * @param startedAt      when the first session of the scan started
 * @param elapsedSeconds wall time of all earlier sessions up to their last checkpoint
 * @param sessions       how many sessions have committed work to the scan, this one included
 */
public record Checkpoint(int formatVersion, String runId, long nextSeq, Map<String, Long> counts, PartState survivors,
        PartState rejects, Instant startedAt, double elapsedSeconds, int sessions) {}
