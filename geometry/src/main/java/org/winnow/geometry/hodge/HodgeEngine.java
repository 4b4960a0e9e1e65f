package org.winnow.geometry.hodge;

import java.lang.System.Logger.Level;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.LongSupplier;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.GradedJacobian;
import org.winnow.geometry.cohomology.InconsistentPageException;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.cohomology.KoszulD1;
import org.winnow.geometry.invariants.Block;
import org.winnow.geometry.invariants.Blocks;
import org.winnow.geometry.invariants.CheapInvariants;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.Reduction;

/**
 * Hodge numbers of Calabi-Yau complete intersections of dimension 2, 3 and 4.
 *
 * <p>After reduction of hyperplane columns, the Euler sequence {@code 0 -> O_X^m -> V -> TA|_X -> 0}
 * ({@code V = (+)_r O_X(e_r)^{n_r+1}}) and the normal sequence {@code 0 -> TX -> TA|_X -> N -> 0}
 * ({@code N = (+)_j O_X(q_j)}) express {@code h^q(TX)} through the line bundle numbers
 * {@code v^i = sum_r (n_r+1) h^i(O_X(e_r))}, {@code n^i = sum_j h^i(O_X(q_j))} and the ranks
 * {@code rho_t} of the Jacobian maps {@code H^t(TA|_X) -> H^t(N)}. With {@code t^i} the cohomology of
 * {@code TA|_X} ({@code h(O_X) = (1,0,...,0,1)} is verified, not assumed):
 * <ul>
 *   <li>d = 3: {@code h21 = n^0 - t^0 + t^1 - rho_1}, {@code h11 = n^1 - rho_1 + t^2 - n^2},
 *       {@code t = (v^0 - m, v^1, v^2 + m)};</li>
 *   <li>d = 2: {@code h11 = n^0 - t^0 + t^1 - n^1} ({@code rho_1 = n^1} because {@code H^2(TX) = 0}),
 *       {@code t = (v^0 - m, v^1 + m)};</li>
 *   <li>d = 4: {@code h31 = n^0 - t^0 + t^1 - rho_1}, {@code h21 = n^1 - rho_1 + t^2 - rho_2},
 *       {@code h11 = n^2 - rho_2 + t^3 - n^3}, {@code t = (v^0 - m, v^1, v^2, v^3 + m)}, and
 *       {@code h22 = chi - 4 - 2 h11 - 2 h31 + 4 h21} from the Hodge diamond.</li>
 * </ul>
 * Line bundle numbers come from the Koszul spectral sequence (dimensions, then d1, then the exact
 * backend); ranks {@code rho_t} are 0 when source or target vanish, else from the graded Jacobian map
 * when the filtration rule applies, else from the exact backend. Ranks are computed for each
 * coefficient seed and the larger kept; a disagreement is logged. The checks
 * {@code 2(h11 - h21) = chi} (d = 3), {@code h11 = chi - 4} (d = 2) and
 * {@code chi = 48 + 6(h11 - h21 + h31)} (d = 4) are enforced by intersecting with them; a
 * contradiction refuses the case instead of returning a value. These identities hold for full holonomy only;
 * a block-diagonal matrix (a product) is never put through them: each block is, and the product's diamond
 * follows by the Kunneth formula, checked against chi alone.
 *
 * <p>Not thread-safe (it owns an invariant workspace); use one engine per thread.
 */
public final class HodgeEngine {
    /** The two coefficient seeds used unless others are given. */
    public static final long[] DEFAULT_SEEDS = {0x243F6A8885A308D3L, 0x13198A2E03707344L};

    /** Product blocks remembered per engine (a few kilobytes each). */
    private static final int REMEMBERED_BLOCKS = 1024;

    private static final System.Logger LOG = System.getLogger(HodgeEngine.class.getName());

    private final long[] seeds;
    private final ExactBackend backend;
    private final LongSupplier nanoClock;
    private final InvariantCalculator invariants = new InvariantCalculator();
    /**
     * Results of product blocks, by canonical block: a product's blocks are few distinct small Calabi-Yau
     * manifolds (a torus, a K3, a three-fold), met again and again, so each is computed once per engine.
     */
    private final Map<Configuration, HodgeResult> blockResults = new LinkedHashMap<>(64, 0.75f, true) {
        @Override
        protected boolean removeEldestEntry(Map.Entry<Configuration, HodgeResult> eldest) {
            return size() > REMEMBERED_BLOCKS;
        }
    };

