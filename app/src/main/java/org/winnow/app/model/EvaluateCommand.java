package org.winnow.app.model;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.app.report.EvaluationFile;
import org.winnow.scorer.model.Evaluation;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code winnow evaluate}: held-out metrics of a frozen model on a reference file, with two pictures. */
@Command(name = "evaluate", mixinStandardHelpOptions = true,
        description = {"Evaluate a frozen model on the exact rows of a reference file outside its own reference set.",
            "Reports accuracy, per-class recall and precision, confusion matrix, reliability, and with "
                    + "--holdout-class the novelty AUROC of that class; writes two PNGs (and with --out a JSON file "
                    + "for winnow report); ends with a name: value summary."})
public final class EvaluateCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--model", required = true, paramLabel = "M.wnm", description = "The frozen model.")
    Path modelPath;

    @Option(names = "--reference", required = true, paramLabel = "T.tsv", description = "Labelled test file.")
    Path reference;

    @Option(names = "--holdout-class", paramLabel = "h11=V",
            description = "Class V was left out of training: measure how well novelty flags it.")
    String holdout;

    @Option(names = "--plots", paramLabel = "DIR",
            description = "Directory for <model>-embedding.png and <model>-confusion.png (default: the --out "
                    + "directory, else beside the model).")
    Path plots;

    @Option(names = "--out", paramLabel = "DIR",
            description = {"Also write the results machine-readably to DIR/" + EvaluationFile.FILE
                + " (the pictures go there too unless --plots says otherwise); `winnow report DIR` renders it."})
    Path outDir;

    @Option(names = "--max-plot-points", defaultValue = "20000", paramLabel = "N",
            description = "Largest number of points drawn in the embedding picture (default ${DEFAULT-VALUE}).")
    int maxPlotPoints;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter out = spec.commandLine().getOut();
        Integer holdoutClass;
        try {
            holdoutClass = ReferenceLoader.holdoutClass(holdout);
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "evaluate", e.getMessage());
        }
        if (maxPlotPoints < 1) {
            // 0 or less was taken as 1 without a word: a picture of one point looks like a broken embedding.
            return Exit.badInput(err, "evaluate", "--max-plot-points must be at least 1, got " + maxPlotPoints);
        }
        for (Path d : new Path[] {plots, outDir}) {
            if (d != null && java.nio.file.Files.exists(d) && !java.nio.file.Files.isDirectory(d)) {
                // Found only after the whole evaluation had run and printed its tables.
                return Exit.badInput(err, "evaluate", (d == plots ? "--plots " : "--out ") + d
                        + ": exists and is not a directory");
            }
        }
        FrozenModel model;
        try {
            model = FrozenModel.load(modelPath);
        } catch (IOException e) {
            return Exit.badInput(err, "evaluate", e.getMessage());
        }
        if (holdoutClass != null && Arrays.binarySearch(model.calibration().classes(), holdoutClass) >= 0) {
            return Exit.badInput(err, "evaluate", modelPath + ": the model was trained on h11=" + holdoutClass
                    + "; train it with --holdout-class h11=" + holdoutClass + " to measure novelty on that class");
        }
        ReferenceLoader.Loaded loaded;
        try {
            loaded = ReferenceLoader.load(reference);
        } catch (ReferenceLoader.BadReference e) {
            return Exit.badInput(err, "evaluate", e.getMessage());
        }
        Set<String> seen = new HashSet<>(Arrays.asList(model.reference().configs()));
        List<LabelledExample> test = new ArrayList<>();
        for (LabelledExample e : loaded.examples()) {
            if (!seen.contains(e.config().toText())) {
                test.add(e);
            }
        }
        if (test.isEmpty()) {
            return Exit.badInput(err, "evaluate", reference + ": every exact row is in the model's reference set; nothing to evaluate");
        }
        if (holdoutClass != null && test.stream().noneMatch(e -> e.h11() == holdoutClass)) {
            // The novelty AUROC would be n/a with exit 0, as if measured.
            return Exit.badInput(err, "evaluate", "--holdout-class h11=" + holdoutClass + ": " + reference
                    + " has no exact row of that class to measure novelty on");
        }
        if (test.get(0).config().dimension() != model.dimension()) {
            return Exit.badInput(err, "evaluate", reference + ": dimension " + test.get(0).config().dimension() + " but the model is for "
                    + model.dimension());
        }
        long start = System.nanoTime();
        Evaluation ev = Evaluation.of(model, test, holdoutClass);
        double seconds = (System.nanoTime() - start) / 1e9;
        out.printf(Locale.ROOT, "model %s (checksum %s), %d reference examples%n", modelPath, model.checksum(),
                model.reference().size());
        out.printf(Locale.ROOT, "test rows: %d (%d exact rows were in the model's reference, %d bounded skipped)%n",
                test.size(), loaded.examples().size() - test.size(), loaded.bounded());
        if (loaded.inconsistent() > 0) {
            err.println("winnow evaluate: warning: " + loaded.inconsistent()
                    + " exact rows contradict their chi; first: " + loaded.firstInconsistent());
        }
        EvaluationText.tables(ev, out);
        Path dir = plots != null ? plots : outDir != null ? outDir : modelPath.toAbsolutePath().getParent();
        String stem = modelPath.getFileName().toString().replaceFirst("\\.wnm$", "");
        Path embeddingPng = dir.resolve(stem + "-embedding.png");
        Path confusionPng = dir.resolve(stem + "-confusion.png");
        try {
            java.nio.file.Files.createDirectories(dir);
            int n = Math.min(test.size(), Math.max(1, maxPlotPoints));
            double[][] emb = new double[n][];
            int[] labels = new int[n];
            for (int i = 0; i < n; i++) {
                // An even stride keeps every part of the file represented when points are capped.
                LabelledExample e = test.get((int) ((long) i * test.size() / n));
                emb[i] = model.embed(e.config(), e.chi());
                labels[i] = e.h11();
            }
            ModelPlots.embedding(emb, labels, holdoutClass, "embedding of " + reference.getFileName()
                    + " (first two principal axes)", embeddingPng);
            ModelPlots.confusion(ev.classes(), ev.confusion(), "h11 confusion on " + reference.getFileName(),
                    confusionPng);
        } catch (IOException e) {
            return Exit.badInput(err, "evaluate", dir + ": cannot write the plots (" + e.getMessage() + ")");
        }
        out.println("plots: " + embeddingPng + ", " + confusionPng);
        if (outDir != null) {
            EvaluationFile.Context context = new EvaluationFile.Context(modelPath, model.checksum(),
                    model.reference().size(), reference, loaded.examples().size() - test.size(), loaded.bounded(),
                    EvaluationText.summaryText(ev).lines().toList(), embeddingPng, confusionPng, seconds);
            try {
                out.println("results: " + EvaluationFile.of(ev, context, outDir).write(outDir));
            } catch (IOException e) {
                return Exit.badInput(err, "evaluate", outDir + ": cannot write " + EvaluationFile.FILE + " (" + e.getMessage() + ")");
            }
        }
        out.printf(Locale.ROOT, "scoring seconds: %.2f%n", seconds);
        EvaluationText.summary(ev, out);
        out.flush();
        return 0;
    }
}
