package org.winnow.producer.source;

import java.time.Duration;
import java.util.Objects;
import java.util.OptionalLong;
import java.util.concurrent.CancellationException;
import java.util.function.LongSupplier;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.SourceListener;
import org.winnow.producer.Enumerator;

/**
 * Candidates straight from the producer's {@link Enumerator}: every inequivalent configuration of the
 * space once, already in canonical form, in the enumerator's deterministic order. Distinct by
 * construction, so the sequencer keeps no set of seen keys; its memory does not grow with the space.
 *
 * <p>Resumption works as for a file: the walk starts from the beginning on every run and the
 * sequencer holds back the positions the sink has already committed.
 */
public final class EnumerationSource implements CandidateSource {
    /** How long {@link #size()} may count before it gives up; see there. */
    public static final Duration COUNT_BUDGET = Duration.ofSeconds(3);

    private final EnumeratedSpace space;
    private final Duration countBudget;
    private final LongSupplier nanoTime;
    private final int threads;
    private final Enumerator enumerator = new Enumerator();

    /** A source that enumerates on the calling thread. */
    public EnumerationSource(EnumeratedSpace space, Duration countBudget, LongSupplier nanoTime) {
        this(space, countBudget, nanoTime, 1);
    }

    /**
     * @param countBudget how long {@link #size()} may take
     * @param nanoTime    the clock that budget is measured on
     * @param threads     enumeration worker threads; the order of the candidates is the same for any number
     */
    public EnumerationSource(EnumeratedSpace space, Duration countBudget, LongSupplier nanoTime, int threads) {
        this.space = Objects.requireNonNull(space, "space");
        this.countBudget = Objects.requireNonNull(countBudget, "countBudget");
        this.nanoTime = Objects.requireNonNull(nanoTime, "nanoTime");
        if (threads < 1) {
            throw new IllegalArgumentException("enumeration threads must be at least 1, got " + threads);
        }
        this.threads = threads;
    }

    /** Carries the listener's interruption out of the enumerator's consumer, which cannot throw it. */
    private static final class Interrupted extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Interrupted(InterruptedException cause) {
            super(cause);
        }
    }

    @Override
    public void run(SourceListener out) throws InterruptedException {
        try {
            enumerator.run(space.bounds(), space.rules(), space.shard(), threads, e -> {
                try {
                    out.item(e.configuration(), e.text());
                } catch (InterruptedException x) {
                    throw new Interrupted(x);
                }
            });
        } catch (Interrupted e) {
            throw (InterruptedException) e.getCause();
        } catch (CancellationException e) {
            if (Thread.interrupted()) {
                throw new InterruptedException("enumeration interrupted");
            }
            throw e;
        }
    }

    /**
     * The exact number of matrices, by a walk of the tree that builds nothing, or empty when that walk
     * takes longer than the budget. The walk costs about as much as the enumeration itself, which is
     * the slower half of a scan from bounds (docs/scan-pipeline.md has the figures), so an unbounded
     * count could double the run; past the budget the scan shows no ETA rather than a guessed one.
     */
    @Override
    public OptionalLong size() {
        long deadline = nanoTime.getAsLong() + countBudget.toNanos();
        try {
            return OptionalLong.of(enumerator.count(space.bounds(), space.rules(), space.shard(),
                    () -> nanoTime.getAsLong() - deadline > 0).total());
        } catch (CancellationException e) {
            return OptionalLong.empty();
        }
    }

    @Override
    public boolean distinct() {
        return true;
    }

    @Override
    public String description() {
        return "enumeration " + space.key();
    }

    /** The space this source walks. */
    public EnumeratedSpace space() {
        return space;
    }
}