    /**
     * An engine.
     *
     * @param seeds     coefficient seeds (at least one; two recommended)
     * @param backend   the exact method for cases the spectral sequence leaves open, or null (those
     *                  cases are then bounded)
     * @param nanoClock the time source for {@link HodgeResult#seconds()}
     */
    public HodgeEngine(long[] seeds, ExactBackend backend, LongSupplier nanoClock) {
        Checks.requireArgument(seeds.length >= 1, "at least one coefficient seed is needed");
        this.seeds = seeds.clone();
        this.backend = backend;
        this.nanoClock = nanoClock;
    }

    /** An engine with the default seeds and the system clock. */
    public HodgeEngine(ExactBackend backend) {
        this(DEFAULT_SEEDS, backend, System::nanoTime);
    }

    /** The full engine: default seeds, system clock, the transferred Koszul complex as backend. */
    public static HodgeEngine standard() {
        return new HodgeEngine(new TransferredBackend());
    }

    /**
     * The Hodge numbers of {@code input}; never throws for bad input (it is refused with a reason). A
     * block-diagonal input is a product: each block is computed by this engine and the diamond follows by the
     * Kunneth formula (method {@link Method#PRODUCT}, {@link HodgeResult#factors()} lists the blocks).
     */
    public HodgeResult compute(Configuration input) {
        return compute(input, false);
    }

    /**
     * @param factor true for a block of a product, which may also be a curve (an elliptic curve once
     *               {@code h^*(O_X) = (1, 1)} is verified)
     */
    private HodgeResult compute(Configuration input, boolean factor) {
        long start = nanoClock.getAsLong();
        Optional<Long> chi = Optional.empty();
        Method method = null;
        try {
            Optional<String> problem = ConfigurationValidator.problemForCalabiYau(input);
            if (problem.isPresent()) {
                return HodgeResult.refused(input, chi, problem.get(), null, seconds(start));
            }
            int d = input.dimension();
            if (d < (factor ? 1 : 2) || d > 4) {
                return HodgeResult.refused(input, chi, "dimension " + d
                        + ": Hodge numbers are computed for K3 surfaces, three-folds and four-folds", null, seconds(start));
            }
            Configuration x = Reduction.reduce(input);
            for (int j = 0; j < x.cols(); j++) {
                if (x.colSum(j) == 0) {
                    return HodgeResult.refused(input, chi, "empty: after reducing hyperplane columns, column " + (j + 1)
                            + " is a nonzero constant", null, seconds(start));
                }
            }
            CheapInvariants cheap = invariants.compute(x);
            chi = Optional.of(cheap.chi());
            if (cheap.degree() == 0) {
                return HodgeResult.refused(input, chi, "empty: the degree int_X (J_1 + ... + J_m)^d is 0", null,
                        seconds(start));
            }
            List<Block> blocks = Blocks.of(x).list();
            if (blocks.size() > 1) {
                return factor ? HodgeResult.refused(input, chi, "inconsistent: a block has blocks", null, seconds(start))
                        : product(input, x, blocks, chi.get(), start);
            }
            Computation c = new Computation(input, x, chi.get());
            HodgeResult r = c.run(start);
            return r;
        } catch (InconsistentPageException | IllegalStateException e) {
            return HodgeResult.refused(input, chi, "inconsistent: " + e.getMessage(), method, seconds(start));
        } catch (ArithmeticException | IllegalArgumentException e) {
            return HodgeResult.refused(input, chi, "out of range: " + e.getMessage(), method, seconds(start));
        }
    }

