package org.winnow.bench.model;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.TreeMap;
import java.util.function.ToIntFunction;
import java.util.stream.LongStream;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.H11Estimator;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.reference.ReferenceTsv;
import org.winnow.scorer.reference.StratifiedSplit;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import smile.base.cart.SplitRule;
import smile.classification.RandomForest;
import smile.data.DataFrame;
import smile.data.formula.Formula;
import smile.data.vector.IntVector;

/**
 * The similarity model against plain baselines, side by side on one stratified split of an exactly
 * labelled reference file: every method learns from the same few labels and is scored on the same
 * rest. Methods: 1-NN on the raw zero-padded matrices (the reference files hold canonical forms, so
 * "as written" is already a fixed row and column order), a
 * Smile random forest on the raw zero-padded matrix plus (m, K, chi), the first-page h11 estimate
 * alone (no learning), the model without the anchor (votes on h11) and the default model (anchored on
 * the estimate, votes on corrections). Prints a table and a {@code name: value} summary.
 *
 * <p>Usage: {@code ModelBaselines REFERENCE.tsv [fraction] [seed]}; run by {@code bench/model-baselines.sh}.
 */
public final class ModelBaselines {
    private static final int ROWS = Configuration.MAX_ROWS;
    private static final int COLS = Configuration.MAX_COLS;

    private ModelBaselines() {}

    /** Accuracy and the smallest recall over classes with at least 5 test members. */
    record Score(String method, double accuracy, double minRecall, int worstClass) {}

    public static void main(String[] args) throws IOException {
        Path reference = Path.of(args.length > 0 ? args[0] : "demo-data/threefolds-exact.tsv");
        double fraction = args.length > 1 ? Double.parseDouble(args[1]) : 0.01;
        long seed = args.length > 2 ? Long.parseLong(args[2]) : 1;
        List<LabelledExample> all = load(reference);
        StratifiedSplit split = StratifiedSplit.of(all, fraction, 3, seed);
        List<LabelledExample> train = split.train();
        List<LabelledExample> test = split.rest();
        System.out.printf(Locale.ROOT, "reference: %s (%d exact rows), labelled fraction %.3f, seed %d: train %d, test %d%n",
                reference, all.size(), fraction, seed, train.size(), test.size());

        List<Score> scores = new ArrayList<>();
        scores.add(score("1-NN, raw zero-padded matrix", test, nearestNeighbour(train, ModelBaselines::raw)));
        scores.add(score("random forest (Smile, 300 trees), raw matrix + m, K, chi", test, forest(train, seed)));
        H11Estimator estimator = new H11Estimator();
        scores.add(score("first-page h11 estimate alone (no labels)", test, e -> estimator.estimate(e.config())));
        RefinedH11Estimator refined = new RefinedH11Estimator();
        scores.add(score("refined estimate alone (engine where unsettled; no labels)", test,
                e -> refined.estimate(e.config())));
        for (boolean anchored : new boolean[] {false, true}) {
            Architecture shape = Architecture.defaults(9);
            TrainingOptions options = TrainingOptions.defaults(9, seed)
                    .withArchitecture(new Architecture(shape.hidden(), shape.rounds(), shape.readout(), 9, anchored))
                    .withThreads(2);
            FrozenModel model = Trainer.train(train, options, TrainingProgress.silent());
            Predictor p = model.newPredictor();
            scores.add(score(anchored ? "winnow model (default: anchored, votes on corrections)"
                    : "winnow model without the anchor (votes on h11)", test, e -> p.score(e.config(), e.chi())));
        }
        System.out.printf(Locale.ROOT, "%-62s %10s %22s%n", "method", "accuracy", "min recall (n>=5)");
        for (Score s : scores) {
            System.out.printf(Locale.ROOT, "%-62s %10.4f %14.4f (h11=%d)%n", s.method(), s.accuracy(), s.minRecall(),
                    s.worstClass());
        }
        for (Score s : scores) {
            System.out.printf(Locale.ROOT, "%s accuracy: %.4f%n", s.method(), s.accuracy());
        }
    }

