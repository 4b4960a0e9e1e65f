package org.winnow.bench;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.TreeMap;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.hodge.KnownValue;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.hodge.RefinedTupleEstimator;
import org.winnow.geometry.hodge.TupleEstimate;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;

/**
 * How the Hodge tuple of a candidate file is known: per value (h11, h21, h31, h22) the counts of
 * proved, bounded and estimated, the methods, and, against exact labels ({@code winnow hodge --json}
 * lines, matched by their {@code input}), how many proved values are wrong (must be 0), how many
 * bounded intervals miss the label (must be 0) and how often each value, and the whole tuple, equals
 * the label. With {@code --time R} it then times, per candidate and by thread CPU time, the tuple
 * estimate (chi given, and chi computed) against the h11-only anchor ({@link RefinedH11Estimator}),
 * interleaved in R rounds with fresh estimators each round (so every round pays its engine calls).
 *
 * <p>With {@code --random N} it draws N matrices from the project's {@link RandomConfigurations}
 * ({@code --dim}, {@code --max-rows}, {@code --max-n}, {@code --seed}; they include hyperplane columns,
 * blocks and redundant descriptions the enumeration drops) and labels them with the full engine here.
 *
 * <p>{@code java -cp bench/target/benchmarks.jar org.winnow.bench.TupleSurvey --input F [--labels L.jsonl] [--time 5]}
 * or {@code ... TupleSurvey --random 2000 --dim 3 --max-rows 6 --max-n 3 --seed 1}
 */
public final class TupleSurvey {
    private static final String[] NAMES = {"h11", "h21", "h31", "h22"};

    private TupleSurvey() {}