    /**
     * A block-diagonal matrix: every block must be decided exactly by the engine, then the Kunneth formula
     * gives the whole diamond, whose Euler characteristic must equal {@code chi} from the intersection
     * numbers (an independent check: the blocks' Hodge numbers come from line bundle cohomology).
     */
    private HodgeResult product(Configuration input, Configuration x, List<Block> blocks, long chi, long start) {
        // Factors in canonical form, smallest dimension first (T2 x K3), so a product reads the same however it
        // was written; the order changes nothing else, the product being commutative.
        List<Configuration> canonical = new ArrayList<>(blocks.size());
        List<Integer> order = new ArrayList<>(blocks.size());
        for (int i = 0; i < blocks.size(); i++) {
            canonical.add(block(x, blocks.get(i)).canonical());
            order.add(i);
        }
        order.sort(Comparator.<Integer>comparingInt(i -> blocks.get(i).dimension())
                .thenComparing(i -> canonical.get(i).toText()));
        List<Configuration> factors = new ArrayList<>(blocks.size());
        List<Block> sorted = new ArrayList<>(blocks.size());
        for (int i : order) {
            factors.add(canonical.get(i));
            sorted.add(blocks.get(i));
        }
        return kunneth(input, factors, sorted, chi, start);
    }

    private HodgeResult kunneth(Configuration input, List<Configuration> factors, List<Block> blocks, long chi,
            long start) {
        StringBuilder names = new StringBuilder();
        for (Configuration f : factors) {
            names.append(names.length() == 0 ? "" : " x ").append(f.toText());
        }
        List<HodgeDiamond> diamonds = new ArrayList<>(factors.size());
        for (int i = 0; i < factors.size(); i++) {
            Configuration f = factors.get(i);
            int dim = blocks.get(i).dimension();
            if (dim < 1) {
                return refusedProduct(input, chi, "product " + names + ": block " + (i + 1) + " (" + f.toText()
                        + ") has dimension " + dim + (dim == 0 ? ", finitely many points" : ", empty"), factors, start);
            }
            HodgeResult r = blockResults.get(f);
            if (r == null) {
                r = compute(f, true);
                blockResults.put(f, r);
            }
            if (r.status() != Status.EXACT) {
                return refusedProduct(input, chi, "product " + names + ": block " + (i + 1) + " (" + f.toText() + ") is "
                        + r.status().label() + ": " + r.reason(), factors, start);
            }
            diamonds.add(r.diamond());
        }
        HodgeDiamond diamond = Kunneth.product(diamonds);
        if (diamond.euler() != chi) {
            return refusedProduct(input, chi, "check failed: product " + names + ": the Kunneth diamond gives chi = "
                    + diamond.euler() + " but the intersection numbers give " + chi, factors, start);
        }
        int d = input.dimension();
        Interval h11 = Interval.exact(diamond.h(1, 1));
        Interval h21 = d >= 3 ? Interval.exact(diamond.h(2, 1)) : null;
        Interval h31 = d == 4 ? Interval.exact(diamond.h(3, 1)) : null;
        Interval h22 = d == 4 ? Interval.exact(diamond.h(2, 2)) : null;
        return new HodgeResult(input, d, Optional.of(chi), h11, h21, h31, h22, Status.EXACT, Method.PRODUCT, "",
                seconds(start), diamond, factors);
    }

    private HodgeResult refusedProduct(Configuration input, long chi, String reason, List<Configuration> factors,
            long start) {
        return new HodgeResult(input, input.dimension(), Optional.of(chi), null, null, null, null, Status.REFUSED, null,
                reason, seconds(start), null, factors);
    }

    /** The rows and columns of one block as a configuration of its own. */
    private static Configuration block(Configuration x, Block b) {
        int[] n = new int[b.rows().size()];
        int[][] q = new int[n.length][b.columns().size()];
        for (int i = 0; i < n.length; i++) {
            int r = b.rows().get(i);
            n[i] = x.n(r);
            for (int j = 0; j < b.columns().size(); j++) {
                q[i][j] = x.q(r, b.columns().get(j));
            }
        }
        return Configuration.of(n, q);
    }

    private double seconds(long start) {
        return (nanoClock.getAsLong() - start) / 1e9;
    }

    /** One Hodge computation on a reduced single-block matrix. */
    private final class Computation {
        private final Configuration input;
        private final Configuration x;
        private final long chi;
        private final int m;
        private final int cols;
        private final int d;
        private final Map<List<Integer>, BundleState> bundles = new HashMap<>();
        private List<DefiningPolynomials> polys;
        private Method method = Method.DIMENSIONS;
        private final List<String> open = new ArrayList<>();

