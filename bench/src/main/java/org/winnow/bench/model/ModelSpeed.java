package org.winnow.bench.model;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.List;
import java.util.Locale;
import java.util.SplittableRandom;
import org.winnow.geometry.Configuration;
import org.winnow.scorer.index.FlatIndex;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.reference.StratifiedSplit;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import smile.neighbor.KDTree;

/**
 * The model's speed in CPU time rather than wall time, which on a shared 2-core machine is the
 * repeatable number (the JMH figures beside it swing with foreign load): scoring per candidate on one
 * thread, bytes allocated per candidate, the flat scan against Smile's KD-tree, and one training run on
 * a 1% labelled set. Run: {@code java -cp bench/target/benchmarks.jar org.winnow.bench.model.ModelSpeed
 * [MODEL.wnm REFERENCE.tsv]}; with a model and a labelled file it first times, on the file's
 * configurations, the first-page h11 estimate alone and the whole score with that model.
 */
public final class ModelSpeed {
    private ModelSpeed() {}

    /** CPU time per candidate of the estimate alone and of the whole score, over a labelled file's rows. */
    private static void realSpace(ThreadMXBean mx, java.nio.file.Path modelFile, java.nio.file.Path reference)
            throws java.io.IOException {
        FrozenModel model = FrozenModel.load(modelFile);
        List<LabelledExample> rows = ModelBaselines.load(reference);
        Configuration[] configs = rows.stream().map(LabelledExample::config).toArray(Configuration[]::new);
        long[] chis = rows.stream().mapToLong(LabelledExample::chi).toArray();
        org.winnow.geometry.hodge.RefinedH11Estimator estimator = new org.winnow.geometry.hodge.RefinedH11Estimator();
        Predictor p = model.newPredictor();
        long sink = 0;
        for (int pass = 0; pass < 2; pass++) { // the first pass warms up
            int n = configs.length * 20;
            long cpu0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += estimator.estimate(configs[i % configs.length]);
            }
            long estimateCpu = mx.getCurrentThreadCpuTime() - cpu0;
            long bytes0 = allocated();
            cpu0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += p.score(configs[i % configs.length], chis[i % configs.length]);
            }
            long scoreCpu = mx.getCurrentThreadCpuTime() - cpu0;
            long bytes = allocated() - bytes0;
            if (pass == 1) {
                System.out.printf(Locale.ROOT, "%s, %d configurations x 20: estimate alone %.2f us/candidate CPU;"
                        + " whole score %.2f us/candidate CPU = %,.0f candidates/s per core, %.3f bytes allocated per"
                        + " candidate (checksum %d)%n", reference.getFileName(), configs.length, estimateCpu / 1e3 / n,
                        scoreCpu / 1e3 / n, n / (scoreCpu / 1e9), bytes / (double) n, sink);
            }
        }
    }

    public static void main(String[] args) throws java.io.IOException {
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        if (args.length == 2) {
            realSpace(mx, java.nio.file.Path.of(args[0]), java.nio.file.Path.of(args[1]));
        }
        List<LabelledExample> cand = SyntheticScenario.generate(4096, 2);
        Configuration[] configs = cand.stream().map(LabelledExample::config).toArray(Configuration[]::new);
        long[] chis = cand.stream().mapToLong(LabelledExample::chi).toArray();
        for (int refs : new int[] {80, 800, 8000}) {
            FrozenModel model = Trainer.train(SyntheticScenario.generate(refs, 1),
                    TrainingOptions.defaults(8, 1).withEpochs(1), TrainingProgress.silent());
            Predictor p = model.newPredictor();
            int sink = 0;
            for (int i = 0; i < 400_000; i++) {
                sink += p.score(configs[i & 4095], chis[i & 4095]);
            }
            int n = refs >= 8000 ? 200_000 : 1_000_000;
            long bytes0 = allocated();
            long cpu0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += p.score(configs[i & 4095], chis[i & 4095]);
            }
            long cpu = mx.getCurrentThreadCpuTime() - cpu0;
            long bytes = allocated() - bytes0;
            System.out.printf(Locale.ROOT, "score, %5d reference points: %.2f us/candidate CPU = %,.0f candidates/s per core,"
                    + " %.3f bytes allocated per candidate (checksum %d)%n", refs, cpu / 1e3 / n, n / (cpu / 1e9),
                    bytes / (double) n, sink);
        }
        indexes(mx);
        List<LabelledExample> train = StratifiedSplit.of(SyntheticScenario.generate(7890, 7), 0.01, 3, 1).train();
        for (int threads : new int[] {1, 2}) {
            long w0 = System.nanoTime();
            long c0 = processCpu();
            Trainer.train(train, TrainingOptions.defaults(8, 1).withThreads(threads), TrainingProgress.silent());
            System.out.printf(Locale.ROOT, "train %d examples, 40 epochs, %d thread(s): %.1f s wall, %.1f s process CPU%n",
                    train.size(), threads, (System.nanoTime() - w0) / 1e9, (processCpu() - c0) / 1e9);
        }
    }

    private static void indexes(ThreadMXBean mx) {
        int dim = 8;
        SplittableRandom rng = new SplittableRandom(5);
        double[][] centres = new double[20][dim];
        for (double[] c : centres) {
            for (int i = 0; i < dim; i++) {
                c[i] = rng.nextDouble() * 10;
            }
        }
        for (int size : new int[] {80, 800, 8000}) {
            double[][] pts = new double[size][dim];
            double[] flat = new double[size * dim];
            Integer[] data = new Integer[size];
            for (int p = 0; p < size; p++) {
                double[] c = centres[rng.nextInt(20)];
                for (int i = 0; i < dim; i++) {
                    pts[p][i] = c[i] + 0.1 * (rng.nextDouble() - 0.5);
                    flat[p * dim + i] = pts[p][i];
                }
                data[p] = p;
            }
            double[][] q = new double[4096][dim];
            for (double[] row : q) {
                double[] c = centres[rng.nextInt(20)];
                for (int i = 0; i < dim; i++) {
                    row[i] = c[i] + 0.1 * (rng.nextDouble() - 0.5);
                }
            }
            FlatIndex index = new FlatIndex(flat, dim);
            KDTree<Integer> tree = new KDTree<>(pts, data);
            int[] idx = new int[7];
            double[] dist = new double[7];
            int n = size >= 8000 ? 20_000 : 200_000;
            long sink = 0;
            for (int i = 0; i < n; i++) {
                index.search(q[i & 4095], 7, -1, idx, dist);
                sink += idx[0];
                sink += tree.search(q[i & 4095], 7).length;
            }
            long c0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                index.search(q[i & 4095], 7, -1, idx, dist);
                sink += idx[0];
            }
            long flatCpu = mx.getCurrentThreadCpuTime() - c0;
            c0 = mx.getCurrentThreadCpuTime();
            for (int i = 0; i < n; i++) {
                sink += tree.search(q[i & 4095], 7).length;
            }
            long treeCpu = mx.getCurrentThreadCpuTime() - c0;
            System.out.printf(Locale.ROOT, "k=7 in 8-D, %5d clustered points: flat scan %.2f us/query, Smile KDTree %.2f us/query"
                    + " (CPU; checksum %d)%n", size, flatCpu / 1e3 / n, treeCpu / 1e3 / n, sink);
        }
    }

    private static long allocated() {
        return ((com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean())
                .getThreadAllocatedBytes(Thread.currentThread().getId());
    }

    private static long processCpu() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean())
                .getProcessCpuTime();
    }
}
