package org.winnow.bench.model;

import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.SplittableRandom;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.hodge.RefinedTupleEstimator;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Reason;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.rules.RulesFile;
import org.winnow.scorer.stage.CheapInvariantFunction;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.scorer.stage.PredictionFunction;

/**
 * Measurements of the tuple anchor (model file version 4) for docs/model.md and docs/benchmarks.md.
 *
 * <p>{@code --cost MODEL --input F [--rounds R] [--every N]}: thread CPU per candidate, in one run and
 * interleaved in R rounds with fresh estimators each round (so every round pays its engine calls), of the
 * whole scoring ({@link Predictor#predict}: tuple anchor, first-page features, network, search, vote), of
 * the tuple anchor alone ({@link RefinedTupleEstimator#estimate}), of the plain first page the features
 * also read ({@link H11Estimator}) and of the h11-only anchor ({@link RefinedH11Estimator}); the scoring
 * cost with the h11-only anchor is then the whole minus the tuple and the page plus the h11-only anchor.
 *
 * <p>{@code --random N --model MODEL [--max-rows R] [--max-n N] [--seed S] [--prove MS]}: N random
 * three-folds of the project's {@link RandomConfigurations} (hyperplane columns, blocks and redundant
 * descriptions included, most outside the enumerated space), labelled by the Hodge engine with its exact
 * backend; the model's h11 against it, how each value is known, and how many values marked proved are
 * wrong (must be 0); with {@code --prove} the same after the opt-in proof step at that budget.
 *
 * <p>{@code --tuple LABELS.tsv --model MODEL [--every N] [--prove MS]}: the whole four-fold tuple against
 * exact labels ({@code config h11 h21 h31 h22 ...}), every N-th non-product row, before and after the
 * proof step on the rows whose tuple is not all proved.
 */
public final class TupleMeasurements {
    private static final ThreadMXBean CPU = ManagementFactory.getThreadMXBean();

    private TupleMeasurements() {}

    public static void main(String[] args) throws IOException {
        Path model = null;
        Path input = null;
        int rounds = 5;
        int every = 1;
        int random = 0;
        int maxRows = 7;
        int maxN = 3;
        long seed = 1;
        long proveMs = 0;
        boolean cost = false;
        Path labels = null;
        Path rulesFile = null;
        for (int i = 0; i < args.length; i++) {
            switch (args[i]) {
                case "--cost" -> {
                    cost = true;
                    model = Path.of(args[++i]);
                }
                case "--model" -> model = Path.of(args[++i]);
                case "--tuple" -> labels = Path.of(args[++i]);
                case "--input" -> input = Path.of(args[++i]);
                case "--rules" -> rulesFile = Path.of(args[++i]);
                case "--rounds" -> rounds = Integer.parseInt(args[++i]);
                case "--every" -> every = Integer.parseInt(args[++i]);
                case "--random" -> random = Integer.parseInt(args[++i]);
                case "--max-rows" -> maxRows = Integer.parseInt(args[++i]);
                case "--max-n" -> maxN = Integer.parseInt(args[++i]);
                case "--seed" -> seed = Long.parseLong(args[++i]);
                case "--prove" -> proveMs = Long.parseLong(args[++i]);
                default -> throw new IllegalArgumentException("unknown option " + args[i] + " (use --cost MODEL --input F"
                        + " [--rounds R] [--every N], or --random N --model MODEL [--max-rows R] [--max-n N] [--seed S]"
                        + " [--prove MS])");
            }
        }
        if (cost) {
            cost(FrozenModel.load(model), input, rounds, every, rulesFile == null ? null : rules(rulesFile));
        } else if (labels != null) {
            tuple(FrozenModel.load(model), labels, every, proveMs);
        } else {
            random(FrozenModel.load(model), random, maxRows, maxN, seed, proveMs);
        }
    }

    private static KeepRules rules(Path file) throws IOException {
        RulesFile.Contents c = RulesFile.read(file);
        return KeepRules.of(c.keeps(), c.minConfidence().orElse(0.85), c.noveltyGuard().orElse(0.99));
    }

