package org.winnow.geometry.hodge;

import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.LongSupplier;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.invariants.InvariantCalculator;

/**
 * The Hodge tuple of a Calabi-Yau three-fold or four-fold, every value with its {@link Basis}. Sources,
 * in order: the Koszul first pages ({@link FirstPageTuple}: proved where they are settled and the
 * Jacobian ranks are forced, proved intervals elsewhere); for every value still not proved, the Hodge
 * engine run without its exact backend (Koszul dimensions, d1 and graded Jacobian ranks, so it stays
 * cheap), whose proved intervals are intersected with the first page's; what is still open keeps the
 * first-page guess, clamped into its proved interval (BOUNDED) or unproved (ESTIMATED). A value is
 * PROVED only when a proof pins it; a BOUNDED interval is always proved.
 *
 * <p>{@link #prove} is the opt-in proof step: the engine with its exact backend, within a time budget.
 *
 * <p>Block-diagonal matrices (products): the engine computes every block and combines them by the
 * Kunneth formula; a product's values are proved only when every block is decided, else they are
 * first-page guesses (ESTIMATED).
 *
 * <p>NOT thread-safe (it owns a first-page reader, an invariant workspace and engines): one per thread.
 */
public final class RefinedTupleEstimator {
    /** Engine answers kept for configurations seen again (training encodes each example many times). */
    private static final int REMEMBERED = 4096;
    /** First-page/engine contradictions met in this process (all estimators), for the log's rate limit. */
    private static final AtomicLong CONTRADICTIONS = new AtomicLong();

    private final FirstPageTuple firstPage = new FirstPageTuple();
    private final InvariantCalculator invariants = new InvariantCalculator();
    private final Map<Configuration, HodgeResult> remembered = new LinkedHashMap<>(64, 0.75f, true) {
        @Override
        protected boolean removeEldestEntry(Map.Entry<Configuration, HodgeResult> eldest) {
            return size() > REMEMBERED;
        }
    };
    private final LongSupplier nanoClock;
    private HodgeEngine cheapEngine;
    private ExecutorService prover;
    private boolean lastProofTimedOut;
    private boolean deferred;

    /** An estimator whose engines (made on first need) read time from {@code nanoClock}. */
    public RefinedTupleEstimator(LongSupplier nanoClock) {
        this.nanoClock = nanoClock;
    }

    /** An estimator on the system clock. */
    public RefinedTupleEstimator() {
        this(System::nanoTime);
    }

    /**
     * The tuple of a Calabi-Yau configuration of dimension 3 or 4.
     *
     * @throws IllegalArgumentException if {@code c} is not Calabi-Yau or not of dimension 3 or 4
     */
    public TupleEstimate estimate(Configuration c) {
        requireSupported(c);
        return estimate(c, invariants.chi(c));
    }

    /** As {@link #estimate(Configuration)} with the Euler characteristic already known (it must be exact). */
    public TupleEstimate estimate(Configuration c, long chi) {
        requireSupported(c);
        firstPage.compute(c, chi);
        deferred = false;
        if (firstPage.blocks() > 1) {
            return product(c);
        }
        if (!firstPage.applies()) {
            return guesses(c.dimension(), false, "estimate");
        }
        Interval[] pages = {firstPage.h11(), firstPage.h21(), firstPage.h31(), firstPage.h22()};
        if (allExact(pages, c.dimension())) {
            return assemble(c.dimension(), chi, pages, "first page");
        }
        return combine(c.dimension(), chi, pages, engineAnswer(c));
    }

