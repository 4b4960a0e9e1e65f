package org.winnow.bench;

import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;
import java.util.function.ToLongFunction;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.invariants.CheapInvariants;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;

/**
 * The same workload as {@link CheapInvariantsBenchmark}, timed by the thread's CPU time instead of
 * the wall clock. On a shared, overloaded machine the wall-clock rate mostly measures how much of
 * a core the scheduler granted; the CPU-time rate is the more repeatable figure (it still suffers
 * from caches and hyper-threads shared with other jobs).
 *
 * <p>Run: {@code java -cp bench/target/benchmarks.jar org.winnow.bench.CheapInvariantsCpuRate [candidates.tsv]}.
 * With a candidate file (one configuration a line, first tab-separated field, as written by
 * {@link GenerateCandidates}) it also times, per candidate, what the scorer pays for it: the full
 * {@code InvariantCalculator.compute} (chi, blocks, degree, and c2.J or {@code int c2^2}) and the
 * first-page h11 estimate, each over the whole file per round.
 */
public final class CheapInvariantsCpuRate {
    private CheapInvariantsCpuRate() {}

    public static void main(String[] args) throws IOException {
        ThreadMXBean threads = ManagementFactory.getThreadMXBean();
        InvariantCalculator calculator = new InvariantCalculator();
        long[] c2J = new long[Configuration.MAX_ROWS];
        for (String sample : new String[] {"worked", "m5", "m12"}) {
            Configuration[] configs = sample(sample);
            int ops = "worked".equals(sample) ? 3_000_000 : "m5".equals(sample) ? 1_000_000 : 200_000;
            long sink = 0;
            double best = 0;
            for (int round = 0; round < 5; round++) {
                long start = threads.getCurrentThreadCpuTime();
                for (int i = 0; i < ops; i++) {
                    sink += calculator.threefold(configs[i % configs.length], c2J);
                }
                double seconds = (threads.getCurrentThreadCpuTime() - start) / 1e9;
                // Rounds 0-1 are warm-up for the JIT.
                if (round >= 2) {
                    best = Math.max(best, ops / seconds);
                }
            }
            System.out.printf("%-6s best of 3 rounds: %,.0f ops/s of thread CPU time (checksum %d)%n", sample, best, sink);
        }
        if (args.length > 0) {
            Configuration[] candidates = Files.readAllLines(Path.of(args[0])).stream()
                    .map(line -> Configuration.parse(line.split("\t", 2)[0]))
                    .toArray(Configuration[]::new);
            timeFile(threads, "compute", candidates, c -> {
                CheapInvariants inv = calculator.compute(c);
                return inv.chi() + inv.degree() + inv.c2sq().orElse(0);
            });
            H11Estimator estimator = new H11Estimator();
            timeFile(threads, "h11-estimate", candidates, c -> estimator.estimate(c) + (estimator.settled() ? 1 : 0));
        }
    }

    /** Best of rounds 2-4 (0-1 warm up the JIT) of one pass over the candidates, in candidates per CPU second. */
    private static void timeFile(ThreadMXBean threads, String what, Configuration[] candidates, ToLongFunction<Configuration> op) {
        long sink = 0;
        double best = 0;
        for (int round = 0; round < 5; round++) {
            long start = threads.getCurrentThreadCpuTime();
            for (Configuration c : candidates) {
                sink += op.applyAsLong(c);
            }
            double seconds = (threads.getCurrentThreadCpuTime() - start) / 1e9;
            if (round >= 2) {
                best = Math.max(best, candidates.length / seconds);
            }
        }
        System.out.printf("%-12s %,d candidates, best of 3 rounds: %,.0f candidates/s of thread CPU time (checksum %d)%n",
                what, candidates.length, best, sink);
    }

    private static Configuration[] sample(String name) {
        if ("worked".equals(name)) {
            Configuration[] configs = new Configuration[CheapInvariantsBenchmark.WORKED.length];
            for (int i = 0; i < configs.length; i++) {
                configs[i] = Configuration.parse(CheapInvariantsBenchmark.WORKED[i]);
            }
            return configs;
        }
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(CheapInvariantsBenchmark.SEED));
        Configuration[] configs = new Configuration[CheapInvariantsBenchmark.RANDOM_SAMPLE];
        for (int i = 0; i < configs.length; i++) {
            configs[i] = "m5".equals(name) ? gen.calabiYau(3, 5, 4) : gen.calabiYau(3, 12, 2);
        }
        return configs;
    }
}