    private static void cost(FrozenModel model, Path input, int rounds, int every, KeepRules rules) throws IOException {
        InvariantCalculator invariants = new InvariantCalculator();
        CheapInvariantFunction cheap = new CheapInvariantFunction();
        List<Configuration> configs = new ArrayList<>();
        List<ExactInvariants> exacts = new ArrayList<>();
        List<Long> chis = new ArrayList<>();
        int n = 0;
        for (String line : Files.readAllLines(input)) {
            if (line.isBlank() || line.startsWith("#") || line.startsWith("config\t")) {
                continue;
            }
            if (n++ % every != 0) {
                continue;
            }
            Configuration c = Configuration.parse(line.split("\t")[0]).canonical();
            configs.add(c);
            chis.add(invariants.chi(c));
            exacts.add(cheap.compute(c));
        }
        double[][] perRound = new double[6][rounds];
        long[] deferredCount = new long[rounds];
        long[] completedCount = new long[rounds];
        long sink = 0;
        for (int r = 0; r < rounds; r++) {
            Predictor p = model.newPredictor();
            RefinedTupleEstimator tuple = new RefinedTupleEstimator();
            H11Estimator page = new H11Estimator();
            RefinedH11Estimator h11 = new RefinedH11Estimator();
            PredictionFunction scan = new ModelScoring(model).newPredictions();
            long[] t = new long[6];
            for (int i = 0; i < configs.size(); i++) {
                Configuration c = configs.get(i);
                long chi = chis.get(i);
                long a = CPU.getCurrentThreadCpuTime();
                sink += p.predict(c, chi).h11();
                long b = CPU.getCurrentThreadCpuTime();
                sink += tuple.estimate(c, chi).h11().value();
                long d = CPU.getCurrentThreadCpuTime();
                sink += page.estimate(c);
                long e = CPU.getCurrentThreadCpuTime();
                sink += h11.estimate(c);
                long f = CPU.getCurrentThreadCpuTime();
                t[0] += b - a;
                t[1] += d - b;
                t[2] += e - d;
                t[3] += f - e;
                if (rules != null) {
                    ExactInvariants exact = exacts.get(i);
                    Prediction complete = p.predict(c, chi);
                    long g = CPU.getCurrentThreadCpuTime();
                    sink += rules.decide(exact, complete).code().length();
                    long h = CPU.getCurrentThreadCpuTime();
                    // What a scan does: the deferred prediction, the verdict, and the engine only where it hinges.
                    Prediction q = scan.predict(c, exact);
                    Reason reason = rules.decide(exact, q);
                    if (scan.lastDeferred()) {
                        deferredCount[r]++;
                        if (rules.hingesOnOpenValue(exact, q, reason)) {
                            completedCount[r]++;
                            reason = rules.decide(exact, scan.complete(c, exact));
                        }
                    }
                    sink += reason.code().length();
                    long k = CPU.getCurrentThreadCpuTime();
                    t[4] += h - g;
                    t[5] += k - h;
                }
            }
            for (int k = 0; k < 6; k++) {
                perRound[k][r] = t[k] / 1e3 / configs.size();
            }
        }
        double whole = median(perRound[0]);
        double tupleUs = median(perRound[1]);
        double pageUs = median(perRound[2]);
        double h11Us = median(perRound[3]);
        double h11Scoring = whole - tupleUs - pageUs + h11Us;
        System.out.printf(Locale.ROOT, "candidates: %d (every %d of %s), rounds %d, medians of the rounds, thread CPU%n",
                configs.size(), every, input, rounds);
        System.out.printf(Locale.ROOT, "scoring with the tuple anchor: %.1f us per candidate%n", whole);
        System.out.printf(Locale.ROOT, "  tuple anchor alone: %.1f us; plain first page: %.1f us; h11-only anchor: %.1f us%n",
                tupleUs, pageUs, h11Us);
        System.out.printf(Locale.ROOT, "scoring with the h11-only anchor (whole - tuple - page + h11-only): %.1f us%n",
                h11Scoring);
        System.out.printf(Locale.ROOT, "ratio: %.2fx (goal at most 1.5x)%n", whole / h11Scoring);
        if (rules != null) {
            double decide = median(perRound[4]);
            double scanUs = median(perRound[5]);
            System.out.printf(Locale.ROOT, "with the rules %s: the verdict alone %.1f us; the h11-only anchor's scoring"
                    + " and verdict %.1f us%n", rules.describe(), decide, h11Scoring + decide);
            System.out.printf(Locale.ROOT, "scan scoring, engine deferred (prediction, verdict, completion where it"
                    + " hinges): %.1f us; deferred on %d, completed %d of %d candidates (round 1)%n", scanUs,
                    deferredCount[0], completedCount[0], configs.size());
            System.out.printf(Locale.ROOT, "ratio, deferred scan to the h11-only anchor: %.2fx (goal at most 1.5x)%n",
                    scanUs / (h11Scoring + decide));
        }
        System.out.println("(checksum " + sink + ")");
    }