    /**
     * The tuple with the engine deferred: every value still with its basis, but the engine runs only where
     * neither the first page proves h11 nor {@code settledH11} is given, so that h11 is what
     * {@link #estimate(Configuration, long)} gives wherever the settled first-page reading of
     * {@link org.winnow.geometry.cohomology.H11Estimator} is right. Cases, for one block:
     * <ul>
     *   <li>the first page proves every value: that tuple, as {@code estimate} gives it;</li>
     *   <li>the first page proves h11: h11 PROVED, h21, h31 and h22 BOUNDED by the first page;</li>
     *   <li>it does not, but {@code settledH11 >= 1} lies in its h11 interval: h11 BOUNDED by that interval
     *       with {@code settledH11} as its value (a reading that assumes a map of maximal rank, so never
     *       marked proved), the rest BOUNDED by the first page;</li>
     *   <li>otherwise (and for products) {@code estimate} itself, the engine included.</li>
     * </ul>
     * {@link #lastDeferred()} says when the engine was skipped although a value is not proved:
     * {@code estimate} may then prove more.
     *
     * <p>Why: a scan needs the engine only where a verdict hinges on a value the first page leaves open
     * (the engine on the ~15% of lossless four-folds whose Jacobian ranks the first page leaves open is
     * nearly all of the cost of {@code estimate}; docs/benchmarks.md).
     *
     * @param settledH11 the settled first-page h11 of {@code c}, or a negative number when it is unsettled
     */
    public TupleEstimate estimateDeferred(Configuration c, long chi, int settledH11) {
        requireSupported(c);
        firstPage.compute(c, chi);
        deferred = false;
        if (firstPage.blocks() > 1) {
            return product(c);
        }
        if (!firstPage.applies()) {
            return guesses(c.dimension(), false, "estimate");
        }
        Interval[] pages = {firstPage.h11(), firstPage.h21(), firstPage.h31(), firstPage.h22()};
        if (allExact(pages, c.dimension())) {
            return assemble(c.dimension(), chi, pages, "first page");
        }
        if (pages[0] != null && pages[0].isExact()) {
            deferred = true;
            return assemble(c.dimension(), chi, pages, "first page (engine deferred)");
        }
        if (settledH11 >= 1 && (pages[0] == null || pages[0].contains(settledH11))) {
            deferred = true;
            return assemble(c.dimension(), chi, pages, settledH11, "first page (engine deferred)");
        }
        return combine(c.dimension(), chi, pages, engineAnswer(c));
    }

    /**
     * True iff the last {@link #estimateDeferred} skipped the engine although some value is not proved by
     * the first page: {@link #estimate(Configuration, long)} on the same configuration may prove more.
     */
    public boolean lastDeferred() {
        return deferred;
    }

    /**
     * The first page alone, without the engine: the cheapest tuple, for a scan that cannot afford the
     * engine on the candidates whose Jacobian ranks are open (about 15% of the lossless four-folds up to
     * 6 rows; docs/benchmarks.md). Every value still carries its basis: what the first page pins is
     * PROVED, the rest BOUNDED by the first page's intervals; products are ESTIMATED (their blocks would
     * need the engine).
     */
    public TupleEstimate estimateFirstPage(Configuration c, long chi) {
        requireSupported(c);
        firstPage.compute(c, chi);
        if (firstPage.blocks() > 1) {
            return guesses(c.dimension(), true, "product (first page only)");
        }
        if (!firstPage.applies()) {
            return guesses(c.dimension(), false, "estimate");
        }
        Interval[] pages = {firstPage.h11(), firstPage.h21(), firstPage.h31(), firstPage.h22()};
        return assemble(c.dimension(), chi, pages, "first page");
    }

    /**
     * The opt-in proof step: the estimate, and where it is not all proved, the Hodge engine with its
     * exact backend (the transferred Koszul complex), stopped after {@code budget}. Returns what is then
     * proved; when the budget ran out, the cheap estimate with "proof out of time" in its method, and
     * {@link #lastProofTimedOut()} is true.
     */
    public TupleEstimate prove(Configuration c, Duration budget) {
        Checks.requireArgument(!budget.isNegative() && !budget.isZero(), "the proof budget must be positive: %s", budget);
        TupleEstimate cheap = estimate(c);
        lastProofTimedOut = false;
        if (cheap.allProved()) {
            return cheap;
        }
        long chi = invariants.chi(c);
        Interval[] pages = {firstPage.h11(), firstPage.h21(), firstPage.h31(), firstPage.h22()};
        long start = nanoClock.getAsLong();
        Future<HodgeResult> job = prover().submit(() -> new HodgeEngine(HodgeEngine.DEFAULT_SEEDS,
                new Interruptible(new TransferredBackend()), nanoClock).compute(c));
        HodgeResult exact;
        try {
            exact = job.get(budget.toNanos(), TimeUnit.NANOSECONDS);
            if (nanoClock.getAsLong() - start > budget.toNanos()) {
                // Done, but late: the waiting thread was descheduled past the deadline. The budget is the
                // rule, whichever thread noticed first, so a result after it counts as out of time.
                lastProofTimedOut = true;
                return outOfTime(cheap, budget);
            }
        } catch (TimeoutException e) {
            // The worker stops at its next exact-backend call; a fresh worker keeps the next budget whole.
            job.cancel(true);
            prover.shutdownNow();
            prover = null;
            lastProofTimedOut = true;
            return outOfTime(cheap, budget);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            job.cancel(true);
            return cheap;
        } catch (ExecutionException e) {
            if (e.getCause() instanceof Stopped) {
                lastProofTimedOut = true;
                return cheap;
            }
            throw new IllegalStateException("the exact engine failed on " + c.toText(), e.getCause());
        }
        TupleEstimate proved = cheap.product() ? product(c.dimension(), exact) : combine(c.dimension(), chi, pages, exact);
        return new TupleEstimate(proved.dim(), proved.h11(), proved.h21(), proved.h31(), proved.h22(), proved.product(),
                proved.method().replace("engine", "exact engine"));
    }

