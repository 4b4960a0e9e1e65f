package org.winnow.sink;

import java.time.Duration;
import java.util.Objects;
import org.winnow.geometry.Checks;

/**
 * Tuning of the sink.
 *
 * @param linesPerFile      data lines per survivors (or rejects) file before it rolls over
 * @param writeRejects      also write the rejected candidates with their reasons
 * @param checkpointRecords checkpoint at least every this many records
 * @param checkpointEvery   and at least this often in wall time
 */
public record SinkOptions(int linesPerFile, boolean writeRejects, int checkpointRecords, Duration checkpointEvery) {
    public SinkOptions {
        Checks.requireArgument(linesPerFile >= 1, "lines per file must be at least 1: %s", linesPerFile);
        Checks.requireArgument(checkpointRecords >= 1, "checkpoint interval must be at least 1 record: %s", checkpointRecords);
        Objects.requireNonNull(checkpointEvery, "checkpointEvery");
        Checks.requireArgument(!checkpointEvery.isNegative() && !checkpointEvery.isZero(),
                "checkpoint period must be positive: %s", checkpointEvery);
    }

    /** Data lines per file unless told otherwise. */
    public static final int DEFAULT_LINES_PER_FILE = 100_000;
    /** Records between checkpoints unless told otherwise. */
    public static final int DEFAULT_CHECKPOINT_RECORDS = 50_000;
    /** The longest wall time between checkpoints. */
    public static final Duration DEFAULT_CHECKPOINT_EVERY = Duration.ofSeconds(5);

    /** Defaults: 100,000 lines a file, no rejects file, checkpoints every 50,000 records or 5 seconds. */
    public SinkOptions() {
        this(DEFAULT_LINES_PER_FILE, false);
    }

    /** The given file size and rejects choice, checkpoints at the defaults. */
    public SinkOptions(int linesPerFile, boolean writeRejects) {
        this(linesPerFile, writeRejects, DEFAULT_CHECKPOINT_RECORDS, DEFAULT_CHECKPOINT_EVERY);
    }
}