    private static double median(double[] v) {
        double[] s = v.clone();
        Arrays.sort(s);
        return s.length % 2 == 1 ? s[s.length / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
    }

    private static void random(FrozenModel model, int count, int maxRows, int maxN, long seed, long proveMs) {
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(seed));
        HodgeEngine exact = HodgeEngine.standard();
        CheapInvariantFunction cheap = new CheapInvariantFunction();
        PredictionFunction plain = new ModelScoring(model).newPredictions();
        PredictionFunction proving = proveMs > 0
                ? new ModelScoring(model).withProofBudget(Duration.ofMillis(proveMs), System::nanoTime).newPredictions() : null;
        int drawn = 0;
        int labelled = 0;
        int[] right = new int[2];
        int[][] bases = new int[2][3];
        int[] wrongProved = new int[2];
        int[] outside = new int[2];
        int[] outOfTime = new int[1];
        while (labelled < count && drawn < 50 * count) {
            Configuration c = gen.calabiYau(3, maxRows, maxN);
            drawn++;
            HodgeResult truth = exact.compute(c);
            if (!truth.isExact()) {
                continue;
            }
            labelled++;
            ExactInvariants ex = cheap.compute(c);
            Prediction p = plain.predict(c, ex);
            tally(p.h11Value(), truth.h11(), 0, right, bases, wrongProved, outside);
            if (proving != null) {
                Prediction q = p.h11Value().isProved() ? p : proving.prove(c, ex, p, Duration.ofMillis(proveMs));
                outOfTime[0] += q.proof() == org.winnow.pipeline.Proof.OUT_OF_TIME ? 1 : 0;
                tally(q.h11Value(), truth.h11(), 1, right, bases, wrongProved, outside);
            }
        }
        System.out.printf(Locale.ROOT, "random three-folds: %d drawn, %d with an exact label (max rows %d, max n %d, seed %d)%n",
                drawn, labelled, maxRows, maxN, seed);
        for (int k = 0; k < (proving == null ? 1 : 2); k++) {
            System.out.printf(Locale.ROOT, "%s: h11 right %d (%.4f); proved %d, bounded %d, estimated %d; wrong values marked "
                    + "proved %d; labels outside a proved interval %d%n", k == 0 ? "model" : "after --prove " + proveMs + " ms",
                    right[k], right[k] / (double) labelled, bases[k][0], bases[k][1], bases[k][2], wrongProved[k], outside[k]);
        }
        if (proving != null) {
            System.out.println("proof steps out of time: " + outOfTime[0]);
        }
    }