    static List<LabelledExample> load(Path path) throws IOException {
        InvariantCalculator calc = new InvariantCalculator();
        List<LabelledExample> out = new ArrayList<>();
        for (ReferenceTsv.Row r : ReferenceTsv.read(path)) {
            if (r.exact()) {
                out.add(new LabelledExample(r.config(), calc.chi(r.config()), r.hodge()));
            }
        }
        return out;
    }

    static Score score(String method, List<LabelledExample> test, ToIntFunction<LabelledExample> predict) {
        TreeMap<Integer, int[]> perClass = new TreeMap<>();
        int correct = 0;
        for (LabelledExample e : test) {
            int[] c = perClass.computeIfAbsent(e.h11(), x -> new int[2]);
            c[0]++;
            if (predict.applyAsInt(e) == e.h11()) {
                c[1]++;
                correct++;
            }
        }
        double min = Double.NaN;
        int worst = -1;
        for (var entry : perClass.entrySet()) {
            int[] c = entry.getValue();
            if (c[0] >= 5 && (Double.isNaN(min) || c[1] / (double) c[0] < min)) {
                min = c[1] / (double) c[0];
                worst = entry.getKey();
            }
        }
        return new Score(method, correct / (double) test.size(), min, worst);
    }

    private static ToIntFunction<LabelledExample> nearestNeighbour(List<LabelledExample> train,
            java.util.function.Function<Configuration, double[]> vector) {
        double[][] x = train.stream().map(e -> vector.apply(e.config())).toArray(double[][]::new);
        int[] y = train.stream().mapToInt(LabelledExample::h11).toArray();
        return e -> {
            double[] q = vector.apply(e.config());
            int best = 0;
            double bestD = Double.POSITIVE_INFINITY;
            for (int i = 0; i < x.length; i++) {
                double d = 0;
                for (int j = 0; j < q.length; j++) {
                    double t = q[j] - x[i][j];
                    d += t * t;
                }
                if (d < bestD) {
                    bestD = d;
                    best = i;
                }
            }
            return y[best];
        };
    }

    private static ToIntFunction<LabelledExample> forest(List<LabelledExample> train, long seed) {
        int p = ROWS * COLS + 3 + ROWS;
        double[][] x = train.stream().map(ModelBaselines::forestFeatures).toArray(double[][]::new);
        int[] y = train.stream().mapToInt(LabelledExample::h11).toArray();
        String[] names = new String[p];
        for (int i = 0; i < p; i++) {
            names[i] = "x" + i;
        }
        DataFrame df = DataFrame.of(x, names).merge(IntVector.of("h11", y));
        int trees = 300;
        RandomForest rf = RandomForest.fit(Formula.lhs("h11"), df, trees, (int) Math.sqrt(p), SplitRule.GINI, 20,
                Math.max(2, train.size()), 1, 1.0, null, LongStream.range(seed, seed + trees));
        return e -> rf.predict(DataFrame.of(new double[][] {forestFeatures(e)}, names).get(0));
    }

    /** The raw zero-padded matrix, the row dimensions n_r, and m, K, chi. */
    private static double[] forestFeatures(LabelledExample e) {
        Configuration c = e.config();
        double[] v = Arrays.copyOf(raw(c), ROWS * COLS + 3 + ROWS);
        for (int r = 0; r < c.rows(); r++) {
            v[ROWS * COLS + r] = c.n(r);
        }
        v[ROWS * COLS + ROWS] = c.rows();
        v[ROWS * COLS + ROWS + 1] = c.cols();
        v[ROWS * COLS + ROWS + 2] = e.chi();
        return v;
    }

    /** Degrees as written, padded with zeros to the largest size. */
    static double[] raw(Configuration c) {
        double[] v = new double[ROWS * COLS];
        for (int r = 0; r < c.rows(); r++) {
            for (int j = 0; j < c.cols(); j++) {
                v[r * COLS + j] = c.q(r, j);
            }
        }
        return v;
    }
}
