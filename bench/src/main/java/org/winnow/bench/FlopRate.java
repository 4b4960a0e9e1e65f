package org.winnow.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.concurrent.Callable;
import java.util.function.DoubleSupplier;
import org.openjdk.jmh.results.RunResult;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.RunnerException;
import org.openjdk.jmh.runner.options.Options;
import org.openjdk.jmh.runner.options.OptionsBuilder;
import org.openjdk.jmh.runner.options.TimeValue;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * Runs {@link FmaKernel} on one thread through JMH and prints the FLOP rates it implies,
 * {@code vector_flops=... scalar_flops=...} (FLOP/s of wall clock, two per FMA), then the same
 * kernels timed by this thread's CPU time, {@code vector_cpu_flops=... scalar_cpu_flops=...}.
 */
@Command(name = "flop-rate", mixinStandardHelpOptions = true)
public final class FlopRate implements Callable<Integer> {
    @Option(names = "--iterations", defaultValue = "5", description = "Measured iterations of 1 s (default ${DEFAULT-VALUE}).")
    int iterations;

    private double sink;

    public static void main(String[] args) {
        System.exit(new CommandLine(new FlopRate()).execute(args));
    }

    @Override
    public Integer call() throws RunnerException {
        double vector = opsPerSecond("vector") * FmaKernel.vectorFmas() * 2;
        double scalar = opsPerSecond("scalar") * FmaKernel.scalarFmas() * 2;
        FmaKernel k = new FmaKernel();
        k.setUp();
        double vectorCpu = cpuRate(() -> k.vector()[0]) * FmaKernel.vectorFmas() * 2;
        double scalarCpu = cpuRate(k::scalar) * FmaKernel.scalarFmas() * 2;
        System.out.printf("vector_flops=%.4e scalar_flops=%.4e vector_cpu_flops=%.4e scalar_cpu_flops=%.4e%n",
                vector, scalar, vectorCpu, scalarCpu);
        return 0;
    }

    /**
     * Calls per second of this thread's CPU time, best of {@link #iterations} rounds of about 0.5 s
     * after one warm-up round: on a machine shared with other jobs, wall-clock JMH scores fall with
     * the load, CPU time much less; the forward pass is timed the same way.
     */
    private double cpuRate(DoubleSupplier kernel) {
        ThreadMXBean thread = ManagementFactory.getThreadMXBean();
        double best = 0;
        for (int round = 0; round <= iterations; round++) {
            long calls = 0;
            long start = thread.getCurrentThreadCpuTime();
            long used;
            do {
                for (int i = 0; i < 1000; i++) {
                    sink += kernel.getAsDouble(); // used, so the JIT cannot drop the kernel
                }
                calls += 1000;
                used = thread.getCurrentThreadCpuTime() - start;
            } while (used < 500_000_000L);
            if (round > 0) {
                best = Math.max(best, calls / (used / 1e9));
            }
        }
        if (Double.isNaN(sink)) {
            System.out.println("the kernel diverged");
        }
        return best;
    }

    private double opsPerSecond(String method) throws RunnerException {
        Options opts = new OptionsBuilder()
                .include(FmaKernel.class.getName() + "\\." + method + "$")
                .forks(1)
                .warmupIterations(2)
                .warmupTime(TimeValue.seconds(1))
                .measurementIterations(iterations)
                .measurementTime(TimeValue.seconds(1))
                .threads(1)
                .shouldFailOnError(true)
                .build();
        RunResult r = new Runner(opts).runSingle();
        return r.getPrimaryResult().getScore();
    }
}
