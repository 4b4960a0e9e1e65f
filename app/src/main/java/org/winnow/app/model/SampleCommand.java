package org.winnow.app.model;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.OutputPaths;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceTsv;
import org.winnow.scorer.reference.StratifiedSplit;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow sample}: a stratified fraction of the exact rows of a reference file, drawn per h11 class
 * as {@code train --labelled-fraction} draws its training set, written as a reference file of its own (the
 * small labelled reference a model is shipped with). Rows are sorted by configuration before drawing, so
 * the sample does not depend on the order of the input file (label writes in completion order). Products
 * (source {@code product}) are left out unless {@code --products}: their holonomy is smaller and the
 * identities the model relies on do not hold for them.
 */
@Command(name = "sample", mixinStandardHelpOptions = true,
        description = {
            "Write a seeded, stratified fraction of the exact rows of a reference file.",
            "Each h11 class gives its fraction, at least --min-per-class where the class has them; products are "
                    + "left out unless --products."})
public final class SampleCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--reference", required = true, paramLabel = "R.tsv", description = "Labelled reference file.")
    Path reference;

    @Option(names = "--out", required = true, paramLabel = "F.tsv", description = "Where to write the sample.")
    Path out;

    @Option(names = "--fraction", required = true, paramLabel = "f", description = "Fraction in (0, 1] of each class.")
    double fraction;

    @Option(names = "--min-per-class", defaultValue = "3", paramLabel = "N",
            description = "At least this many per class where the class has them (default ${DEFAULT-VALUE}).")
    int minPerClass;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "S", description = "Seed (default ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--products", description = "Keep products (source product) in the pool.")
    boolean products;

    @Override
    public Integer call() throws IOException {
        PrintWriter err = spec.commandLine().getErr();
        if (!(fraction > 0 && fraction <= 1)) {
            return Exit.badInput(err, "sample", "--fraction must be in (0, 1], got " + fraction);
        }
        if (minPerClass < 0) {
            return Exit.badInput(err, "sample", "--min-per-class must not be negative, got " + minPerClass);
        }
        String same = OutputPaths.sameFileProblem(out, "--out", reference, "--reference");
        if (same != null) {
            return Exit.badInput(err, "sample", same);
        }
        List<ReferenceTsv.Row> rows;
        try {
            rows = ReferenceTsv.read(reference);
        } catch (NoSuchFileException e) {
            return Exit.badInput(err, "sample", reference + ": no such file");
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "sample", reference + ": " + e.getMessage());
        } catch (IOException e) {
            return Exit.badInput(err, "sample", reference + ": cannot read (" + e.getMessage() + ")");
        }
        List<ReferenceTsv.Row> pool = new ArrayList<>();
        int leftOut = 0;
        for (ReferenceTsv.Row r : rows) {
            if (!r.exact() || r.hodge() == null) {
                continue;
            }
            if (r.source() == ReferenceTsv.Source.PRODUCT && !products) {
                leftOut++;
                continue;
            }
            pool.add(r);
        }
        pool.sort(Comparator.comparing(r -> r.config().toText()));
        InvariantCalculator calc = new InvariantCalculator();
        List<LabelledExample> examples = new ArrayList<>(pool.size());
        for (ReferenceTsv.Row r : pool) {
            examples.add(new LabelledExample(r.config(), calc.chi(r.config()), r.hodge()));
        }
        StratifiedSplit split = StratifiedSplit.of(examples, fraction, minPerClass, seed);
        Set<String> chosen = new HashSet<>();
        for (LabelledExample e : split.train()) {
            chosen.add(e.config().toText());
        }
        List<ReferenceTsv.Row> sample = new ArrayList<>();
        Set<Integer> classes = new HashSet<>();
        for (ReferenceTsv.Row r : pool) {
            if (chosen.contains(r.config().toText())) {
                sample.add(r);
                classes.add(r.hodge()[0]);
            }
        }
        if (sample.isEmpty()) {
            // A header-only file with exit 0 would pass for a sample; nobody trains on nothing on purpose.
            return Exit.badInput(err, "sample", pool.isEmpty()
                    ? reference + ": no exact row to sample from (" + rows.size() + " rows, " + leftOut
                            + " products left out" + (products ? "" : "; --products keeps them") + ")"
                    : "--fraction " + fraction + " with --min-per-class " + minPerClass + " picks no row of the "
                            + pool.size() + " exact rows; raise --fraction or --min-per-class");
        }
        Set<Integer> poolClasses = new HashSet<>();
        for (ReferenceTsv.Row r : pool) {
            poolClasses.add(r.hodge()[0]);
        }
        ReferenceTsv.write(out, sample);
        err.printf(Locale.ROOT, "winnow sample: %d of %d exact rows (%d h11 classes), %d products left out%n", sample.size(),
                pool.size(), classes.size(), leftOut);
        if (classes.size() < poolClasses.size()) {
            // Only with --min-per-class 0 can a class drop out; a model never predicts a class it was not shown.
            err.printf(Locale.ROOT, "winnow sample: warning: %d of the %d h11 classes have no row in the sample "
                    + "(--min-per-class %d); a model trained on it cannot predict them%n",
                    poolClasses.size() - classes.size(), poolClasses.size(), minPerClass);
        }
        err.flush();
        return 0;
    }
}