    public static void main(String[] args) throws IOException {
        Path input = null;
        Path labels = null;
        int rounds = 0;
        int random = 0;
        int dim = 3;
        int maxRows = 6;
        int maxN = 3;
        long seed = 1;
        boolean firstPageOnly = false;
        for (int i = 0; i < args.length; i++) {
            switch (args[i]) {
                case "--input" -> input = Path.of(args[++i]);
                case "--labels" -> labels = Path.of(args[++i]);
                case "--time" -> rounds = Integer.parseInt(args[++i]);
                case "--random" -> random = Integer.parseInt(args[++i]);
                case "--dim" -> dim = Integer.parseInt(args[++i]);
                case "--max-rows" -> maxRows = Integer.parseInt(args[++i]);
                case "--max-n" -> maxN = Integer.parseInt(args[++i]);
                case "--seed" -> seed = Long.parseLong(args[++i]);
                case "--first-page-only" -> firstPageOnly = true;
                default -> throw new IllegalArgumentException("unknown option " + args[i]
                        + " (use --input F [--labels L.jsonl] [--time ROUNDS], or --random N [--dim D] [--max-rows R]"
                        + " [--max-n N] [--seed S])");
            }
        }
        if ((input == null) == (random == 0)) {
            throw new IllegalArgumentException("give exactly one of --input and --random");
        }
        List<Configuration> configs = new ArrayList<>();
        Map<String, long[]> truth;
        if (input != null) {
            for (String line : Files.readAllLines(input)) {
                String text = line.split("\t", 2)[0].trim();
                if (!text.isEmpty() && !text.startsWith("#")) {
                    configs.add(Configuration.parse(text));
                }
            }
            truth = labels == null ? Map.of() : readLabels(labels);
        } else {
            // Random matrices of the project's generator, labelled here by the full engine (exact backend).
            RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(seed));
            HodgeEngine full = HodgeEngine.standard();
            truth = new HashMap<>();
            while (configs.size() < random) {
                Configuration c = gen.calabiYau(dim, maxRows, maxN);
                configs.add(c);
                HodgeResult r = full.compute(c);
                if (r.isExact()) {
                    truth.put(c.toText(), new long[] {r.h11().value(), r.h21().value(),
                            r.h31() == null ? -1 : r.h31().value(), r.h22() == null ? -1 : r.h22().value()});
                }
            }
            System.out.printf("random %d-folds: %d drawn (seed %d, up to %d rows, n up to %d), %d exact by the full engine%n",
                    dim, configs.size(), seed, maxRows, maxN, truth.size());
        }
        survey(configs, truth, false);
        if (firstPageOnly) {
            survey(configs, truth, true);
        }
        if (rounds > 0) {
            time(configs, rounds);
        }
    }

    /** The exact results of a {@code winnow hodge --json} file: {h11, h21, h31, h22} by configuration. */
    private static Map<String, long[]> readLabels(Path labels) throws IOException {
        ObjectMapper json = new ObjectMapper();
        Map<String, long[]> out = new HashMap<>();
        for (String line : Files.readAllLines(labels)) {
            if (!line.isBlank()) {
                JsonNode n = json.readTree(line);
                if ("exact".equals(n.get("status").asText())) {
                    long[] v = new long[4];
                    for (int i = 0; i < 4; i++) {
                        JsonNode x = n.get(NAMES[i]);
                        v[i] = x == null || x.isNull() ? -1 : x.asLong();
                    }
                    out.put(Configuration.parse(n.get("input").asText()).toText(), v);
                }
            }
        }
        return out;
    }

    private static void survey(List<Configuration> configs, Map<String, long[]> truth, boolean pagesOnly) {
        System.out.println(pagesOnly ? "== first page only (estimateFirstPage)" : "== first page, then the cheap engine (estimate)");
        RefinedTupleEstimator tuple = new RefinedTupleEstimator();
        InvariantCalculator invariants = new InvariantCalculator();
        long[][] basis = new long[4][3];
        long[] labelled = new long[4];
        long[] right = new long[4];
        long[] provedWrong = new long[4];
        long[] boundsMissed = new long[4];
        long[] provedChecked = new long[4];
        long tuples = 0;
        long tuplesRight = 0;
        long products = 0;
        long allProved = 0;
        Map<String, Long> methods = new TreeMap<>();
        List<String> failures = new ArrayList<>();
        for (Configuration c : configs) {
            long chi = invariants.chi(c);
            TupleEstimate e = pagesOnly ? tuple.estimateFirstPage(c, chi) : tuple.estimate(c, chi);
            products += e.product() ? 1 : 0;
            allProved += e.allProved() ? 1 : 0;
            // Reasons name the matrix; group by their kind.
            String method = e.method().replaceAll("\\((engine refused|refused|bounded): .*\\)", "($1)");
            methods.merge(method, 1L, Long::sum);
            KnownValue[] v = {e.h11(), e.h21(), e.h31(), e.h22()};
            long[] label = truth.get(c.toText());
            boolean exact = label != null;
            boolean tupleRight = exact;
            for (int i = 0; i < 4; i++) {
                if (v[i] == null) {
                    continue;
                }
                basis[i][v[i].basis().ordinal()]++;
                if (!exact) {
                    continue;
                }
                long t = label[i];
                labelled[i]++;
                boolean ok = v[i].value() == t;
                right[i] += ok ? 1 : 0;
                tupleRight &= ok;
                if (v[i].basis() == Basis.PROVED) {
                    provedChecked[i]++;
                    if (!ok) {
                        provedWrong[i]++;
                        failures.add(c.toText() + " " + NAMES[i] + " proved " + v[i] + " but exact " + t);
                    }
                } else if (v[i].basis() == Basis.BOUNDED && (t < v[i].lo() || t > v[i].hi())) {
                    boundsMissed[i]++;
                    failures.add(c.toText() + " " + NAMES[i] + " bounded " + v[i] + " misses exact " + t);
                }
            }
            if (exact) {
                tuples++;
                tuplesRight += tupleRight ? 1 : 0;
            }
        }
        System.out.printf("candidates %,d (products %,d), every value proved on %,d (%.4f)%n", configs.size(), products,
                allProved, allProved / (double) configs.size());
        for (int i = 0; i < 4; i++) {
            long n = basis[i][0] + basis[i][1] + basis[i][2];
            if (n == 0) {
                continue;
            }
            System.out.printf("%-4s proved %,9d (%.4f)  bounded %,7d (%.4f)  estimated %,7d (%.4f)", NAMES[i],
                    basis[i][0], basis[i][0] / (double) n, basis[i][1], basis[i][1] / (double) n, basis[i][2],
                    basis[i][2] / (double) n);
            if (labelled[i] > 0) {
                System.out.printf("  | labelled %,d: value right %.4f, proved checked %,d, proved wrong %d, bounds missed %d",
                        labelled[i], right[i] / (double) labelled[i], provedChecked[i], provedWrong[i], boundsMissed[i]);
            }
            System.out.println();
        }
        if (tuples > 0) {
            System.out.printf("tuple (every value) right on %,d of %,d exactly labelled (%.4f)%n", tuplesRight, tuples,
                    tuplesRight / (double) tuples);
        }
        methods.forEach((m, n) -> System.out.printf("method %-48s %,d%n", m, n));
        failures.stream().limit(20).forEach(f -> System.out.println("FAILURE " + f));
    }

    private static void time(List<Configuration> configs, int rounds) {
        ThreadMXBean threads = ManagementFactory.getThreadMXBean();
        InvariantCalculator invariants = new InvariantCalculator();
        long[] chi = new long[configs.size()];
        for (int i = 0; i < chi.length; i++) {
            chi[i] = invariants.chi(configs.get(i));
        }
        double[][] us = new double[4][rounds];
        long sink = 0;
        for (int r = 0; r < rounds; r++) {
            RefinedH11Estimator h11 = new RefinedH11Estimator();
            long start = threads.getCurrentThreadCpuTime();
            for (Configuration c : configs) {
                sink += h11.estimate(c);
            }
            us[0][r] = (threads.getCurrentThreadCpuTime() - start) / 1e3 / configs.size();
            RefinedTupleEstimator tuple = new RefinedTupleEstimator();
            start = threads.getCurrentThreadCpuTime();
            for (int i = 0; i < chi.length; i++) {
                sink += tuple.estimate(configs.get(i), chi[i]).h11().value();
            }
            us[1][r] = (threads.getCurrentThreadCpuTime() - start) / 1e3 / configs.size();
            RefinedTupleEstimator withChi = new RefinedTupleEstimator();
            start = threads.getCurrentThreadCpuTime();
            for (Configuration c : configs) {
                sink += withChi.estimate(c).h11().value();
            }
            us[2][r] = (threads.getCurrentThreadCpuTime() - start) / 1e3 / configs.size();
            RefinedTupleEstimator pagesOnly = new RefinedTupleEstimator();
            start = threads.getCurrentThreadCpuTime();
            for (int i = 0; i < chi.length; i++) {
                sink += pagesOnly.estimateFirstPage(configs.get(i), chi[i]).h11().value();
            }
            us[3][r] = (threads.getCurrentThreadCpuTime() - start) / 1e3 / configs.size();
            System.out.printf("round %d: h11-only anchor %.2f us, tuple (chi given) %.2f us, tuple (chi computed) %.2f us,"
                    + " tuple first page only (chi given) %.2f us per candidate (thread CPU)%n", r, us[0][r], us[1][r],
                    us[2][r], us[3][r]);
        }
        double[] med = new double[4];
        for (int k = 0; k < 4; k++) {
            double[] s = us[k].clone();
            java.util.Arrays.sort(s);
            med[k] = s[rounds / 2];
        }
        System.out.printf("median over %d rounds: h11-only %.2f us, tuple %.2f us (%.2fx), tuple with chi %.2f us (%.2fx),"
                + " first page only %.2f us (%.2fx); checksum %d%n", rounds, med[0], med[1], med[1] / med[0], med[2],
                med[2] / med[0], med[3], med[3] / med[0], sink);
    }
}
