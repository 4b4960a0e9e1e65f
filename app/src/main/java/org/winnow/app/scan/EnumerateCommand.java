package org.winnow.app.scan;

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
import org.winnow.app.cli.CheckedOutput;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.Terminal;
import org.winnow.producer.Bounds;
import org.winnow.producer.EnumerationCounts;
import org.winnow.producer.Enumerator;
import org.winnow.producer.ExclusionSet;
import org.winnow.producer.ShardSpec;
import org.winnow.producer.source.EnumeratedSpace;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
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
public final class EnumerateCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    SpaceOptions space = new SpaceOptions();

    @Option(names = "--count", description = "Print only counts: 'rows=R: N' per number of rows, then 'total: N'.")
    boolean count;

    @Option(names = "--out", paramLabel = "F", description = "Write the matrices to F instead of standard output.")
    Path outFile;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads (default: the number of processors); the output is the same, byte for byte, "
                    + "for any number.")
    int threads = Runtime.getRuntime().availableProcessors();

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        EnumeratedSpace es;
        try {
            es = space.space();
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "enumerate", e.getMessage());
        }
        if (Limits.threadsProblem(threads) != null) {
            return Exit.badInput(err, "enumerate", Limits.threadsProblem(threads));
        }
        Bounds bounds = es.bounds();
        ExclusionSet exclusions = es.rules();
        ShardSpec shardSpec = es.shard();
        Enumerator enumerator = new Enumerator();
        if (count) {
            EnumerationCounts c = enumerator.count(bounds, exclusions, shardSpec, threads, () -> false);
            PrintWriter out = spec.commandLine().getOut();
            for (int m = bounds.minRows(); m <= bounds.maxRows(); m++) {
                out.println("rows=" + m + ": " + c.rows(m));
            }
            out.println("total: " + c.total());
            out.flush();
            return 0;
        }
        try (ProgressBar progress = progressBar()) {
            if (outFile == null) {
                PrintWriter out = spec.commandLine().getOut();
                write(enumerator, bounds, exclusions, shardSpec, threads, out, progress, () -> CheckedOutput.failed(out));
                if (CheckedOutput.failed(out)) {
                    throw new IOException("cannot write standard output (disk full, closed pipe or device error)");
                }
            } else {
                // Through a temporary name: a full disk must not leave a partial list under the final name.
                CheckedOutput.replace(outFile, w -> write(enumerator, bounds, exclusions, shardSpec, threads, w, progress,
                        () -> false));
            }
        } catch (IOException | UncheckedIOException e) {
            String reason = e instanceof UncheckedIOException u ? u.getCause().getMessage() : e.getMessage();
            err.println("winnow enumerate: " + (outFile == null ? "" : outFile + ": ") + reason
                    + "; the output is incomplete");
            err.flush();
            return Exit.STOPPED;
        }
        return 0;
    }

    /** How often (in lines) standard output is checked for a failed write, which a PrintWriter only remembers. */
    private static final int CHECK_EVERY = 4096;

    private static void write(Enumerator enumerator, Bounds bounds, ExclusionSet exclusions, ShardSpec shardSpec, int threads,
            Writer w,
            ProgressBar progress, java.util.function.BooleanSupplier failed) throws IOException {
        long[] lines = {0};
        enumerator.run(bounds, exclusions, shardSpec, threads, e -> {
            try {
                w.write(e.toLine());
                w.write('\n');
                if (++lines[0] % CHECK_EVERY == 0 && failed.getAsBoolean()) {
                    throw new IOException("cannot write standard output (disk full, closed pipe or device error)");
                }
            } catch (IOException x) {
                throw new UncheckedIOException(x);
            }
            if (progress != null) {
                progress.step();
            }
        });
        w.flush();
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
