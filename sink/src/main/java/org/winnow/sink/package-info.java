/**
 * The sink of a scan: survivors (and optionally rejects) as TSV files in a directory, committed
 * atomically and rolled over every N lines, a {@code manifest.json} whose counts reconcile, and a
 * checkpoint that lets a rerun with the same directory continue exactly where the last committed
 * point left off.
 *
 * <p>How exactly-once works here: the sink receives records in seq order, gap-free. It appends to a
 * hidden partial file; at a checkpoint it flushes and fsyncs the partial, then atomically replaces
 * {@code checkpoint.json} (the next seq, the counts, and for the open part its byte length), and only
 * then renames parts that are full to their final names. A rerun reads the checkpoint, finishes any
 * rename the crash interrupted, truncates the open partial to the recorded length and asks the source
 * to skip every seq below the recorded one. Part boundaries depend only on line counts, never on when
 * checkpoints happened, so an interrupted and resumed run ends with the same files, byte for byte, as
 * an uninterrupted one. A file under a final name is always complete.
 */
package org.winnow.sink;
