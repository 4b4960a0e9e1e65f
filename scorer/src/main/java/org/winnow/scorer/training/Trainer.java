package org.winnow.scorer.training;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.scorer.index.FlatIndex;
import org.winnow.scorer.model.Calibration;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.TrainingMetadata;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.EmbeddingNetwork;
import org.winnow.scorer.network.FeatureEncoder;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.network.Workspace;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceSet;

/**
 * Trains the embedding network with a contrastive loss and freezes it with its reference set.
 *
 * <p>Loss per pair at embedding distance D: {@code D^2} for two examples of the same h11, and
 * {@code max(0, margin - D)^2} for different h11, averaged over the batch; Adam with a cosine-decayed
 * step. Pairs are drawn class-balanced by {@link PairSampler}.
 *
 * <p>Determinism: all randomness comes from one {@link SplittableRandom} seeded from the options and
 * is consumed on the calling thread only. Each batch is cut into {@link #SHARDS} fixed contiguous
 * shards; a worker sums the gradient of one shard in pair order into that shard's own buffer, and
 * the shard sums are added in shard order. So the result is bit-for-bit the same for any thread
 * count and any scheduling.
 */
public final class Trainer {
    /** Fixed number of gradient shards per batch (independent of the thread count). */
    static final int SHARDS = 4;
    private static final double BETA1 = 0.9;
    private static final double BETA2 = 0.999;
    private static final double ADAM_EPS = 1e-8;

    private Trainer() {}

    /** Trains on {@code examples} (all of one dimension) and returns the frozen model. */
    public static FrozenModel train(List<LabelledExample> examples, TrainingOptions options,
            TrainingProgress progress) {
        Checks.requireArgument(!examples.isEmpty(), "cannot train on no examples");
        int dimension = examples.get(0).config().dimension();
        for (LabelledExample e : examples) {
            Checks.requireArgument(e.config().dimension() == dimension,
                    "all examples must have one dimension: %s has %s, the first has %s", e.config(),
                    e.config().dimension(), dimension);
        }
        Architecture arch = options.architecture();
        int n = examples.size();
        List<Configuration> configs = new ArrayList<>(n);
        long[] chis = new long[n];
        int[] labels = new int[n];
        for (int i = 0; i < n; i++) {
            configs.add(examples.get(i).config());
            chis[i] = examples.get(i).chi();
            labels[i] = examples.get(i).h11();
        }
        Normalisation norm = Normalisation.fit(configs, chis);
        SplittableRandom rng = new SplittableRandom(options.seed());
        double[] params = initialParameters(arch, rng.split());
        PairSampler sampler = new PairSampler(labels, rng.split());

        int batch = options.pairsPerBatch();
        int stepsPerEpoch = (Math.max(2048, 2 * n) + batch - 1) / batch;
        long totalSteps = (long) stepsPerEpoch * options.epochs();
        int[] a = new int[batch];
        int[] b = new int[batch];
        boolean[] same = new boolean[batch];
        Shard[] shards = new Shard[SHARDS];
        for (int s = 0; s < SHARDS; s++) {
            shards[s] = new Shard(arch, configs, chis, norm, params, a, b, same, options.margin());
        }
        double[] grad = new double[params.length];
        double[] m1 = new double[params.length];
        double[] m2 = new double[params.length];
        double lastLoss = Double.NaN;
        long step = 0;
        ExecutorService pool = options.threads() > 1 ? Executors.newFixedThreadPool(options.threads(), r -> {
            Thread t = new Thread(r, "winnow-train");
            t.setDaemon(true);
            return t;
        }) : null;
        try {
            for (int epoch = 1; epoch <= options.epochs(); epoch++) {
                double epochLoss = 0;
                for (int st = 0; st < stepsPerEpoch; st++) {
                    sampler.sample(batch, a, b, same);
                    for (int s = 0; s < SHARDS; s++) {
                        shards[s].from = (int) ((long) batch * s / SHARDS);
                        shards[s].to = (int) ((long) batch * (s + 1) / SHARDS);
                    }
                    runShards(pool, shards);
                    Arrays.fill(grad, 0);
                    double loss = 0;
                    for (Shard sh : shards) {
                        loss += sh.loss;
                        for (int i = 0; i < grad.length; i++) {
                            grad[i] += sh.grad[i];
                        }
                    }
                    step++;
                    double lr = options.learningRate()
                            * (0.05 + 0.95 * 0.5 * (1 + Math.cos(Math.PI * (step - 1) / Math.max(1, totalSteps))));
                    adam(params, grad, 1.0 / batch, m1, m2, step, lr);
                    epochLoss += loss / batch;
                }
                lastLoss = epochLoss / stepsPerEpoch;
                progress.epochDone(epoch, options.epochs(), lastLoss);
            }
        } finally {
            if (pool != null) {
                pool.shutdownNow();
            }
        }
        double[] embeddings = new double[n * arch.dim()];
        Workspace ws = new Workspace(arch);
        for (int i = 0; i < n; i++) {
            FeatureEncoder.encode(configs.get(i), chis[i], norm, ws);
            EmbeddingNetwork.forward(params, ws);
            System.arraycopy(ws.e, 0, embeddings, i * arch.dim(), arch.dim());
        }
        String[] texts = new String[n];
        int[][] hodge = new int[n][];
        for (int i = 0; i < n; i++) {
            texts[i] = configs.get(i).toText();
            hodge[i] = examples.get(i).hodge();
        }
        ReferenceSet ref = new ReferenceSet(texts, chis, hodge, embeddings, arch.dim());
        Calibration cal = calibrate(embeddings, arch.dim(), labels, options.k(), options.noveltyK());
        int classes = cal.classes().length;
        TrainingMetadata meta = new TrainingMetadata(options.seed(), n, classes, options.epochs(),
                totalSteps * batch, lastLoss, options.labelSource(), "");
        return new FrozenModel(arch, params, norm, ref, cal, meta);
    }