    private static void tuple(FrozenModel model, Path labels, int every, long proveMs) throws IOException {
        CheapInvariantFunction cheap = new CheapInvariantFunction();
        ModelScoring scoring = new ModelScoring(model);
        PredictionFunction plain = scoring.newPredictions();
        PredictionFunction proving = proveMs > 0
                ? scoring.withProofBudget(Duration.ofMillis(proveMs), System::nanoTime).newPredictions() : null;
        int n = 0;
        int rows = 0;
        int[] allRight = new int[2];
        int unproved = 0;
        int settled = 0;
        int outOfTime = 0;
        int[] wrongProved = new int[2];
        long proofNanos = 0;
        int deferredRows = 0;
        int deferredRight = 0;
        int deferredWrong = 0;
        for (String line : Files.readAllLines(labels)) {
            if (line.isBlank() || line.startsWith("#") || line.startsWith("config\t")) {
                continue;
            }
            if (n++ % every != 0) {
                continue;
            }
            String[] f = line.split("\t");
            Configuration c = Configuration.parse(f[0]);
            ExactInvariants ex = cheap.compute(c);
            if (ex.blocks() > 1 || ex.dim() != model.dimension()) {
                continue; // products: the identities the labels' tuple rests on do not hold
            }
            long[] truth = {Long.parseLong(f[1]), Long.parseLong(f[2]), Long.parseLong(f[3]), Long.parseLong(f[4])};
            rows++;
            Prediction p = plain.predict(c, ex);
            if (plain.lastDeferred()) {
                // As a scan shows it when no rule needs more: h21, h31, h22 within the first page's intervals.
                deferredRows++;
                deferredRight += tupleRight(p, truth) ? 1 : 0;
                deferredWrong += wrongProofs(p, truth);
                p = plain.complete(c, ex);
            } else {
                deferredRight += tupleRight(p, truth) ? 1 : 0;
                deferredWrong += wrongProofs(p, truth);
            }
            boolean right = tupleRight(p, truth);
            allRight[0] += right ? 1 : 0;
            wrongProved[0] += wrongProofs(p, truth);
            Prediction q = p;
            if (proving != null && !allProved(p)) {
                unproved++;
                long t0 = System.nanoTime();
                q = proving.prove(c, ex, p, Duration.ofMillis(proveMs));
                proofNanos += System.nanoTime() - t0;
                settled += allProved(q) ? 1 : 0;
                outOfTime += q.proof() == org.winnow.pipeline.Proof.OUT_OF_TIME ? 1 : 0;
            }
            allRight[1] += tupleRight(q, truth) ? 1 : 0;
            wrongProved[1] += wrongProofs(q, truth);
        }
        System.out.printf(Locale.ROOT, "labelled four-folds: %d (every %d of %s, non-products)%n", rows, every, labels);
        System.out.printf(Locale.ROOT, "model: tuple right %.4f (%d of %d), wrong values marked proved %d%n",
                allRight[0] / (double) rows, allRight[0], rows, wrongProved[0]);
        System.out.printf(Locale.ROOT, "as a scan shows it with the engine deferred and no rule asking for more: tuple right"
                + " %.4f (engine deferred on %d), wrong values marked proved %d%n", deferredRight / (double) rows,
                deferredRows, deferredWrong);
        if (proving != null) {
            System.out.printf(Locale.ROOT, "after --prove %d ms on the %d not all proved: %d all proved, %d out of time, "
                    + "%.0f ms wall each on average; tuple right %.4f, wrong values marked proved %d%n", proveMs, unproved,
                    settled, outOfTime, unproved == 0 ? 0 : proofNanos / 1e6 / unproved, allRight[1] / (double) rows,
                    wrongProved[1]);
        }
    }

    private static boolean allProved(Prediction p) {
        return p.h11Value().isProved() && p.h21Value() != null && p.h21Value().isProved()
                && (p.h31Value() == null || p.h31Value().isProved()) && (p.h22Value() == null || p.h22Value().isProved());
    }

    private static boolean tupleRight(Prediction p, long[] truth) {
        PredictedValue[] v = {p.h11Value(), p.h21Value(), p.h31Value(), p.h22Value()};
        for (int i = 0; i < 4; i++) {
            if (v[i] == null || v[i].value() != truth[i]) {
                return false;
            }
        }
        return true;
    }

    private static int wrongProofs(Prediction p, long[] truth) {
        PredictedValue[] v = {p.h11Value(), p.h21Value(), p.h31Value(), p.h22Value()};
        int wrong = 0;
        for (int i = 0; i < 4; i++) {
            wrong += v[i] != null && v[i].isProved() && v[i].value() != truth[i] ? 1 : 0;
        }
        return wrong;
    }

    private static void tally(PredictedValue v, Interval truth, int k, int[] right, int[][] bases, int[] wrongProved,
            int[] outside) {
        long t = truth.value();
        right[k] += v.value() == t ? 1 : 0;
        bases[k][v.basis().ordinal()]++;
        switch (v.basis()) {
            case PROVED -> wrongProved[k] += v.value() == t ? 0 : 1;
            case BOUNDED -> outside[k] += v.lo() <= t && t <= v.hi() ? 0 : 1;
            case ESTIMATED -> { }
        }
    }
}
