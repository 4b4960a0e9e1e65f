package org.winnow.scorer.model;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.TreeSet;
import org.winnow.geometry.Checks;
import org.winnow.scorer.reference.LabelledExample;

/**
 * Held-out metrics of a frozen model: h11 accuracy, per-class recall and precision, the confusion
 * matrix, a reliability table (stated confidence against observed accuracy) and, when one class was
 * held out of training, how well novelty separates that class from the known ones (AUROC).
 *
 * @param examples known-class examples scored
 * @param accuracy share of known-class examples with the right h11
 * @param classes every h11 seen as truth or prediction, ascending; rows and columns of {@code confusion}
 * @param support true members per class
 * @param recall per class (NaN without members)
 * @param precision per class (NaN when never predicted)
 * @param confusion {@code confusion[true][predicted]} counts over known-class examples
 * @param reliability confidence bins
 * @param holdoutClass the class held out of training, or null
 * @param holdoutExamples how many examples of it were scored
 * @param noveltyAuroc probability that a held-out example is more novel than a known one (ties half);
 *     NaN without a held-out class
 * @param truth true h11 per scored example (known classes first, then the held-out class)
 * @param predicted predicted h11, same order
 * @param confidence stated confidence, same order
 * @param novelty novelty, same order
 * @param tuple the whole Hodge tuple against the labels, on the known-class examples; null when the labels
 *     hold h11 only
 */