    private static TupleEstimate outOfTime(TupleEstimate cheap, Duration budget) {
        return new TupleEstimate(cheap.dim(), cheap.h11(), cheap.h21(), cheap.h31(), cheap.h22(), cheap.product(),
                cheap.method() + "; proof out of time after " + budget.toMillis() + " ms");
    }

    /** First-page/engine contradictions met so far in this process, over all estimators (expected: 0). */
    public static long contradictions() {
        return CONTRADICTIONS.get();
    }

    /** True iff the last {@link #prove} ran out of its budget. */
    public boolean lastProofTimedOut() {
        return lastProofTimedOut;
    }

    /** Stops the proof worker, if one was started. */
    public void close() {
        if (prover != null) {
            prover.shutdownNow();
            prover = null;
        }
    }

    /** Thrown inside the proof worker when it is interrupted; not caught by the engine. */
    private static final class Stopped extends RuntimeException {
        Stopped() {
            super("proof step interrupted", null, false, false);
        }
    }

    /**
     * The exact backend, checking for interruption around every call: the engine polls nothing itself,
     * and one backend call is its longest step (at most about a second on the labelled four-folds).
     */
    private record Interruptible(ExactBackend inner) implements ExactBackend {
        @Override
        public int[] cohomology(org.winnow.geometry.cohomology.DefiningPolynomials f, int[] k) {
            check();
            int[] h = inner.cohomology(f, k);
            check();
            return h;
        }

        @Override
        public int jacobianRank(org.winnow.geometry.cohomology.DefiningPolynomials f, int t) {
            check();
            int r = inner.jacobianRank(f, t);
            check();
            return r;
        }

        private static void check() {
            if (Thread.currentThread().isInterrupted()) {
                throw new Stopped();
            }
        }
    }

    private ExecutorService prover() {
        if (prover == null) {
            prover = Executors.newSingleThreadExecutor(task -> {
                Thread t = new Thread(task, "winnow-tuple-proof");
                t.setDaemon(true);
                return t;
            });
        }
        return prover;
    }

    private HodgeEngine cheapEngine() {
        if (cheapEngine == null) {
            cheapEngine = new HodgeEngine(HodgeEngine.DEFAULT_SEEDS, null, nanoClock);
        }
        return cheapEngine;
    }

    private static void requireSupported(Configuration c) {
        Checks.requireArgument(c.isCalabiYau(), "not a Calabi-Yau configuration: %s", c.toText());
        Checks.requireArgument(c.dimension() == 3 || c.dimension() == 4,
                "the tuple is estimated for three-folds and four-folds: %s has dimension %d", c.toText(), c.dimension());
    }

    /**
     * A block-diagonal matrix: the identities of full holonomy do not hold, so the first page proves
     * nothing; the engine computes each block and combines their diamonds by the Kunneth formula, which is
     * exact only when every block is (then every value is proved), else the values are first-page guesses.
     */
    private TupleEstimate product(Configuration c) {
        return product(c.dimension(), engineAnswer(c));
    }

    private TupleEstimate product(int d, HodgeResult r) {
        if (!r.isExact()) {
            return guesses(d, true, "product (" + (r.status() == Status.REFUSED ? "refused: " : "bounded: ") + r.reason() + ")");
        }
        return new TupleEstimate(d, KnownValue.proved(r.h11().value()), KnownValue.proved(r.h21().value()),
                d == 4 ? KnownValue.proved(r.h31().value()) : null, d == 4 ? KnownValue.proved(r.h22().value()) : null,
                true, "product (engine, Kunneth)");
    }

    private HodgeResult engineAnswer(Configuration c) {
        HodgeResult r = remembered.get(c);
        if (r == null) {
            r = cheapEngine().compute(c);
            remembered.put(c, r);
        }
        return r;
    }

