package org.winnow.app.model;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.OutputPaths;
import org.winnow.app.cli.WinnowCli;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.Evaluation;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.StratifiedSplit;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code winnow train}: trains the similarity model on a reference file and freezes it. */
@Command(name = "train", mixinStandardHelpOptions = true,
        description = {"Train the similarity model on the exact rows of a reference file and write a frozen model.",
            "With --labelled-fraction f < 1 only a stratified fraction is used for training and the rest is "
                    + "evaluated at the end (the summary is stored in the model)."})
public final class TrainCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--reference", required = true, paramLabel = "R.tsv", description = "Labelled reference file.")
    Path reference;

    @Option(names = "--out", required = true, paramLabel = "model.wnm", description = "Where to write the model.")
    Path out;

    @Option(names = "--dim", defaultValue = "9", paramLabel = "D",
            description = "Embedding dimension, the h11-estimate anchor included (default ${DEFAULT-VALUE}).")
    int dim;

    @Option(names = "--anchor", defaultValue = "true", negatable = true, fallbackValue = "true",
            description = "Anchor the embedding on the first-page h11 estimate and vote on corrections to it "
                    + "(default; --no-anchor learns every coordinate and votes on h11 itself, see docs/model.md).")
    boolean anchor;

    @Option(names = "--rounds", defaultValue = "0", paramLabel = "R",
            description = "Message-passing rounds of the network (default ${DEFAULT-VALUE}; see docs/model.md).")
    int rounds;

    @Option(names = "--epochs", defaultValue = "40", paramLabel = "E", description = "Training epochs (default ${DEFAULT-VALUE}).")
    int epochs;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "S", description = "Seed of all randomness (default ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--labelled-fraction", defaultValue = "1.0", paramLabel = "f",
            description = "Stratified share of exact rows to train on, at least --min-per-class per class (default ${DEFAULT-VALUE}).")
    double fraction;

    @Option(names = "--min-per-class", defaultValue = "3", paramLabel = "N",
            description = "Least number of training examples per class where available (default ${DEFAULT-VALUE}).")
    int minPerClass;

    @Option(names = "--holdout-class", paramLabel = "h11=V",
            description = "Leave class V out of training entirely, to measure novelty on it later.")
    String holdout;

    @Option(names = "--threads", defaultValue = "2", paramLabel = "T",
            description = "Worker threads; the model does not depend on it (default ${DEFAULT-VALUE}).")
    int threads;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter stdout = spec.commandLine().getOut();
        Integer holdoutClass;
        TrainingOptions options;
        if (Limits.threadsProblem(threads) != null) {
            return Exit.badInput(err, "train", Limits.threadsProblem(threads));
        }
        if (epochs == 0) {
            // Zero epochs wrote an untrained model with exit 0 and "final loss: NaN"; a random embedding is not
            // a model anyone asks for on purpose (the library still allows it, for baselines).
            return Exit.badInput(err, "train", "--epochs must be at least 1, got 0");
        }
        try {
            holdoutClass = ReferenceLoader.holdoutClass(holdout);
            Architecture shape = Architecture.defaults(dim);
            options = TrainingOptions.defaults(dim, seed)
                    .withArchitecture(new Architecture(shape.hidden(), rounds, shape.readout(), dim, anchor))
                    .withEpochs(epochs).withThreads(threads)
                    .withLabelSource(reference.getFileName() + " (exact rows)");
            if (!(fraction > 0 && fraction <= 1)) {
                return Exit.badInput(err, "train", "--labelled-fraction must be in (0, 1], got " + fraction);
            }
            if (minPerClass < 0) {
                return Exit.badInput(err, "train", "--min-per-class must not be negative, got " + minPerClass);
            }
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "train", e.getMessage());
        }
        String same = OutputPaths.sameFileProblem(out, "--out", reference, "--reference");
        if (same != null) {
            return Exit.badInput(err, "train", same);
        }
        ReferenceLoader.Loaded loaded;
        try {
            loaded = ReferenceLoader.load(reference);
        } catch (ReferenceLoader.BadReference e) {
            return Exit.badInput(err, "train", e.getMessage());
        }
        if (loaded.inconsistent() > 0) {
            err.println("winnow train: warning: " + loaded.inconsistent() + " exact rows contradict their chi; first: "
                    + loaded.firstInconsistent());
        }
        List<LabelledExample> pool = new ArrayList<>();
        List<LabelledExample> heldOut = new ArrayList<>();
        for (LabelledExample e : loaded.examples()) {
            (holdoutClass != null && e.h11() == holdoutClass ? heldOut : pool).add(e);
        }
        if (holdoutClass != null && heldOut.isEmpty()) {
            // Nothing to measure novelty on: the run would look like a held-out test and hold out nothing.
            return Exit.badInput(err, "train", "--holdout-class h11=" + holdoutClass + ": " + reference
                    + " has no exact row of that class to hold out");
        }
        if (pool.isEmpty()) {
            return Exit.badInput(err, "train", reference + ": no exact rows left to train on");
        }
        StratifiedSplit split = StratifiedSplit.of(pool, fraction, minPerClass, seed);
        List<LabelledExample> rest = new ArrayList<>(split.rest());
        rest.addAll(heldOut);
        err.printf(Locale.ROOT, "winnow train: %d exact rows (%d bounded, %d products skipped); training on %d, holding out"
                + " %d%n", loaded.examples().size(), loaded.bounded(), loaded.products(), split.train().size(), rest.size());
        err.flush();
        long start = System.nanoTime();
        FrozenModel model;
        try (ProgressBar bar = progressBar(epochs)) {
            TrainingProgress progress = (epoch, total, loss) -> {
                if (bar != null) {
                    bar.stepTo(epoch);
                    bar.setExtraMessage(String.format(Locale.ROOT, "loss %.4f", loss));
                }
            };
            model = Trainer.train(split.train(), options, progress);
        }
        double seconds = (System.nanoTime() - start) / 1e9;
        String summary;
        if (rest.isEmpty()) {
            summary = "held-out examples: 0\n";
        } else {
            Evaluation ev = Evaluation.of(model, rest, holdoutClass);
            summary = EvaluationText.summaryText(ev);
        }
        model = model.withMetadata(model.metadata().withEvaluation(summary));
        try {
            model.save(out);
        } catch (IOException e) {
            return Exit.badInput(err, "train", out + ": cannot write the model (" + e.getMessage() + ")");
        }
        stdout.printf(Locale.ROOT, "training examples: %d%n", split.train().size());
        stdout.printf(Locale.ROOT, "classes: %d%n", model.metadata().classes());
        stdout.printf(Locale.ROOT, "final loss: %.6f%n", model.metadata().finalLoss());
        stdout.printf(Locale.ROOT, "training seconds: %.1f%n", seconds);
        stdout.print(summary);
        stdout.println("model: " + out);
        stdout.println("model checksum: " + model.checksum());
        stdout.flush();
        return 0;
    }

    private static ProgressBar progressBar(int epochs) {
        if (System.console() == null) {
            return null;
        }
        return new ProgressBarBuilder().setTaskName("train").setInitialMax(epochs)
                .setConsumer(new ConsoleProgressBarConsumer(System.err)).build();
    }
}
