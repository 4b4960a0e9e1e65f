package org.winnow.sink;

import java.time.Instant;
import java.util.List;
import java.util.Map;
import org.winnow.pipeline.BadInput;

/**
 * {@code manifest.json}: what a scan was and what it found. Rewritten at every checkpoint with
 * {@code complete = false}, and once more with {@code complete = true} when the scan has finished.
 *
 * @param formatVersion {@link ScanFiles#FORMAT_VERSION}
 * @param runId         the scan's identity
 * @param complete      true iff every candidate of the source has been scored and committed
 * @param source        the bounds or the input file, in one line
 * @param bounds        the bounds as given, or null for an input file
 * @param rules         the keep rules, one a line
 * @param modelChecksum the frozen model's checksum
 * @param counts        the counts, which reconcile (see {@link Counts})
 * @param badInputLines the first unusable input lines, with line numbers
 * @param timings       wall-clock facts
 * @param survivorFiles committed survivor files, in order
 * @param rejectFiles   committed reject files, in order (empty unless asked for)
 */
public record Manifest(int formatVersion, String runId, boolean complete, String source, Object bounds,
        List<String> rules, String modelChecksum, Counts counts, List<BadInput> badInputLines, Timings timings,
        List<String> survivorFiles, List<String> rejectFiles) {

    /**
     * Counts. They reconcile: {@code enumerated = duplicates + candidates}, {@code scored = rejected + kept},
     * {@code rejected} and {@code kept} are the sums of their maps, {@code survivorLines = kept}, and when
     * complete {@code scored = candidates}. Bad input lines are not part of {@code enumerated}.
     *
     * @param enumerated        usable items the source produced (this session counts the whole source)
     * @param duplicates        items whose key was seen before
     * @param candidates        distinct candidates, each given a seq
     * @param badInput          unusable input lines
     * @param scored            candidates with a committed verdict
     * @param rejected          of them rejected
     * @param kept              of them kept
     * @param rejectedByReason  rejections per reason code, every reject reason listed
     * @param keptByReason      keeps per reason code, every keep reason listed
     * @param survivorLines     lines in the survivor files
     */
    public record Counts(long enumerated, long duplicates, long candidates, long badInput, long scored, long rejected,
            long kept, Map<String, Long> rejectedByReason, Map<String, Long> keptByReason, long survivorLines) {}

    /**
     * @param startedAt           start of the first session
     * @param updatedAt           when this manifest was written
     * @param elapsedSeconds      wall time of all sessions so far
     * @param sessions            sessions that worked on the scan
     * @param candidatesPerSecond scored candidates per second of this session
     */
    public record Timings(Instant startedAt, Instant updatedAt, double elapsedSeconds, int sessions,
            double candidatesPerSecond) {}

    /** Reads a manifest. */
    public static Manifest read(java.nio.file.Path file) throws java.io.IOException {
        return ScanFiles.JSON.readValue(file.toFile(), Manifest.class);
    }
}
