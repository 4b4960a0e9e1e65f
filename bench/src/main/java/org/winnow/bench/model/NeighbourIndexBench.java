package org.winnow.bench.model;

import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;
import org.winnow.scorer.index.FlatIndex;
import smile.neighbor.KDTree;
import smile.neighbor.Neighbor;

/**
 * The flat scan against Smile's KD-tree for k = 7 in 8 dimensions, on data shaped like a trained
 * embedding (tight clusters, one per class) and on uniform data; queries cycle over 4,096 points
 * drawn from the same distribution. The JDK-free baseline is the flat scan itself.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class NeighbourIndexBench {
    private static final int DIM = 8;
    private static final int K = 7;

    @Param({"80", "800", "8000"})
    int size;

    @Param({"clustered", "uniform"})
    String shape;

    private FlatIndex flat;
    private KDTree<Integer> tree;
    private double[][] queries;
    private final int[] idx = new int[K];
    private final double[] dist = new double[K];
    private int next;

    @Setup(Level.Trial)
    public void setUp() {
        SplittableRandom rng = new SplittableRandom(5);
        double[][] centres = new double[20][DIM];
        for (double[] c : centres) {
            for (int i = 0; i < DIM; i++) {
                c[i] = rng.nextDouble() * 10;
            }
        }
        double[][] pts = draw(size, centres, rng);
        queries = draw(4096, centres, rng);
        double[] flatPts = new double[size * DIM];
        Integer[] data = new Integer[size];
        for (int p = 0; p < size; p++) {
            System.arraycopy(pts[p], 0, flatPts, p * DIM, DIM);
            data[p] = p;
        }
        flat = new FlatIndex(flatPts, DIM);
        tree = new KDTree<>(pts, data);
    }

    private double[][] draw(int n, double[][] centres, SplittableRandom rng) {
        double[][] out = new double[n][DIM];
        for (int p = 0; p < n; p++) {
            double[] c = centres[rng.nextInt(centres.length)];
            for (int i = 0; i < DIM; i++) {
                out[p][i] = shape.equals("uniform") ? rng.nextDouble() * 10 : c[i] + 0.1 * (rng.nextDouble() - 0.5);
            }
        }
        return out;
    }

    @Benchmark
    public int flatScan() {
        double[] q = queries[next++ & 4095];
        flat.search(q, K, -1, idx, dist);
        return idx[0];
    }

    @Benchmark
    public void smileKdTree(Blackhole bh) {
        double[] q = queries[next++ & 4095];
        Neighbor<double[], Integer>[] nn = tree.search(q, K);
        bh.consume(nn);
    }
}