public record Evaluation(int examples, double accuracy, int[] classes, int[] support, double[] recall,
        double[] precision, int[][] confusion, List<Bin> reliability, Integer holdoutClass, int holdoutExamples,
        double noveltyAuroc, int[] truth, int[] predicted, double[] confidence, double[] novelty, Tuple tuple) {

    /** The names of the tuple's values, in label order. */
    public static final List<String> VALUES = List.of("h11", "h21", "h31", "h22");

    /**
     * The whole tuple against the labels: {@code (h11, h21)} for three-folds, {@code (h11, h21, h31, h22)}
     * for four-folds; per value in {@link #VALUES} order, as many as the labels hold.
     *
     * @param examples      known-class examples with a full label
     * @param tupleAccuracy share with every value right
     * @param accuracy      share right, per value
     * @param proved        share of predictions marked proved, per value
     * @param bounded       share marked bounded, per value
     * @param wrongProved   values marked proved that differ from the label (a defect whenever it is not 0)
     * @param outsideBounds bounded values whose proved interval misses the label (likewise)
     * @param confidentUnproved unproved values shown with confidence above {@link Predictor#UNPROVED_MAX}
     *                      (likewise)
     */
    public record Tuple(int examples, double tupleAccuracy, double[] accuracy, double[] proved, double[] bounded,
            int wrongProved, int outsideBounds, int confidentUnproved) {}

    /** Upper edges of the reliability bins (the last bin is closed at 1). */
    public static final double[] BIN_EDGES = {0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.99, 1.0};

    /**
     * One reliability bin, {@code [low, high)}.
     *
     * @param count examples whose confidence falls in the bin
     * @param meanConfidence their mean stated confidence
     * @param accuracy their observed accuracy
     */
    public record Bin(double low, double high, int count, double meanConfidence, double accuracy) {}

    /** Scores every example; those of {@code holdoutClass} (may be null) only count for novelty. */
    public static Evaluation of(FrozenModel model, List<LabelledExample> examples, Integer holdoutClass) {
        Checks.requireArgument(!examples.isEmpty(), "nothing to evaluate");
        List<LabelledExample> known = new ArrayList<>();
        List<LabelledExample> novel = new ArrayList<>();
        for (LabelledExample e : examples) {
            (holdoutClass != null && e.h11() == holdoutClass ? novel : known).add(e);
        }
        int n = known.size() + novel.size();
        int[] truth = new int[n];
        int[] pred = new int[n];
        double[] conf = new double[n];
        double[] nov = new double[n];
        Predictor p = model.newPredictor();
        int values = 4;
        for (LabelledExample e : known) {
            values = Math.min(values, e.hodge().length);
        }
        int full = 0;
        int allRight = 0;
        int[] right = new int[values];
        int[] proved = new int[values];
        int[] bounded = new int[values];
        int wrongProved = 0;
        int outsideBounds = 0;
        int confidentUnproved = 0;
        for (int i = 0; i < n; i++) {
            LabelledExample e = i < known.size() ? known.get(i) : novel.get(i - known.size());
            truth[i] = e.h11();
            org.winnow.pipeline.Prediction predicted = p.predict(e.config(), e.chi());
            pred[i] = predicted.h11();
            conf[i] = p.confidence();
            nov[i] = p.novelty();
            if (i >= known.size() || values < 2) {
                continue;
            }
            int[] label = e.hodge();
            full++;
            boolean all = true;
            for (int v = 0; v < values; v++) {
                org.winnow.pipeline.PredictedValue pv = predicted.value(org.winnow.pipeline.Keepable.ofLabel(VALUES.get(v))
                        .orElseThrow());
                boolean ok = pv != null && pv.value() == label[v];
                all &= ok;
                right[v] += ok ? 1 : 0;
                if (pv == null) {
                    continue;
                }
                switch (pv.basis()) {
                    case PROVED -> {
                        proved[v]++;
                        wrongProved += ok ? 0 : 1;
                    }
                    case BOUNDED -> {
                        bounded[v]++;
                        outsideBounds += pv.lo() <= label[v] && label[v] <= pv.hi() ? 0 : 1;
                    }
                    case ESTIMATED -> { }
                }
                confidentUnproved += !pv.isProved() && pv.confidence() > Predictor.UNPROVED_MAX ? 1 : 0;
            }
            allRight += all ? 1 : 0;
        }
        Tuple tuple = null;
        if (values >= 2 && full > 0) {
            double[] acc = new double[values];
            double[] pr = new double[values];
            double[] bd = new double[values];
            for (int v = 0; v < values; v++) {
                acc[v] = right[v] / (double) full;
                pr[v] = proved[v] / (double) full;
                bd[v] = bounded[v] / (double) full;
            }
            tuple = new Tuple(full, allRight / (double) full, acc, pr, bd, wrongProved, outsideBounds, confidentUnproved);
        }
        int kn = known.size();
        TreeSet<Integer> seen = new TreeSet<>();
        for (int i = 0; i < kn; i++) {
            seen.add(truth[i]);
            seen.add(pred[i]);
        }
        int[] classes = seen.stream().mapToInt(Integer::intValue).toArray();
        int[][] confusion = new int[classes.length][classes.length];
        int correct = 0;
        for (int i = 0; i < kn; i++) {
            confusion[Arrays.binarySearch(classes, truth[i])][Arrays.binarySearch(classes, pred[i])]++;
            correct += truth[i] == pred[i] ? 1 : 0;
        }
        int[] support = new int[classes.length];
        double[] recall = new double[classes.length];
        double[] precision = new double[classes.length];
        for (int c = 0; c < classes.length; c++) {
            int row = 0;
            int col = 0;
            for (int d = 0; d < classes.length; d++) {
                row += confusion[c][d];
                col += confusion[d][c];
            }
            support[c] = row;
            recall[c] = row == 0 ? Double.NaN : confusion[c][c] / (double) row;
            precision[c] = col == 0 ? Double.NaN : confusion[c][c] / (double) col;
        }
        List<Bin> bins = new ArrayList<>();
        double low = 0;
        for (double high : BIN_EDGES) {
            int count = 0;
            double sumConf = 0;
            int ok = 0;
            for (int i = 0; i < kn; i++) {
                boolean in = conf[i] >= low && (conf[i] < high || (high == 1.0 && conf[i] <= 1.0));
                if (in) {
                    count++;
                    sumConf += conf[i];
                    ok += truth[i] == pred[i] ? 1 : 0;
                }
            }
            bins.add(new Bin(low, high, count, count == 0 ? Double.NaN : sumConf / count,
                    count == 0 ? Double.NaN : ok / (double) count));
            low = high;
        }
        double auroc = Double.NaN;
        if (!novel.isEmpty() && kn > 0) {
            auroc = auroc(Arrays.copyOfRange(nov, kn, n), Arrays.copyOfRange(nov, 0, kn));
        }
        return new Evaluation(kn, kn == 0 ? Double.NaN : correct / (double) kn, classes, support, recall, precision,
                confusion, List.copyOf(bins), holdoutClass, novel.size(), auroc, truth, pred, conf, nov, tuple);
    }

    /** The smallest recall over classes with at least {@code minSupport} true members (NaN if none). */
    public double minRecall(int minSupport) {
        double min = Double.NaN;
        for (int c = 0; c < classes.length; c++) {
            if (support[c] >= minSupport && !(recall[c] >= min)) {
                min = recall[c];
            }
        }
        return min;
    }

    /**
     * Among known-class examples a rule would reject (confidence at least {@code minConfidence} and
     * novelty below {@code noveltyGuard}): their share and their accuracy, {@code {coverage, accuracy}}.
     */
    public double[] decisive(double minConfidence, double noveltyGuard) {
        int count = 0;
        int ok = 0;
        for (int i = 0; i < examples; i++) {
            if (confidence[i] >= minConfidence && novelty[i] < noveltyGuard) {
                count++;
                ok += truth[i] == predicted[i] ? 1 : 0;
            }
        }
        return new double[] {examples == 0 ? Double.NaN : count / (double) examples,
            count == 0 ? Double.NaN : ok / (double) count};
    }

    /**
     * Among held-out examples: the share a rule would keep as novel (novelty at least
     * {@code noveltyGuard}) and the share whose h11 is nevertheless predicted right,
     * {@code {keptAsNovel, accuracy}}; NaN without a held-out class.
     */
    public double[] heldOut(double noveltyGuard) {
        int n = truth.length - examples;
        if (n == 0) {
            return new double[] {Double.NaN, Double.NaN};
        }
        int novel = 0;
        int ok = 0;
        for (int i = examples; i < truth.length; i++) {
            novel += novelty[i] >= noveltyGuard ? 1 : 0;
            ok += truth[i] == predicted[i] ? 1 : 0;
        }
        return new double[] {novel / (double) n, ok / (double) n};
    }

    /**
     * Area under the ROC curve of {@code positives} against {@code negatives} by the rank-sum
     * (Mann-Whitney) statistic, ties counting one half. Common practice, no source.
     */
    public static double auroc(double[] positives, double[] negatives) {
        Checks.requireArgument(positives.length > 0 && negatives.length > 0, "AUROC needs both groups");
        double[] neg = negatives.clone();
        Arrays.sort(neg);
        double sum = 0;
        for (double x : positives) {
            int below = lowerBound(neg, x);
            int notAbove = upperBound(neg, x);
            sum += below + 0.5 * (notAbove - below);
        }
        return sum / ((double) positives.length * neg.length);
    }

    private static int lowerBound(double[] a, double x) {
        int lo = 0;
        int hi = a.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (a[mid] < x) {
                lo = mid + 1;
            } else {
                hi = mid;
            }
        }
        return lo;
    }

    private static int upperBound(double[] a, double x) {
        int lo = 0;
        int hi = a.length;
        while (lo < hi) {
            int mid = (lo + hi) >>> 1;
            if (a[mid] <= x) {
                lo = mid + 1;
            } else {
                hi = mid;
            }
        }
        return lo;
    }
}
