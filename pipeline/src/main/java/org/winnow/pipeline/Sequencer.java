package org.winnow.pipeline;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.metrics.SourceMetrics;

/**
 * Turns what a {@link CandidateSource} pushes into {@link Candidate}s: drops repeats of a key,
 * numbers the distinct ones 0, 1, 2, ... in source order, holds back those below the resume point,
 * and applies the {@link BadInputPolicy}.
 *
 * <p>Because a source pushes the same items in the same order on every run, the numbering is the
 * same on every run, and resumption needs nothing but the first seq not yet committed downstream.
 *
 * <p>Called from the source thread only; {@link #report()} may be called from any thread.
 */
public final class Sequencer implements SourceListener {
    /** The manifest lists at most this many bad inputs by line; all are counted. */
    public static final int MAX_LISTED_BAD_INPUTS = 1000;

    /** Where numbered candidates go; blocks for backpressure. */
    @FunctionalInterface
    public interface Downstream {
        void send(Candidate candidate) throws InterruptedException;
    }

    private final long resumeFrom;
    private final int shard;
    private final BadInputPolicy policy;
    private final Downstream downstream;
    private final SourceMetrics metrics;
    private final SeenKeys seen;
    private final List<BadInput> listed = new ArrayList<>();
    private long items;
    private long duplicates;
    private long nextSeq;
    private long skipped;
    private long badInputs;
    private boolean done;

    /**
     * @param resumeFrom the first seq to send; lower ones were committed by an earlier run
     * @param shard      the shard number written into every candidate
     */
    public Sequencer(long resumeFrom, int shard, BadInputPolicy policy, Downstream downstream, SourceMetrics metrics) {
        this(resumeFrom, shard, policy, downstream, metrics, true);
    }

    /**
     * @param dedup false for a source whose items are distinct by construction ({@link CandidateSource#distinct()});
     *              then no set of seen keys is kept and nothing is counted as a duplicate
     */
    public Sequencer(long resumeFrom, int shard, BadInputPolicy policy, Downstream downstream, SourceMetrics metrics,
            boolean dedup) {
        this(resumeFrom, shard, policy, downstream, metrics, dedup ? SeenKeys.limitForThisHeap() : 0);
    }

    /**
     * @param maxKeys the most distinct candidates the duplicate check holds ({@link SeenKeys}); beyond it
     *                {@link #item} throws {@link KeyLimitException}. 0 for a source whose items are distinct by
     *                construction: then no set of seen keys is kept and nothing is counted as a duplicate
     */
    public Sequencer(long resumeFrom, int shard, BadInputPolicy policy, Downstream downstream, SourceMetrics metrics,
            long maxKeys) {
        Checks.requireArgument(resumeFrom >= 0, "resume point must be non-negative: %s", resumeFrom);
        this.resumeFrom = resumeFrom;
        this.shard = shard;
        this.policy = Objects.requireNonNull(policy, "policy");
        this.downstream = Objects.requireNonNull(downstream, "downstream");
        this.metrics = Objects.requireNonNull(metrics, "metrics");
        Checks.requireArgument(maxKeys >= 0, "key limit must be non-negative: %s", maxKeys);
        this.seen = maxKeys > 0 ? new SeenKeys(maxKeys) : null;
    }

    @Override
    public void item(Configuration canonical, String canonicalText) throws InterruptedException {
        String key = CandidateKeys.of(canonicalText);
        long seq;
        synchronized (this) {
            items++;
            if (seen != null && !seen.add(key)) {
                duplicates++;
                metrics.duplicate();
                return;
            }
            seq = nextSeq++;
            if (seq < resumeFrom) {
                skipped++;
                metrics.skipped();
                return;
            }
        }
        downstream.send(new Candidate(canonical, key, shard, seq));
        metrics.sent();
    }

    @Override
    public void badInput(long line, String problem) {
        if (policy == BadInputPolicy.FAIL) {
            throw new BadInputException(line, problem);
        }
        synchronized (this) {
            badInputs++;
            if (listed.size() < MAX_LISTED_BAD_INPUTS) {
                listed.add(new BadInput(line, problem));
            }
        }
        metrics.badInput();
    }

    /** Marks the end of the source's output. */
    public synchronized void markDone() {
        done = true;
    }

    /** A consistent snapshot of the counts so far. */
    public synchronized SourceReport report() {
        return new SourceReport(items, duplicates, nextSeq, skipped, badInputs, listed, done);
    }
}
