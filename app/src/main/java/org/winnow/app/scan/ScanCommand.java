package org.winnow.app.scan;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import java.util.concurrent.atomic.AtomicReference;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.MetricsPortOption;
import org.winnow.app.cli.ProcessMetrics;
import org.winnow.app.cli.ProofBudget;
import org.winnow.app.cli.WinnowCli;
import org.winnow.pipeline.BadInputException;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.Keepable;
import org.winnow.pipeline.KeyLimitException;
import org.winnow.pipeline.SeenKeys;
import org.winnow.pipeline.local.LocalPipeline;
import org.winnow.pipeline.local.PipelineException;
import org.winnow.pipeline.text.LineTooLongException;
import org.winnow.producer.Bounds;
import org.winnow.producer.source.EnumeratedSpace;
import org.winnow.producer.source.EnumerationSource;
import org.winnow.producer.source.InputFileSource;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.rules.RangeRule;
import org.winnow.scorer.rules.RuleException;
import org.winnow.scorer.rules.RulesFile;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.CrashHook;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SinkOptions;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow scan}: the main job in one JVM. Candidates from an input file or straight from the
 * producer's enumeration of a bounded space (the options of {@code enumerate}),
 * scored by N threads with a frozen model and the keep rules, survivors written to a directory that a
 * rerun continues.
 */
@Command(name = "scan", mixinStandardHelpOptions = true, sortOptions = false,
        description = {
            "Score candidates with a frozen model and keep rules; write the survivors to DIR.",
            "Rerunning with the same DIR continues from the last committed point."})
