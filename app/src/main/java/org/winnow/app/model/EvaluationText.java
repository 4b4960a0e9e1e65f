package org.winnow.app.model;

import java.io.PrintWriter;
import java.util.Locale;
import org.winnow.scorer.model.Evaluation;

/** Renders an {@link Evaluation} for people: tables first, then a {@code name: value} summary. */
final class EvaluationText {
    /** Rule thresholds reported as "decisive": what a keep/reject rule could act on. */
    static final double DECISIVE_CONFIDENCE = org.winnow.scorer.rules.KeepRules.DEFAULT_MIN_CONFIDENCE;
    static final double DECISIVE_NOVELTY = 0.99;

    private EvaluationText() {}

    static void tables(Evaluation e, PrintWriter out) {
        out.println("per class:");
        out.printf(Locale.ROOT, "  %5s %7s %8s %9s%n", "h11", "n", "recall", "precision");
        for (int c = 0; c < e.classes().length; c++) {
            out.printf(Locale.ROOT, "  %5d %7d %8s %9s%n", e.classes()[c], e.support()[c], num(e.recall()[c]),
                    num(e.precision()[c]));
        }
        out.println("confusion matrix (rows: true h11, columns: predicted h11):");
        StringBuilder head = new StringBuilder(String.format(Locale.ROOT, "  %5s", ""));
        for (int c : e.classes()) {
            head.append(String.format(Locale.ROOT, " %5d", c));
        }
        out.println(head);
        for (int r = 0; r < e.classes().length; r++) {
            StringBuilder row = new StringBuilder(String.format(Locale.ROOT, "  %5d", e.classes()[r]));
            for (int c = 0; c < e.classes().length; c++) {
                int v = e.confusion()[r][c];
                row.append(v == 0 ? "     ." : String.format(Locale.ROOT, " %5d", v));
            }
            out.println(row);
        }
        out.println("reliability (stated confidence vs observed accuracy):");
        out.printf(Locale.ROOT, "  %-13s %7s %15s %9s%n", "confidence", "n", "mean confidence", "accuracy");
        for (Evaluation.Bin b : e.reliability()) {
            out.printf(Locale.ROOT, "  [%.2f, %.2f%s %7d %15s %9s%n", b.low(), b.high(), b.high() == 1.0 ? "]" : ")",
                    b.count(), num(b.meanConfidence()), num(b.accuracy()));
        }
    }

    static void summary(Evaluation e, PrintWriter out) {
        out.print(summaryText(e));
    }

    /** The summary lines, also stored in the model's metadata. */
    static String summaryText(Evaluation e) {
        StringBuilder sb = new StringBuilder();
        line(sb, "examples", Integer.toString(e.examples()));
        line(sb, "h11 accuracy", num(e.accuracy()));
        line(sb, "min class recall (n>=5)", num(e.minRecall(5)));
        double[] d = e.decisive(DECISIVE_CONFIDENCE, DECISIVE_NOVELTY);
        line(sb, String.format(Locale.ROOT, "decisive share (confidence>=%s, novelty<%s)", DECISIVE_CONFIDENCE,
                DECISIVE_NOVELTY), num(d[0]));
        line(sb, "decisive accuracy", num(d[1]));
        Evaluation.Tuple t = e.tuple();
        if (t != null) {
            line(sb, "tuple examples", Integer.toString(t.examples()));
            line(sb, "tuple accuracy", num(t.tupleAccuracy()));
            for (int v = 0; v < t.accuracy().length; v++) {
                String name = Evaluation.VALUES.get(v);
                line(sb, name + " right / proved / bounded", num(t.accuracy()[v]) + " / " + num(t.proved()[v]) + " / "
                        + num(t.bounded()[v]));
            }
            line(sb, "wrong values marked proved", Integer.toString(t.wrongProved()));
            line(sb, "labels outside their proved bounds", Integer.toString(t.outsideBounds()));
            line(sb, "unproved values shown near-certain", Integer.toString(t.confidentUnproved()));
        }
        if (e.holdoutClass() != null) {
            line(sb, "held-out class", "h11=" + e.holdoutClass());
            line(sb, "held-out examples", Integer.toString(e.holdoutExamples()));
            line(sb, "novelty AUROC", num(e.noveltyAuroc()));
            double[] h = e.heldOut(DECISIVE_NOVELTY);
            line(sb, "held-out kept as novel (novelty>=0.99)", num(h[0]));
            line(sb, "held-out h11 accuracy", num(h[1]));
        }
        return sb.toString();
    }

    private static void line(StringBuilder sb, String name, String value) {
        sb.append(name).append(": ").append(value).append('\n');
    }

    static String num(double v) {
        return Double.isNaN(v) ? "n/a" : String.format(Locale.ROOT, "%.4f", v);
    }
}
