package org.winnow.pipeline;

import java.util.List;

/**
 * What a source produced, as counted by the {@link Sequencer}.
 *
 * @param items         everything the source pushed that was usable (before dedup)
 * @param duplicates    items whose key was seen before; they are not scored again
 * @param candidates    distinct candidates, = items - duplicates; each gets a seq
 * @param skipped       candidates below the resume point, not sent again this run
 * @param badInputs     how many pieces of input were unusable
 * @param badInputLines the first of them with line numbers (at most {@link Sequencer#MAX_LISTED_BAD_INPUTS})
 * @param done          true once the source has pushed its last item
 */
public record SourceReport(long items, long duplicates, long candidates, long skipped, long badInputs,
        List<BadInput> badInputLines, boolean done) {
    public SourceReport {
        badInputLines = List.copyOf(badInputLines);
    }
}