public final class ScanCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--model", required = true, paramLabel = "M", description = "The frozen model (.wnm).")
    Path model;

    @Option(names = "--input", paramLabel = "F",
            description = "Configurations to scan, one a line; or give bounds (the enumerate options below) instead.")
    Path input;

    @Mixin
    SpaceOptions space = new SpaceOptions();

    @Option(names = "--keep", paramLabel = "INVARIANT=LO..HI",
            description = "Keep range (repeatable): h11, h21, h31, h22 (predicted); chi, rows, cols, dim, blocks (exact). "
                    + "LO.. and ..HI are one-sided; a single value means LO = HI; chi%%M=R keeps chi = R mod M.")
    List<String> keeps = new ArrayList<>();

    @Option(names = "--rules-file", paramLabel = "F",
            description = "Rules, one a line: 'keep INVARIANT=LO..HI', 'keep chi%%M=R', 'min-confidence X', 'novelty X'.")
    Path rulesFile;

    @Option(names = "--min-confidence", paramLabel = "X",
            description = "An unproved prediction rejects only with at least this confidence (default 0.85).")
    Double minConfidence;

    @Option(names = "--prove", paramLabel = "TIME",
            description = "Opt-in proof step: run the exact Hodge backend for up to TIME (200ms, 2s) on each candidate "
                    + "whose verdict rests on an unproved value a rule names; off by default. Counts of settled, "
                    + "unsettled and out-of-time candidates go to the manifest and the metrics.")
    String prove;

    @Option(names = "--novelty", paramLabel = "X",
            description = "A prediction rejects only with novelty below this (default 0.99).")
    Double novelty;

    @Option(names = "--out", required = true, paramLabel = "DIR", description = "The scan directory.")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Scorer threads (default: the number of processors).")
    Integer threads;

    @Option(names = "--enumerate-threads", paramLabel = "N",
            description = "With bounds: enumeration threads (default: the number of processors); the candidates and "
                    + "their order do not depend on it.")
    Integer enumerateThreads;

    @picocli.CommandLine.Mixin
    MetricsPortOption metrics = new MetricsPortOption();

    @Option(names = "--strict", description = "Fail on the first malformed input line instead of skipping it.")
    boolean strict;

    @Option(names = "--rejects", description = "Also write the rejected candidates with their reasons.")
    boolean rejects;

    @Option(names = "--lines-per-file", paramLabel = "N", description = "Survivor lines per file (default ${DEFAULT-VALUE}).")
    int linesPerFile = SinkOptions.DEFAULT_LINES_PER_FILE;

    @Option(names = "--queue", paramLabel = "N", description = "Capacity of each in-memory queue (default ${DEFAULT-VALUE}).")
    int queue = 1024;

    @Override
    public Integer call() throws InterruptedException {
        PrintWriter err = spec.commandLine().getErr();
        ScanJob.Settings settings;
        try {
            settings = settings();
        } catch (StartupException e) {
            return Exit.badInput(err, "scan", e.getMessage());
        }
        AtomicReference<StatusPrinter> printer = new AtomicReference<>();
        try (ProcessMetrics process = metrics.open(err, "scan")) {
            ScanJob.Outcome outcome;
            try {
                outcome = ScanJob.run(settings, process.registry(), Clock.systemUTC(), CrashHook.NONE, s -> printer.set(
                        StatusPrinter.start(s, System.err, System::nanoTime)));
            } finally {
                if (printer.get() != null) {
                    printer.get().close();
                }
            }
            summary(outcome.manifest());
            return 0;
        } catch (PipelineException e) {
            Throwable cause = e.getCause();
            if (cause instanceof BadInputException) {
                return Exit.badInput(err, "scan", input + " " + cause.getMessage() + " (--strict)");
            }
            if (cause instanceof LineTooLongException) {
                // The file grew such a line after the count (edited between a stop and the rerun).
                return Exit.badInput(err, "scan", "--input " + cause.getMessage());
            }
            if (cause instanceof KeyLimitException) {
                err.println("winnow scan: stopped: " + cause.getMessage() + "; what was committed stays, rerun to continue");
                err.flush();
                return 1;
            }
            err.println("winnow scan: stopped: " + cause);
            err.println("winnow scan: what was committed stays; rerun the same command to continue");
            err.flush();
            return 1;
        } catch (IOException e) {
            return Exit.badInput(err, "scan", e.getMessage());
        }
    }

    private void summary(Manifest m) {
        PrintWriter o = spec.commandLine().getOut();
        Manifest.Counts c = m.counts();
        o.printf(Locale.ROOT, "scan %s complete: %d candidates (%d duplicates, %d bad input lines), %d kept, %d rejected%n",
                m.runId(), c.candidates(), c.duplicates(), c.badInput(), c.kept(), c.rejected());
        c.keptByReason().forEach((k, v) -> {
            if (v > 0) {
                o.printf(Locale.ROOT, "  kept     %-28s %d%n", k, v);
            }
        });
        c.rejectedByReason().forEach((k, v) -> {
            if (v > 0) {
                o.printf(Locale.ROOT, "  rejected %-28s %d%n", k, v);
            }
        });
        o.printf("survivors: %s (%d files)%n", out, m.survivorFiles().size());
        o.flush();
    }

    /** A problem found before any work starts; its message is the one line the user sees. */
    private static final class StartupException extends Exception {
        private static final long serialVersionUID = 1L;

        StartupException(String message) {
            super(message);
        }
    }

    private ScanJob.Settings settings() throws StartupException {
        KeepRules rules = rules();
        if (threads != null && Limits.threadsProblem(threads) != null) {
            throw new StartupException(Limits.threadsProblem(threads));
        }
        if (enumerateThreads != null && Limits.threadsProblem("--enumerate-threads", enumerateThreads) != null) {
            // 100,000 threads took half a minute to start before anything was scored.
            throw new StartupException(Limits.threadsProblem("--enumerate-threads", enumerateThreads));
        }
        if (queue < 1) {
            throw new StartupException("--queue must be at least 1, got " + queue);
        }
        if (linesPerFile < 1) {
            throw new StartupException("--lines-per-file must be at least 1, got " + linesPerFile);
        }
        try {
            metrics.validate();
        } catch (IllegalArgumentException e) {
            throw new StartupException(e.getMessage());
        }
        if (input != null && space.given()) {
            throw new StartupException("give either --input F or bounds (--dim, --max-rows, ...), not both");
        }
        CandidateSource source;
        EnumeratedSpace enumerated = null;
        if (input == null) {
            if (!space.given()) {
                throw new StartupException("give --input F (a file of configurations) or bounds (--dim D and the "
                        + "other enumerate options)");
            }
            try {
                enumerated = space.space();
            } catch (IllegalArgumentException e) {
                throw new StartupException(e.getMessage());
            }
            source = new EnumerationSource(enumerated, EnumerationSource.COUNT_BUDGET, System::nanoTime,
                    enumerateThreads != null ? enumerateThreads : Runtime.getRuntime().availableProcessors());
        } else {
            if (Files.isDirectory(input)) {
                throw new StartupException("--input " + input + ": is a directory; give a file of configurations, "
                        + "one a line");
            }
            if (!Files.isReadable(input)) {
                throw new StartupException("--input " + input + ": no such readable file");
            }
            if (!Files.isRegularFile(input)) {
                // A pipe or a device could be read once at most, and the scan reads its input twice (the count
                // below, then the scan) and again on a rerun; /dev/zero would be read for ever.
                throw new StartupException("--input " + input + ": not a regular file (a pipe or a device); scan "
                        + "reads its input more than once, so give a file of configurations, one a line");
            }
            InputFileSource file = new InputFileSource(input);
            source = file;
            // The duplicate check holds every distinct key; refuse a file that may not fit now rather
            // than stop hours into the run. Its line count bounds its distinct candidates from above.
            long lines;
            try {
                lines = file.count();
            } catch (LineTooLongException e) {
                throw new StartupException("--input " + e.getMessage());
            } catch (IOException e) {
                throw new StartupException("--input " + input + ": cannot read (" + ScanFiles.describe(e) + ")");
            }
            if (lines == 0) {
                // A scan of nothing completed with exit 0, as if the file had been scanned and all rejected.
                throw new StartupException("--input " + input + ": no configuration in it (empty, or only blank, "
                        + "comment and header lines)");
            }
            long limit = SeenKeys.limitForThisHeap();
            if (lines > limit) {
                throw new StartupException("--input " + input + ": " + KeyLimitException.message(
                        String.format(Locale.ROOT, "%,d lines may hold more than", lines), limit));
            }
        }
        ModelScoring scoring;
        try {
            scoring = ModelScoring.load(model);
        } catch (IOException | RuntimeException e) {
            String msg = e.getMessage() == null ? e.toString() : e.getMessage();
            throw new StartupException("--model " + model + ": " + (msg.startsWith(model.toString()) ? msg.substring(
                    model.toString().length()).replaceFirst("^:\\s*", "") : msg));
        }
        if (enumerated != null && enumerated.bounds().dim() != scoring.dimension()) {
            // The model's neighbours do not vote on another dimension (novelty 1, confidence 0); the proved and
            // bounded values still hold. Said once, so that nobody reads the survivors as the model's opinion.
            PrintWriter err = spec.commandLine().getErr();
            err.println("winnow scan: note: --model " + model + " is of dimension " + scoring.dimension()
                    + " and the bounds of dimension " + enumerated.bounds().dim() + ": only proved and bounded values "
                    + "can reject, every other candidate is kept as novel");
            err.flush();
        }
        String pointless = pointlessRule(rules, enumerated);
        if (pointless != null) {
            throw new StartupException(pointless);
        }
        try {
            scoring = scoring.withProofBudget(ProofBudget.parse(prove), System::nanoTime);
        } catch (IllegalArgumentException e) {
            throw new StartupException(e.getMessage());
        }
        int workers = threads != null ? threads : Runtime.getRuntime().availableProcessors();
        return new ScanJob.Settings(source, input, enumerated, scoring, rules, out,
                new SinkOptions(linesPerFile, rejects),
                new LocalPipeline.Options(workers, queue, Math.max(8 * queue, 64)),
                strict ? BadInputPolicy.FAIL : BadInputPolicy.SKIP);
    }

    /**
     * A range that cannot do what it says for this scan, or null: a range wholly below what its invariant can
     * be; or, from bounds, a predicted invariant that no candidate of the bounds has (h21 exists from
     * three-folds on, h31 and h22 on four-folds), so the rule would keep everything as undecided, or an exact
     * range that no candidate of the bounds meets, so the scan would reject everything. All once ran to the end
     * with exit 0. An input file may hold candidates of any shape, so only the first kind is refused there.
     */
    static String pointlessRule(KeepRules rules, EnumeratedSpace enumerated) {
        for (RangeRule r : rules.ranges()) {
            Keepable k = r.invariant();
            // h11 of a Calabi-Yau is at least 1 (a Kahler class), the other Hodge numbers at least 0; every
            // matrix has a row, a column, a dimension and a block.
            long least = k == Keepable.H21 || k == Keepable.H31 || k == Keepable.H22 ? 0 : 1;
            if (k != Keepable.CHI && r.hi() < least) {
                return "rule '" + r + "': " + k.label() + " is never below " + least + ", so the rule would reject "
                        + "every candidate";
            }
            if (enumerated == null) {
                continue;
            }
            Bounds b = enumerated.bounds();
            int firstDim = k == Keepable.H21 ? 3 : k == Keepable.H31 || k == Keepable.H22 ? 4 : 1;
            if (!k.exact() && b.dim() < firstDim) {
                return "rule '" + r + "': the bounds hold " + b.dim() + "-folds, which have no " + k.label()
                        + " (it exists from dimension " + firstDim + " on), so the rule could never act";
            }
            if (!k.exact()) {
                continue;
            }
            long lo = k == Keepable.DIM ? b.dim() : k == Keepable.ROWS ? b.minRows() : k == Keepable.COLS ? 1 : 0;
            long hi = k == Keepable.DIM ? b.dim() : k == Keepable.ROWS ? b.maxRows() : k == Keepable.COLS ? b.maxCols() : -1;
            if (hi >= lo && (r.hi() < lo || r.lo() > hi)) {
                return "rule '" + r + "': every candidate of the bounds has " + k.label() + " in " + lo
                        + (hi > lo ? ".." + hi : "") + ", so the scan would reject them all";
            }
        }
        return null;
    }

    private KeepRules rules() throws StartupException {
        List<String> all = new ArrayList<>();
        OptionalDouble fileConfidence = OptionalDouble.empty();
        OptionalDouble fileNovelty = OptionalDouble.empty();
        try {
            if (rulesFile != null) {
                RulesFile.Contents c = RulesFile.read(rulesFile);
                all.addAll(c.keeps());
                fileConfidence = c.minConfidence();
                fileNovelty = c.noveltyGuard();
            }
        } catch (IOException e) {
            throw new StartupException("--rules-file " + rulesFile + ": cannot read (" + e.getMessage() + ")");
        } catch (RuleException e) {
            throw new StartupException(e.getMessage());
        }
        all.addAll(keeps);
        double conf = minConfidence != null ? minConfidence : fileConfidence.orElse(KeepRules.DEFAULT_MIN_CONFIDENCE);
        double nov = novelty != null ? novelty : fileNovelty.orElse(KeepRules.DEFAULT_NOVELTY_GUARD);
        try {
            return KeepRules.of(all, conf, nov);
        } catch (RuleException e) {
            throw new StartupException(e.getMessage());
        }
    }
}
