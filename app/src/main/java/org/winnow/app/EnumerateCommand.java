package org.winnow.app;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import org.winnow.producer.Bounds;
import org.winnow.producer.EnumerationCounts;
import org.winnow.producer.Enumerator;
import org.winnow.producer.RuleSet;
import org.winnow.producer.ShardSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow enumerate}: stream the canonical configuration matrices of a space, one line each
 * (the canonical line, then a tab and the identity flags when there are any), or only count them.
 */
@Command(name = "enumerate", mixinStandardHelpOptions = true,
        description = {
            "Enumerate Calabi-Yau configuration matrices, each permutation class once, in canonical form.",
            "Defaults lose nothing under the base rules: rows <= min(5d, 16), n <= 2d+1, entries <= 2d+2."})
final class EnumerateCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--dim", paramLabel = "D", description = "Dimension of the Calabi-Yau, 1..4 (default ${DEFAULT-VALUE}).")
    int dim = 3;

    @Option(names = "--min-rows", paramLabel = "M", description = "Fewest rows (default 1).")
    Integer minRows;

    @Option(names = "--max-rows", paramLabel = "M", description = "Most rows (default min(5d, 16)).")
    Integer maxRows;

    @Option(names = "--max-cols", paramLabel = "K", description = "Most columns (default 24).")
    Integer maxCols;

    @Option(names = "--max-n", paramLabel = "N", description = "Largest projective factor P^N (default 2d+1).")
    Integer maxN;

    @Option(names = "--max-entry", paramLabel = "E", description = "Largest degree (default 2d+2).")
    Integer maxEntry;

    @Option(names = "--rules", paramLabel = "NAME",
            description = "Rule set: base, split, lossless, short (default ${DEFAULT-VALUE}).")
    String rules = "lossless";

    @Option(names = "--no-products", description = "Drop block-diagonal matrices (products).")
    boolean noProducts;

    @Option(names = "--shard", paramLabel = "i/N", description = "Only shard i of N (0-based); shards are disjoint and cover the space.")
    String shard;

    @Option(names = "--count", description = "Print only counts: 'rows=R: N' per number of rows, then 'total: N'.")
    boolean count;

    @Option(names = "--out", paramLabel = "F", description = "Write the matrices to F instead of standard output.")
    Path outFile;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        Bounds bounds;
        RuleSet ruleSet;
        ShardSpec shardSpec;
        try {
            if (dim < 1 || dim > Bounds.MAX_DIM) {
                throw new IllegalArgumentException("dim must be in 1.." + Bounds.MAX_DIM + ", got " + dim);
            }
            Bounds d = Bounds.complete(dim);
            bounds = new Bounds(dim, or(minRows, d.minRows()), or(maxRows, d.maxRows()), or(maxCols, d.maxCols()),
                    or(maxN, d.maxN()), or(maxEntry, d.maxEntry()));
            ruleSet = RuleSet.byName(rules);
            if (noProducts) {
                ruleSet = ruleSet.withoutProducts();
            }
            shardSpec = shard == null ? ShardSpec.ALL : ShardSpec.parse(shard);
        } catch (IllegalArgumentException e) {
            err.println("winnow enumerate: " + e.getMessage());
            err.flush();
            return WinnowCli.EXIT_BAD_INPUT;
        }
        Enumerator enumerator = new Enumerator();
        if (count) {
            EnumerationCounts c = enumerator.count(bounds, ruleSet, shardSpec);
            PrintWriter out = spec.commandLine().getOut();
            for (int m = bounds.minRows(); m <= bounds.maxRows(); m++) {
                out.println("rows=" + m + ": " + c.rows(m));
            }
            out.println("total: " + c.total());
            out.flush();
            return 0;
        }
        Writer target;
        try {
            target = outFile == null
                    ? spec.commandLine().getOut()
                    : new BufferedWriter(Files.newBufferedWriter(outFile, StandardCharsets.UTF_8), 1 << 16);
        } catch (IOException e) {
            err.println("winnow enumerate: cannot write " + outFile + ": " + e.getMessage());
            err.flush();
            return WinnowCli.EXIT_BAD_INPUT;
        }
        boolean toFile = outFile != null;
        try (ProgressBar progress = progressBar()) {
            Writer w = target;
            enumerator.run(bounds, ruleSet, shardSpec, e -> {
                try {
                    w.write(e.toLine());
                    w.write('\n');
                } catch (IOException x) {
                    throw new UncheckedIOException(x);
                }
                if (progress != null) {
                    progress.step();
                }
            });
            if (toFile) {
                w.close();
            } else {
                w.flush();
            }
        } catch (IOException | UncheckedIOException e) {
            err.println("winnow enumerate: cannot write " + (outFile == null ? "standard output" : outFile)
                    + ": " + e.getMessage());
            err.flush();
            return 1;
        }
        return 0;
    }

    private static int or(Integer value, int fallback) {
        return value == null ? fallback : value;
    }

    /** Count and rate on stderr, only when a person is watching it. */
    private static ProgressBar progressBar() {
        if (!Terminal.stderrIsTerminal()) {
            return null;
        }
        return new ProgressBarBuilder().setTaskName("enumerate").setInitialMax(-1).showSpeed()
                .setConsumer(new ConsoleProgressBarConsumer(System.err)).build();
    }
}