        Computation(Configuration input, Configuration x, long chi) {
            this.input = input;
            this.x = x;
            this.chi = chi;
            this.m = x.rows();
            this.cols = x.cols();
            this.d = x.dimension();
        }

        private List<DefiningPolynomials> polys() {
            if (polys == null) {
                polys = new ArrayList<>();
                for (long s : seeds) {
                    polys.add(DefiningPolynomials.random(x, s));
                }
            }
            return polys;
        }

        private BundleState bundle(int[] k) {
            return bundles.computeIfAbsent(key(k), key -> new BundleState(x, k));
        }

        private BundleState source(int r) {
            int[] k = new int[m];
            k[r] = 1;
            return bundle(k);
        }

        private BundleState target(int j) {
            int[] k = new int[m];
            for (int r = 0; r < m; r++) {
                k[r] = x.q(r, j);
            }
            return bundle(k);
        }

        HodgeResult run(long start) {
            BundleState o = bundle(new int[m]);
            settle(o);
            for (int t = 0; t <= d; t++) {
                long expected = t == 0 || t == d ? 1 : 0;
                if (!o.h(t).isExact()) {
                    return refuse("h^" + t + "(O_X) is not determined", start);
                }
                if (o.h(t).value() != expected) {
                    return refuse("h^" + t + "(O_X) = " + o.h(t).value() + ", expected " + expected, start);
                }
            }
            if (d == 1) {
                // A connected smooth curve with trivial canonical bundle is an elliptic curve: h^{1,1} = h^{0,0}.
                if (chi != 0) {
                    return refuse("check failed: a curve with h^*(O_X) = (1, 1) has chi = 0, the invariants give " + chi,
                            start);
                }
                return new HodgeResult(input, 1, Optional.of(chi), Interval.exact(1), null, null, null, Status.EXACT,
                        method, "", seconds(start), HodgeDiamond.ellipticCurve(), List.of());
            }
            List<BundleState> all = new ArrayList<>();
            for (int r = 0; r < m; r++) {
                all.add(source(r));
            }
            for (int j = 0; j < cols; j++) {
                all.add(target(j));
            }
            int[] rhoDegrees = d == 3 ? new int[] {1} : d == 4 ? new int[] {1, 2} : new int[0];
            Interval[] rho = new Interval[d + 1];
            // Stage 1: dimensions only. Stage 2: d1 where needed. Stage 3: the exact backend.
            for (int stage = 1; stage <= 3; stage++) {
                if (stage == 3 && backend == null) {
                    break;
                }
                for (BundleState b : all) {
                    if (stage == 2 && !b.isExact()) {
                        b.refineWithD1(polys());
                    } else if (stage == 3 && !b.isExact()) {
                        b.refineExact(backend, polys());
                    }
                }
                boolean allRho = true;
                for (int t : rhoDegrees) {
                    rho[t] = rank(t, rho[t], stage);
                    allRho &= rho[t].isExact();
                }
                boolean allExact = allRho;
                for (BundleState b : all) {
                    allExact &= b.isExact();
                }
                if (allExact) {
                    break;
                }
            }
            for (BundleState b : all) {
                method = method.max(b.method());
                if (b.ranksDisagree()) {
                    LOG.log(Level.WARNING, "coefficient seeds disagree on a rank for {0}, O_X{1}; kept the larger",
                            input.toText(), Arrays.toString(b.bundle()));
                }
                if (!b.isExact()) {
                    open.add("h^*(O_X" + Arrays.toString(b.bundle()) + ") not determined");
                }
            }
            return assemble(rho, start);
        }

        private void settle(BundleState b) {
            if (!b.isExact()) {
                b.refineWithD1(polys());
            }
            if (!b.isExact() && backend != null) {
                b.refineExact(backend, polys());
            }
            method = method.max(b.method());
        }

        /** Sum of {@code h^t} over the sources with multiplicity {@code n_r + 1}. */
        private Interval v(int t) {
            Interval s = Interval.exact(0);
            for (int r = 0; r < m; r++) {
                s = s.plus(source(r).h(t).times(x.n(r) + 1L));
            }
            return s;
        }

        private Interval n(int t) {
            Interval s = Interval.exact(0);
            for (int j = 0; j < cols; j++) {
                s = s.plus(target(j).h(t));
            }
            return s;
        }

