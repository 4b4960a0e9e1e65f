package org.winnow.app.hodge;

import java.io.IOException;
import java.io.PrintWriter;
import java.util.ArrayDeque;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.WinnowCli;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow hodge}: exact Hodge numbers of Calabi-Yau configuration matrices. Unparsable input
 * and input that is not Calabi-Yau of dimension 2..4 get one line on stderr (exit code 2); every
 * other input gets one result line, refused results included (a product, for example).
 */
@Command(name = "hodge", mixinStandardHelpOptions = true,
        description = {
            "Compute the Hodge numbers of Calabi-Yau configuration matrices, exactly or as proved bounds.",
            "K3: h11; three-folds: h11, h21; four-folds: h11, h21, h31, h22. Each result is exact, bounded (proved "
                    + "intervals) or refused. Computed on the canonical form; the method is the strongest tool "
                    + "needed (dimensions, d1, transferred)."})
public final class HodgeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--json", description = "One JSON object a line instead of text for humans.")
    boolean json;

    @picocli.CommandLine.Mixin
    ConfigurationInputs inputs = new ConfigurationInputs();

    @Option(names = "--summary",
            description = "After the results, print survey statistics (counts by status and method, timings) on stderr.")
    boolean summary;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads (default 1); results keep the input order.")
    int threads = 1;

    private record Job(String input, Configuration canonical) {}

    /**
     * Results in flight, oldest first. Each is printed and dropped as soon as it is the oldest and done, so
     * memory is bounded by {@link #WINDOW} whatever the size of the input (a million four-folds once held
     * every result to the end: 4.2 GB).
     */
    private final ArrayDeque<Pending> inFlight = new ArrayDeque<>();
    private static final int PER_THREAD = 256;
    private int window;
    private ExecutorService pool;
    private ThreadLocal<HodgeEngine> engines;
    private final HodgeSummary stats = new HodgeSummary();

    private record Pending(Job job, Future<HodgeResult> result) {}

    private PrintWriter out;
    private PrintWriter err;
    private int bad;

    @Override
    public Integer call() {
        out = spec.commandLine().getOut();
        err = spec.commandLine().getErr();
        if (Limits.threadsProblem(threads) != null) {
            return Exit.badInput(err, "hodge", Limits.threadsProblem(threads));
        }
        if (inputs.isEmpty()) {
            return Exit.badInput(err, "hodge", "no configuration given (pass CONFIG arguments or --file F)");
        }
        window = threads * PER_THREAD;
        engines = ThreadLocal.withInitial(HodgeEngine::standard);
        pool = Executors.newFixedThreadPool(threads);
        try {
            inputs.forEach(this::process, (name, reason) -> reportBad(name, "", reason), name -> null);
            err.flush();
            while (!inFlight.isEmpty()) {
                printOldest();
            }
            if (summary) {
                stats.print(err);
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } catch (ExecutionException e) {
            throw new IllegalStateException("Hodge computation failed: " + e.getCause(), e.getCause());
        } finally {
            pool.shutdownNow();
        }
        out.flush();
        err.flush();
        return bad == 0 ? 0 : Exit.BAD_INPUT;
    }

    private void submit(Job job) {
        inFlight.addLast(new Pending(job, pool.submit(() -> engines.get().compute(job.canonical()))));
        if (inFlight.size() > window) {
            try {
                printOldest();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new java.util.concurrent.CancellationException("interrupted");
            } catch (ExecutionException e) {
                throw new IllegalStateException("Hodge computation failed: " + e.getCause(), e.getCause());
            }
        }
    }

    private void printOldest() throws InterruptedException, ExecutionException {
        Pending p = inFlight.removeFirst();
        HodgeResult r = p.result().get();
        stats.add(r);
        out.println(json ? HodgeFormat.json(p.job().input(), p.job().canonical(), r)
                : HodgeFormat.text(p.job().input(), p.job().canonical(), r));
        out.flush();
    }

    private void process(String text, int lineNumber, String source) {
        String input = text.strip();
        Configuration c;
        try {
            c = ConfigurationText.parse(input, lineNumber);
        } catch (ConfigurationFormatException e) {
            reportBad(source, input, e.getMessage());
            return;
        }
        Optional<String> problem = ConfigurationValidator.problemForCalabiYau(c);
        if (problem.isPresent()) {
            reportBad(source, input, problem.get());
            return;
        }
        if (c.dimension() < 2) {
            reportBad(source, input, "dimension " + c.dimension() + ": Hodge numbers need dimension 2, 3 or 4");
            return;
        }
        submit(new Job(input, c.canonical()));
    }

    private void reportBad(String source, String input, String reason) {
        bad++;
        String what = input.isEmpty() ? source : source + " '" + Limits.excerpt(input) + "'";
        err.println("winnow hodge: " + what + ": " + reason);
    }
}