    /** Intersects the first page's enclosures with the engine's and closes them under the identities. */
    private TupleEstimate combine(int d, long chi, Interval[] pages, HodgeResult r) {
        if (r.status() == Status.REFUSED) {
            return assemble(d, chi, pages, "first page (engine refused: " + r.reason() + ")");
        }
        Interval[] closed;
        try {
            closed = FirstPageTuple.close(d, chi, meet(pages[0], r.h11()), meet(pages[1], r.h21()),
                    d == 4 ? meet(pages[2], r.h31()) : null);
            if (d == 4) {
                closed[3] = meet(closed[3], r.h22());
            }
        } catch (IllegalStateException e) {
            // The engine and the first page disagree: one of them is wrong, so neither is trusted. Never seen on
            // the swept spaces (docs/model.md), but a scan of millions must not drown its log if it ever happens:
            // the first few are logged in full, then every power of ten, each with the running count.
            long seen = CONTRADICTIONS.incrementAndGet();
            if (seen <= 5 || Long.toString(seen).matches("10+")) {
                System.getLogger(RefinedTupleEstimator.class.getName()).log(System.Logger.Level.WARNING,
                        "first page and engine contradict each other on {0}: {1} ({2} such in this process)",
                        r.input().toText(), e.getMessage(), seen);
            }
            return guesses(d, false, "estimate (first page and engine contradict)");
        }
        return assemble(d, chi, closed, "first page + engine (" + r.method().label() + ")");
    }

    private static Interval meet(Interval a, Interval b) {
        return a == null ? b : b == null ? a : a.intersect(b);
    }

    private static boolean allExact(Interval[] v, int d) {
        for (int i = 0; i < (d == 3 ? 2 : 4); i++) {
            if (v[i] == null || !v[i].isExact()) {
                return false;
            }
        }
        return true;
    }

    /**
     * The values with their bases. Guesses: an unbounded value keeps the first-page guess; in a proved
     * interval h11 and h^1(TX) take the end the maximal Jacobian ranks give (the low end, since every
     * value falls as a rank grows: generic maps have maximal rank), and the values the identities tie to
     * them follow from those, clamped into their own intervals; a four-fold's h31 in an interval of width
     * 1 or 2 takes the high end instead ({@link #guess31}). On the 1,110 bounded four-folds up to 6 rows
     * this puts the whole tuple right on 612 (532 with the low end alone, 80 with the first-page guess;
     * docs/model.md).
     */
    private TupleEstimate assemble(int d, long chi, Interval[] v, String method) {
        return assemble(d, chi, v, v[0] == null ? firstPage.guess11() : v[0].lo(), method);
    }

    /** As {@link #assemble(int, long, Interval[], String)} with {@code g11} as the guess for h11. */
    private TupleEstimate assemble(int d, long chi, Interval[] v, long g11, String method) {
        KnownValue h11 = known(v[0], g11);
        KnownValue h21;
        KnownValue h31 = null;
        KnownValue h22 = null;
        if (d == 3) {
            h21 = known(v[1], v[1] == null ? firstPage.guess21() : h11.value() - chi / 2);
        } else {
            h31 = known(v[2], v[2] == null ? firstPage.guess31() : guess31(v[2]));
            h21 = known(v[1], v[1] == null ? firstPage.guess21() : h11.value() + h31.value() + 8 - chi / 6);
            h22 = known(v[3], v[3] == null ? firstPage.guess22() : 12 + 4 * (chi / 6) + 2 * h21.value());
        }
        boolean anyProof = v[0] != null || v[1] != null || v[2] != null || v[3] != null;
        return new TupleEstimate(d, h11, h21, h31, h22, false, anyProof ? method : "estimate");
    }

    /**
     * The guess for a four-fold's h31 in a proved interval: the maximal-rank end (the low one), except
     * in an interval of width 1 or 2, where the high end (the graded Jacobian rank as computed) is taken.
     * An empirical rule, not a proof (the value stays BOUNDED): on the 1,110 bounded four-folds up to 6
     * rows the truth was at the high end of each of the 80 intervals of width 1 or 2 and at the low end
     * of 532 of the 1,030 wider ones; on the 9,522 four-folds of more than 6 rows in the shipped
     * reference (not looked at when the rule was chosen), at the high end of all 3 of width 1.
     */
    private static long guess31(Interval h31) {
        return h31.hi() - h31.lo() <= 2 ? h31.hi() : h31.lo();
    }

    private static KnownValue known(Interval proved, long guess) {
        return proved == null ? KnownValue.estimated(guess) : KnownValue.within(proved, guess);
    }

    private TupleEstimate guesses(int d, boolean product, String method) {
        return new TupleEstimate(d, KnownValue.estimated(firstPage.guess11()), KnownValue.estimated(firstPage.guess21()),
                d == 4 ? KnownValue.estimated(firstPage.guess31()) : null,
                d == 4 ? KnownValue.estimated(firstPage.guess22()) : null, product, method);
    }
}