        /** {@code h^t(TA|_X)} from the Euler sequence. */
        private Interval tangent(int t) {
            Interval v = v(t);
            if (t == 0) {
                return v.plus(-m);
            }
            if (d == 2 && t == 1 || d > 2 && t == d - 1) {
                return v.plus(m);
            }
            return v;
        }

        /** The best proved interval for {@code rho_t} at this stage. */
        private Interval rank(int t, Interval previous, int stage) {
            Interval cap = new Interval(0, Math.max(0, Math.min(tangent(t).hi(), n(t).hi())));
            Interval current = previous == null ? cap : previous.intersect(cap);
            if (current.isExact() || stage == 1) {
                return current;
            }
            if (stage == 2) {
                return current.intersect(graded(t, current));
            }
            long best = -1;
            for (DefiningPolynomials f : polys()) {
                int r = backend.jacobianRank(f, t);
                if (best >= 0 && r != best) {
                    LOG.log(Level.WARNING, "coefficient seeds disagree on rho_{0} for {1}: {2} vs {3}; kept the larger",
                            t, input.toText(), best, r);
                }
                best = Math.max(best, r);
            }
            method = method.max(Method.TRANSFERRED);
            return current.intersect(Interval.exact(best));
        }

        /** rho_t from the graded Jacobian map, when E_infinity = E2 in degree t is proved everywhere. */
        private Interval graded(int t, Interval current) {
            KoszulD1[][] src = new KoszulD1[seeds.length][m];
            KoszulD1[][] tgt = new KoszulD1[seeds.length][cols];
            List<BundleState> involved = new ArrayList<>();
            for (int r = 0; r < m; r++) {
                involved.add(source(r));
            }
            for (int j = 0; j < cols; j++) {
                involved.add(target(j));
            }
            for (BundleState b : involved) {
                b.refineWithD1(polys());
                if (!b.e2IsFinalIn(t)) {
                    return current;
                }
            }
            long best = -1;
            boolean exact = false;
            for (int s = 0; s < seeds.length; s++) {
                boolean usable = true;
                for (int r = 0; r < m; r++) {
                    src[s][r] = source(r).d1For(s);
                    usable &= src[s][r] != null;
                }
                for (int j = 0; j < cols; j++) {
                    tgt[s][j] = target(j).d1For(s);
                    usable &= tgt[s][j] != null;
                }
                if (!usable) {
                    continue;
                }
                GradedJacobian.Result g = GradedJacobian.compute(polys().get(s), src[s], tgt[s], t);
                if (best >= 0 && g.gradedSum() != best) {
                    LOG.log(Level.WARNING, "coefficient seeds disagree on the graded rho_{0} for {1}", t, input.toText());
                }
                best = Math.max(best, g.gradedSum());
                exact = g.exact();
            }
            if (best < 0) {
                return current;
            }
            method = method.max(Method.D1);
            return exact ? Interval.exact(best) : new Interval(best, Math.max(best, current.hi()));
        }

