package org.winnow.bench;

import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.IntersectionNumbers;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;

/**
 * The scorer's cheap-invariant hot path: chi, the triple intersections and c2.J of one Calabi-Yau
 * three-fold per operation, cycling over a fixed sample.
 *
 * <p>Run: {@code java -jar bench/target/benchmarks.jar CheapInvariantsBenchmark -f 1 -wi 3 -i 5 -prof gc}.
 * Samples: {@code worked} = ten textbook three-folds; {@code m5} = 500 random Calabi-Yau three-folds
 * with {@code m <= 5, n_r <= 4}; {@code m12} = 500 with {@code m <= 12, n_r <= 2} (seed 2026).
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class CheapInvariantsBenchmark {
    /** Seed and size of the random samples, shared with {@link CheapInvariantsCpuRate}. */
    static final long SEED = 2026L;
    static final int RANDOM_SAMPLE = 500;
    /** The ten worked three-folds of the textbook table (quintic family, products of P^n). */
    static final String[] WORKED = {
        "4:5", "5:3,3", "5:2,4", "6:2,2,3", "7:2,2,2,2", "2:3/2:3", "1:2/1:2/1:2/1:2", "1:2/3:4",
        "3:3,0,1/3:0,3,1", "2:3,0/2:0,3/1:1,1",
    };

    @Param({"worked", "m5", "m12"})
    public String sample;

    private Configuration[] configs;
    private final InvariantCalculator calculator = new InvariantCalculator();
    private final long[] c2J = new long[Configuration.MAX_ROWS];
    private int next;

    @Setup
    public void setUp() {
        if ("worked".equals(sample)) {
            configs = new Configuration[WORKED.length];
            for (int i = 0; i < WORKED.length; i++) {
                configs[i] = Configuration.parse(WORKED[i]);
            }
            return;
        }
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(SEED));
        configs = new Configuration[RANDOM_SAMPLE];
        for (int i = 0; i < configs.length; i++) {
            configs[i] = "m5".equals(sample) ? gen.calabiYau(3, 5, 4) : gen.calabiYau(3, 12, 2);
        }
    }

    /** chi + c2.J + the nonzero d_rst (summed so nothing is dead code). */
    @Benchmark
    public long chiTriplesC2J() {
        Configuration c = configs[next];
        next = next + 1 == configs.length ? 0 : next + 1;
        long chi = calculator.threefold(c, c2J);
        IntersectionNumbers in = calculator.intersections();
        long acc = chi;
        for (int i = 0; i < in.size(); i++) {
            acc += in.value(i);
        }
        for (int r = 0; r < c.rows(); r++) {
            acc += c2J[r];
        }
        return acc;
    }
}