    private static void runShards(ExecutorService pool, Shard[] shards) {
        if (pool == null) {
            for (Shard s : shards) {
                s.call();
            }
            return;
        }
        try {
            List<Future<Void>> futures = pool.invokeAll(Arrays.asList(shards));
            for (Future<Void> f : futures) {
                f.get();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("training interrupted", e);
        } catch (ExecutionException e) {
            throw new IllegalStateException("a training worker failed: " + e.getCause(), e.getCause());
        }
    }

    private static void adam(double[] p, double[] g, double scale, double[] m1, double[] m2, long t, double lr) {
        double c1 = 1 - Math.pow(BETA1, t);
        double c2 = 1 - Math.pow(BETA2, t);
        for (int i = 0; i < p.length; i++) {
            double gi = g[i] * scale;
            m1[i] = BETA1 * m1[i] + (1 - BETA1) * gi;
            m2[i] = BETA2 * m2[i] + (1 - BETA2) * gi * gi;
            p[i] -= lr * (m1[i] / c1) / (Math.sqrt(m2[i] / c2) + ADAM_EPS);
        }
    }

    /**
     * Initial weights: He-uniform for the layers followed by a ReLU (fan-in of the whole input,
     * self plus message for the updates), Glorot-uniform for the linear output layer, zero biases.
     */
    public static double[] initialParameters(Architecture a, SplittableRandom rng) {
        double[] p = new double[a.parameterCount()];
        int h = a.hidden();
        fill(p, a.rowEncW(), h * Architecture.ROW_FEATURES, Math.sqrt(6.0 / Architecture.ROW_FEATURES), rng);
        fill(p, a.colEncW(), h * Architecture.COL_FEATURES, Math.sqrt(6.0 / Architecture.COL_FEATURES), rng);
        for (int t = 0; t < a.rounds(); t++) {
            double lim = Math.sqrt(6.0 / (2 * h));
            fill(p, a.colSelf(t), h * h, lim, rng);
            fill(p, a.colMsg(t), h * h, lim / 2, rng);
            fill(p, a.rowSelf(t), h * h, lim, rng);
            fill(p, a.rowMsg(t), h * h, lim / 2, rng);
        }
        fill(p, a.readW1(), a.readout() * a.pooledWidth(), Math.sqrt(6.0 / a.pooledWidth()), rng);
        fill(p, a.readW2(), a.learnedDim() * a.readout(), Math.sqrt(6.0 / (a.readout() + a.learnedDim())), rng);
        return p;
    }

    private static void fill(double[] p, int off, int len, double limit, SplittableRandom rng) {
        for (int i = 0; i < len; i++) {
            p[off + i] = (2 * rng.nextDouble() - 1) * limit;
        }
    }

    /**
     * Leave-one-out distances of the reference to itself, measured within each class: for each point,
     * the distance to its {@code noveltyK}-th nearest other point of the same h11 (noveltyK capped at the
     * class size less one; points alone in their class give none), pooled and sorted, plus their
     * quantiles per class. Within-class, because novelty asks whether a candidate lies as close to the
     * reference as members of one class lie to each other; with few labels, the distances between
     * neighbouring classes (a margin or more apart) would otherwise make a whole unseen class look
     * ordinary. When no class has two members the distances are taken over all points instead.
     */
    public static Calibration calibrate(double[] embeddings, int dim, int[] labels, int k, int noveltyK) {
        int n = labels.length;
        int nk = Math.max(1, Math.min(noveltyK, n - 1));
        double[] perPoint = perPointWithinClass(embeddings, dim, labels, nk);
        double[] pooled = Arrays.stream(perPoint).filter(x -> !Double.isNaN(x)).toArray();
        if (pooled.length == 0 && n > 1) {
            pooled = allClassDistances(embeddings, dim, n, nk);
        }
        int[] classes = Arrays.stream(labels).distinct().sorted().toArray();
        double[][] quantiles = new double[classes.length][];
        for (int c = 0; c < classes.length; c++) {
            int label = classes[c];
            double[] mine = java.util.stream.IntStream.range(0, n).filter(i -> labels[i] == label)
                    .mapToDouble(i -> perPoint[i]).filter(d -> !Double.isNaN(d)).sorted().toArray();
            quantiles[c] = new double[Calibration.QUANTILES.length];
            for (int j = 0; j < quantiles[c].length; j++) {
                quantiles[c][j] = mine.length == 0 ? Double.NaN
                        : mine[Math.max(0, (int) Math.ceil(Calibration.QUANTILES[j] * mine.length) - 1)];
            }
        }
        Arrays.sort(pooled);
        double bandwidth = pooled.length == 0 ? 0 : pooled[(pooled.length - 1) / 2];
        return new Calibration(k, nk, bandwidth, tailScale(pooled), pooled, classes, quantiles);
    }

    /** Per point, its {@code nk}-th nearest same-class distance (NaN when alone in its class). */
    private static double[] perPointWithinClass(double[] e, int dim, int[] labels, int nk) {
        int n = labels.length;
        double[] out = new double[n];
        double[] d = new double[n];
        for (int i = 0; i < n; i++) {
            int count = 0;
            for (int j = 0; j < n; j++) {
                if (j != i && labels[j] == labels[i]) {
                    d[count++] = distance(e, dim, i, j);
                }
            }
            if (count == 0) {
                out[i] = Double.NaN;
                continue;
            }
            Arrays.sort(d, 0, count);
            out[i] = d[Math.min(nk, count) - 1];
        }
        return out;
    }

    /** Per point, its {@code nk}-th nearest distance to any other point. */
    private static double[] allClassDistances(double[] e, int dim, int n, int nk) {
        FlatIndex index = new FlatIndex(e, dim);
        int[] idx = new int[nk];
        double[] dist = new double[nk];
        double[] q = new double[dim];
        double[] loo = new double[n];
        for (int i = 0; i < n; i++) {
            System.arraycopy(e, i * dim, q, 0, dim);
            int found = index.search(q, nk, i, idx, dist);
            loo[i] = dist[found - 1];
        }
        return loo;
    }

    private static double distance(double[] e, int dim, int i, int j) {
        double s = 0;
        for (int x = 0; x < dim; x++) {
            double t = e[i * dim + x] - e[j * dim + x];
            s += t * t;
        }
        return Math.sqrt(s);
    }

    /** Mean excess over the 90% quantile of the sorted distances (0 when there is no spread). */
    static double tailScale(double[] sorted) {
        if (sorted.length < 2) {
            return 0;
        }
        double u = sorted[(int) Math.floor(0.9 * (sorted.length - 1))];
        double sum = 0;
        int count = 0;
        for (double d : sorted) {
            if (d > u) {
                sum += d - u;
                count++;
            }
        }
        return count == 0 ? 0 : sum / count;
    }

    /** One fixed slice of a batch, with its own buffers; reads the shared parameters only. */
    private static final class Shard implements Callable<Void> {
        private final List<Configuration> configs;
        private final long[] chis;
        private final Normalisation norm;
        private final double[] params;
        private final int[] a;
        private final int[] b;
        private final boolean[] same;
        private final double margin;
        private final Workspace wa;
        private final Workspace wb;
        private final double[] de;
        final double[] grad;
        int from;
        int to;
        double loss;

        Shard(Architecture arch, List<Configuration> configs, long[] chis, Normalisation norm, double[] params,
                int[] a, int[] b, boolean[] same, double margin) {
            this.configs = configs;
            this.chis = chis;
            this.norm = norm;
            this.params = params;
            this.a = a;
            this.b = b;
            this.same = same;
            this.margin = margin;
            this.wa = new Workspace(arch);
            this.wb = new Workspace(arch);
            this.de = new double[arch.dim()];
            this.grad = new double[arch.parameterCount()];
        }

        @Override
        public Void call() {
            Arrays.fill(grad, 0);
            loss = 0;
            for (int i = from; i < to; i++) {
                FeatureEncoder.encode(configs.get(a[i]), chis[a[i]], norm, wa);
                EmbeddingNetwork.forward(params, wa);
                FeatureEncoder.encode(configs.get(b[i]), chis[b[i]], norm, wb);
                EmbeddingNetwork.forward(params, wb);
                loss += ContrastiveLoss.pair(wa.e, wb.e, same[i], margin, de);
                if (isZero(de)) {
                    continue;
                }
                EmbeddingNetwork.backward(params, wa, de, grad);
                for (int j = 0; j < de.length; j++) {
                    de[j] = -de[j];
                }
                EmbeddingNetwork.backward(params, wb, de, grad);
            }
            return null;
        }

        private static boolean isZero(double[] v) {
            for (double x : v) {
                if (x != 0) {
                    return false;
                }
            }
            return true;
        }
    }
}