        private HodgeResult assemble(Interval[] rho, long start) {
            Interval h11;
            Interval h21 = null;
            Interval h31 = null;
            Interval h22 = null;
            if (!v(d).isExact() || v(d).value() != 0) {
                return v(d).lo() > 0 ? refuse("h^" + d + "(O_X(e_r)) != 0: X maps to a point of a factor", start)
                        : refuse("h^" + d + "(O_X(e_r)) = 0 is not proved", start);
            }
            if (n(d).lo() > 0) {
                return refuse("h^" + d + "(N) != 0 contradicts the normal sequence", start);
            }
            if (!n(d).isExact()) {
                return refuse("h^" + d + "(N) = 0 is not proved", start);
            }
            for (int t : d == 3 ? new int[] {1} : d == 4 ? new int[] {1, 2} : new int[0]) {
                if (!rho[t].isExact()) {
                    open.add("rho_" + t + " = rank H^" + t + "(TA|X) -> H^" + t + "(N) in " + rho[t]
                            + (backend == null ? " (no exact backend)" : ""));
                }
            }
            if (d == 2) {
                if (!n(2).isExact()) {
                    return refuse("h^2(N) = 0 is not proved", start);
                }
                if (n(1).lo() > tangent(1).hi()) {
                    return refuse("h^1(N) exceeds h^1(TA|X): the normal sequence cannot be exact", start);
                }
                h11 = n(0).minus(tangent(0)).plus(tangent(1)).minus(n(1));
                h11 = nonNegative(h11).intersect(Interval.exact(chi - 4));
            } else if (d == 3) {
                Checks.requireState(chi % 2 == 0, "odd Euler characteristic %d of a three-fold", chi);
                h21 = nonNegative(n(0).minus(tangent(0)).plus(tangent(1)).minus(rho[1]));
                Interval viaNormal = nonNegative(n(1).minus(rho[1]).plus(tangent(2)).minus(n(2)));
                Interval viaChi = h21.plus(chi / 2);
                if (viaNormal.isExact() && viaChi.isExact() && viaNormal.value() != viaChi.value()) {
                    return refuse("check failed: 2(h11 - h21) = " + 2 * (viaNormal.value() - h21.value())
                            + " but chi = " + chi, start);
                }
                h11 = viaNormal.intersect(viaChi);
                h21 = h21.intersect(h11.plus(-chi / 2));
            } else {
                if (n(3).lo() > tangent(3).hi()) {
                    return refuse("h^3(N) exceeds h^3(TA|X): the normal sequence cannot be exact", start);
                }
                Checks.requireState(chi % 6 == 0, "Euler characteristic %d of a four-fold is not divisible by 6", chi);
                long c = chi / 6 - 8;
                h31 = nonNegative(n(0).minus(tangent(0)).plus(tangent(1)).minus(rho[1]));
                h21 = nonNegative(n(1).minus(rho[1]).plus(tangent(2)).minus(rho[2]));
                h11 = nonNegative(n(2).minus(rho[2]).plus(tangent(3)).minus(n(3)));
                if (h11.isExact() && h21.isExact() && h31.isExact() && h11.value() - h21.value() + h31.value() != c) {
                    return refuse("check failed: chi = " + chi + " but 48 + 6(h11 - h21 + h31) = "
                            + (48 + 6 * (h11.value() - h21.value() + h31.value())), start);
                }
                for (int iter = 0; iter < 3; iter++) {
                    h11 = h11.intersect(h21.minus(h31).plus(c));
                    h21 = h21.intersect(h11.plus(h31).plus(-c));
                    h31 = h31.intersect(h21.minus(h11).plus(c));
                }
                h22 = nonNegative(h21.times(4).minus(h11.times(2)).minus(h31.times(2)).plus(chi - 4));
                if (h22.isExact() && h22.value() != 44 + 4 * h11.value() - 2 * h21.value() + 4 * h31.value()) {
                    return refuse("check failed: h22 = " + h22.value() + " but 44 + 4 h11 - 2 h21 + 4 h31 = "
                            + (44 + 4 * h11.value() - 2 * h21.value() + 4 * h31.value()), start);
                }
            }
            boolean exact = h11.isExact() && (h21 == null || h21.isExact()) && (h31 == null || h31.isExact())
                    && (h22 == null || h22.isExact());
            Status status = exact ? Status.EXACT : Status.BOUNDED;
            String reason = exact ? "" : String.join("; ", open);
            HodgeDiamond diamond = !exact ? null
                    : d == 2 ? HodgeDiamond.calabiYau2(h11.value())
                    : d == 3 ? HodgeDiamond.calabiYau3(h11.value(), h21.value())
                    : HodgeDiamond.calabiYau4(h11.value(), h21.value(), h31.value(), h22.value());
            return new HodgeResult(input, d, Optional.of(chi), h11, h21, h31, h22, status, method, reason, seconds(start),
                    diamond, List.of());
        }

        private HodgeResult refuse(String reason, long start) {
            return HodgeResult.refused(input, Optional.of(chi), reason, method, seconds(start));
        }
    }

    private static Interval nonNegative(Interval i) {
        return i.intersect(new Interval(0, Math.max(0, i.hi())));
    }

    private static List<Integer> key(int[] k) {
        List<Integer> out = new ArrayList<>(k.length);
        for (int v : k) {
            out.add(v);
        }
        return out;
    }
}
