package org.winnow.geometry.hodge;

import java.util.function.LongSupplier;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.cohomology.Interval;

/**
 * The h11 the similarity model is anchored on: the first-page estimate of {@link H11Estimator} where its
 * pages are settled, and otherwise what the Hodge engine can prove, run without the exact backend (the
 * Koszul dimensions, d1 and the Jacobian ranks), so that it stays cheap: the exact value when the engine
 * decides it, else the first-page estimate clamped into the engine's bounds.
 *
 * <p>Why: where no differential can reach the entries the estimate reads, its line bundle numbers are
 * exact; where one can, the first page is the only place it errs (on the labelled three-folds, exactly
 * the 7 unsettled configurations of 9,103 were wrong, and the engine settles each in a few
 * milliseconds). So the rare unsettled case pays for a proof instead of poisoning a prediction.
 *
 * <p>NOT thread-safe (it owns an estimator and an engine): one per thread. {@link #estimate} allocates
 * only on the unsettled path.
 */
public final class RefinedH11Estimator {
    /** Where the last value came from. */
    public enum Source {
        /** The first page, settled. */
        FIRST_PAGE,
        /** The Hodge engine decided h11. */
        ENGINE_EXACT,
        /** The engine bounded h11; the value is the first-page estimate clamped into the bounds. */
        ENGINE_BOUNDED,
        /** The engine refused the configuration; the value is the unsettled first-page estimate. */
        UNSETTLED
    }

    /** Engine answers kept for configurations seen again (training encodes each example many times). */
    private static final int REMEMBERED = 4096;

    private final H11Estimator firstPage = new H11Estimator();
    private final java.util.Map<Configuration, Answer> remembered = new java.util.LinkedHashMap<>(64, 0.75f, true) {
        @Override
        protected boolean removeEldestEntry(java.util.Map.Entry<Configuration, Answer> eldest) {
            return size() > REMEMBERED;
        }
    };
    private final LongSupplier nanoClock;
    private HodgeEngine engine;
    private Source source = Source.FIRST_PAGE;

    /** An estimator whose engine (made on first need) reads time from {@code nanoClock}. */
    public RefinedH11Estimator(LongSupplier nanoClock) {
        this.nanoClock = nanoClock;
    }

    /** An estimator on the system clock. */
    public RefinedH11Estimator() {
        this(System::nanoTime);
    }

    /** The anchored h11 of a Calabi-Yau configuration; {@link #source()} says how it was found. */
    public int estimate(Configuration config) {
        int estimate = firstPage.estimate(config);
        if (firstPage.settled()) {
            source = Source.FIRST_PAGE;
            return estimate;
        }
        Answer answer = remembered.get(config);
        if (answer == null) {
            answer = ask(config, estimate);
            remembered.put(config, answer);
        }
        source = answer.source();
        return answer.value();
    }

    private record Answer(int value, Source source) {}

    private Answer ask(Configuration config, int estimate) {
        if (engine == null) {
            engine = new HodgeEngine(HodgeEngine.DEFAULT_SEEDS, null, nanoClock);
        }
        Interval h11 = engine.compute(config).h11();
        if (h11 == null) {
            return new Answer(estimate, Source.UNSETTLED);
        }
        if (h11.isExact()) {
            return new Answer(Math.toIntExact(h11.value()), Source.ENGINE_EXACT);
        }
        return new Answer(Math.toIntExact(Math.max(h11.lo(), Math.min(h11.hi(), estimate))), Source.ENGINE_BOUNDED);
    }

    /** How the last value was found. */
    public Source source() {
        return source;
    }

    /** The first-page terms of the last configuration (see {@link H11Estimator}). */
    public long eulerOne() {
        return firstPage.eulerOne();
    }

    /** See {@link H11Estimator#eulerTwo()}. */
    public long eulerTwo() {
        return firstPage.eulerTwo();
    }

    /** See {@link H11Estimator#conormalTwo()}. */
    public long conormalTwo() {
        return firstPage.conormalTwo();
    }
}
