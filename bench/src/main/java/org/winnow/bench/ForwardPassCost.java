package org.winnow.bench;

import java.io.BufferedReader;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.concurrent.Callable;
import java.util.function.ToIntFunction;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.Calibration;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.index.NeighbourIndex;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.reference.ReferenceSet;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * Where the scorer's arithmetic goes, on one thread over pre-parsed candidates: the multiply-adds of
 * the forward pass (counted from the architecture and each candidate's shape) and of the full
 * neighbour scan, and the measured rates of the first-page h11 estimate alone ({@link H11Estimator},
 * one of the features) and of the anchor the model uses ({@link RefinedH11Estimator}: that estimate
 * where its pages are settled, the Hodge engine elsewhere), of the forward pass alone (features, estimate included, and network) and of
 * forward pass plus vote; and, for the end-to-end comparison, the rate of the exact cheap invariants
 * ({@link InvariantCalculator#compute}) that {@code winnow scan} computes for every candidate and the
 * scorer-alone runs read from the file.
 *
 * <p>Rates are per second of this thread's CPU time, so that they hold on a loaded machine (the
 * FLOP rate they are set against is measured by JMH on an otherwise idle core, or as near to it as
 * the machine allows).
 *
 * <p>The forward pass alone is timed through the ordinary {@link Predictor} of a copy of the model
 * whose reference holds a single point, so the search costs one distance and what is timed is the
 * model's own code path, not a re-implementation.
 */
@Command(name = "forward-pass-cost", mixinStandardHelpOptions = true)
public final class ForwardPassCost implements Callable<Integer> {
    private static final ThreadMXBean THREAD = ManagementFactory.getThreadMXBean();

    @Option(names = "--model", required = true, description = "The frozen model (.wnm).")
    Path model;

    @Option(names = "--candidates", required = true, description = "The candidate file.")
    Path candidates;

    @Option(names = "--limit", defaultValue = "200000", description = "Candidates read (default ${DEFAULT-VALUE}).")
    int limit;

    @Option(names = "--passes", defaultValue = "5", description = "Timed passes; the best counts (default ${DEFAULT-VALUE}).")
    int passes;

    public static void main(String[] args) {
        System.exit(new CommandLine(new ForwardPassCost()).execute(args));
    }

    /**
     * Multiply-adds of one forward pass: encoders {@code H(5m + 4K)}; per round two aggregations
     * {@code 2 E H} and two updates {@code 2 H^2 (K + m)}; readout {@code U P + L U} with {@code L} the
     * learned coordinates (the anchor coordinate is the estimate, not a product). ReLU, pooling,
     * normalisation, the bias adds and the estimate's integer search are not counted.
     */
    static long forwardMacs(Architecture a, Configuration c) {
        long h = a.hidden();
        long m = c.rows();
        long k = c.cols();
        long e = 0;
        for (int r = 0; r < m; r++) {
            for (int j = 0; j < k; j++) {
                e += c.q(r, j) != 0 ? 1 : 0;
            }
        }
        long enc = h * (Architecture.ROW_FEATURES * m + Architecture.COL_FEATURES * k);
        long round = 2 * e * h + 2 * h * h * (k + m);
        long readout = (long) a.readout() * a.pooledWidth() + (long) a.learnedDim() * a.readout();
        return enc + a.rounds() * round + readout;
    }

    @Override
    public Integer call() throws IOException {
        FrozenModel full = FrozenModel.load(model);
        Configuration[] configs = new Configuration[limit];
        long[] chis = new long[limit];
        int n = 0;
        try (BufferedReader r = Files.newBufferedReader(candidates, StandardCharsets.UTF_8)) {
            String line;
            while (n < limit && (line = r.readLine()) != null) {
                CandidateLine c = CandidateLine.parse(line, n + 1);
                configs[n] = c.config();
                chis[n] = c.chi();
                n++;
            }
        }
        long macs = 0;
        for (int i = 0; i < n; i++) {
            macs += forwardMacs(full.architecture(), configs[i]);
        }
        double forwardMacs = (double) macs / n;
        double searchMacs = (double) full.reference().size() * full.architecture().dim();
        double estimateRate = rate(configs, n, new H11Estimator()::estimate);
        // The anchor the model uses: the first page where settled, else the Hodge engine (no exact backend).
        double anchorRate = rate(configs, n, new RefinedH11Estimator()::estimate);
        InvariantCalculator calculator = new InvariantCalculator();
        double invariantsRate = rate(configs, n, c -> calculator.compute(c).hashCode());
        double forwardRate = bestRate(singlePoint(full).newPredictor(), configs, chis, n);
        double fullRate = bestRate(full.newPredictor(), configs, chis, n);
        double searchRate = searchRate(full, configs, chis, n);
        System.out.printf("candidates=%d forward_macs=%.1f search_macs=%.1f estimate_rate=%.1f forward_rate=%.1f"
                + " full_rate=%.1f invariants_rate=%.1f anchor_rate=%.1f search_rate=%.1f%n", n, forwardMacs, searchMacs,
                estimateRate, forwardRate, fullRate, invariantsRate, anchorRate, searchRate);
        return 0;
    }

    private double bestRate(Predictor p, Configuration[] configs, long[] chis, int n) {
        long sink = 0;
        double best = 0;
        for (int pass = 0; pass <= passes; pass++) { // pass 0 warms the JIT up and is not counted
            long start = THREAD.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += p.score(configs[i], chis[i]);
            }
            double rate = n / ((THREAD.getCurrentThreadCpuTime() - start) / 1e9);
            if (pass > 0) {
                best = Math.max(best, rate);
            }
        }
        if (sink == Long.MIN_VALUE) {
            System.out.println("unreachable: keeps the predictions live");
        }
        return best;
    }

    /**
     * Searches per CPU-second of the model's neighbour index alone, on the candidates' embeddings computed
     * beforehand, with the k the predictor asks for; best of the timed passes.
     */
    private double searchRate(FrozenModel m, Configuration[] configs, long[] chis, int n) {
        double[][] queries = new double[n][];
        for (int i = 0; i < n; i++) {
            queries[i] = m.embed(configs[i], chis[i]);
        }
        int k = Math.max(m.calibration().k(), m.calibration().noveltyK());
        int[] index = new int[k];
        double[] distance = new double[k];
        NeighbourIndex search = m.index();
        long sink = 0;
        double best = 0;
        for (int pass = 0; pass <= passes; pass++) { // pass 0 warms the JIT up and is not counted
            long start = THREAD.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += search.search(queries[i], k, -1, index, distance) + index[0];
            }
            double rate = n / ((THREAD.getCurrentThreadCpuTime() - start) / 1e9);
            if (pass > 0) {
                best = Math.max(best, rate);
            }
        }
        if (sink == Long.MIN_VALUE) {
            System.out.println("unreachable: keeps the results live");
        }
        return best;
    }

    /** Calls per CPU-second of {@code f} alone over the candidates, best of the timed passes. */
    private double rate(Configuration[] configs, int n, ToIntFunction<Configuration> f) {
        long sink = 0;
        double best = 0;
        for (int pass = 0; pass <= passes; pass++) { // pass 0 warms the JIT up and is not counted
            long start = THREAD.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += f.applyAsInt(configs[i]);
            }
            double rate = n / ((THREAD.getCurrentThreadCpuTime() - start) / 1e9);
            if (pass > 0) {
                best = Math.max(best, rate);
            }
        }
        if (sink == Long.MIN_VALUE) {
            System.out.println("unreachable: keeps the results live");
        }
        return best;
    }

    /** The same network with a one-point reference: its search is one distance. */
    static FrozenModel singlePoint(FrozenModel m) {
        ReferenceSet r = m.reference();
        int dim = r.dim();
        ReferenceSet one = new ReferenceSet(new String[] {r.configs()[0]}, new long[] {r.chi()[0]},
                new int[][] {r.hodge()[0]}, Arrays.copyOf(r.embeddings(), dim), dim);
        Calibration cal = new Calibration(1, 1, 0.0, 0.0, new double[0], new int[] {r.h11(0)},
                new double[][] {new double[Calibration.QUANTILES.length]});
        return new FrozenModel(m.architecture(), m.parameters(), m.normalisation(), one, cal, m.metadata());
    }
}
