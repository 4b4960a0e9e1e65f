package org.winnow.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.SplittableRandom;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;

/**
 * The same workload as {@link CheapInvariantsBenchmark}, timed by the thread's CPU time instead of
 * the wall clock. On a shared, overloaded machine the wall-clock rate mostly measures how much of
 * a core the scheduler granted; the CPU-time rate is the more repeatable figure (it still suffers
 * from caches and hyper-threads shared with other jobs).
 *
 * <p>Run: {@code java -cp bench/target/benchmarks.jar org.winnow.bench.CheapInvariantsCpuRate}.
 */
public final class CheapInvariantsCpuRate {
    private CheapInvariantsCpuRate() {}

    public static void main(String[] args) {
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
