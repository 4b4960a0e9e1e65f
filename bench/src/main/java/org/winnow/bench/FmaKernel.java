package org.winnow.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * The machine's double-precision fused multiply-add rate as Java code reaches it, in two forms:
 *
 * <ul>
 *   <li>{@link #vector}: {@value #FMAS_PER_ELEMENT} dependent FMAs on each element of an
 *       L1-resident array; the elements are independent, so the JIT vectorises the loop and the
 *       result is the SIMD limit;
 *   <li>{@link #scalar}: {@value #CHAINS} independent scalar FMA chains, enough to cover the FMA
 *       latency, so the result is the limit of scalar code like the forward pass's inner loops.
 * </ul>
 *
 * Each invocation performs {@link #vectorFmas()} or {@link #scalarFmas()} FMAs; a FLOP is half an
 * FMA. The operands are drawn so that every value tends to a finite fixed point.
 *
 * <p>{@code java -jar bench/target/benchmarks.jar FmaKernel -f 1 -wi 3 -i 5}
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class FmaKernel {
    static final int LENGTH = 512;
    static final int FMAS_PER_ELEMENT = 8;
    static final int CHAINS = 8;
    static final int SCALAR_STEPS = 1024;

    private final double[] y = new double[LENGTH];
    private double a;
    private double b;

    /** FMAs per call of {@link #vector}. */
    static long vectorFmas() {
        return (long) LENGTH * FMAS_PER_ELEMENT;
    }

    /** FMAs per call of {@link #scalar}. */
    static long scalarFmas() {
        return (long) CHAINS * SCALAR_STEPS;
    }

    @Setup
    public void setUp() {
        a = 0.999_999;
        b = 1e-6;
        for (int i = 0; i < LENGTH; i++) {
            y[i] = i * 1e-3;
        }
    }

    @Benchmark
    public double[] vector() {
        double[] v = y;
        double m = a;
        double c = b;
        for (int i = 0; i < v.length; i++) {
            double x = v[i];
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            x = Math.fma(x, m, c);
            v[i] = x;
        }
        return v;
    }

    @Benchmark
    public double scalar() {
        double m = a;
        double c = b;
        double x0 = y[0];
        double x1 = y[1];
        double x2 = y[2];
        double x3 = y[3];
        double x4 = y[4];
        double x5 = y[5];
        double x6 = y[6];
        double x7 = y[7];
        for (int s = 0; s < SCALAR_STEPS; s++) {
            x0 = Math.fma(x0, m, c);
            x1 = Math.fma(x1, m, c);
            x2 = Math.fma(x2, m, c);
            x3 = Math.fma(x3, m, c);
            x4 = Math.fma(x4, m, c);
            x5 = Math.fma(x5, m, c);
            x6 = Math.fma(x6, m, c);
            x7 = Math.fma(x7, m, c);
        }
        return x0 + x1 + x2 + x3 + x4 + x5 + x6 + x7;
    }
}
