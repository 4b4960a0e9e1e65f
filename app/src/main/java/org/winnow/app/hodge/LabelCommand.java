package org.winnow.app.hodge;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.io.RandomAccessFile;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.Callable;
import java.util.concurrent.CancellationException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.Consumer;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.Terminal;
import org.winnow.app.scan.SpaceOptions;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.hodge.Status;
import org.winnow.pipeline.text.BoundedLineReader;
import org.winnow.pipeline.text.LineTooLongException;
import org.winnow.producer.Enumerator;
import org.winnow.producer.source.EnumeratedSpace;
import org.winnow.sink.ScanFiles;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow label}: labels configurations with computed Hodge numbers in the reference format, from a
 * file or straight from the producer's enumeration of a space (the bounds of {@code enumerate}), with no
 * file in between. Resumable: configurations whose canonical text is already in the output are skipped,
 * and every line is appended and flushed on its own, so a kill loses at most the lines in flight (a torn
 * last line is cut off on the next run). Refused configurations are reported on stderr and not written:
 * the reference holds labels only. Products are labelled (method product) with the source {@code product}.
 *
 * <p>Work flows through a bounded queue from one reader (the file, or the enumeration on its own worker
 * threads) to the Hodge workers, so what is held per configuration is the queue alone, whatever the size
 * of the space, and the enumeration overlaps with the labelling. The one set that grows is that of the
 * configurations already in the output (for resumption) and, for a file, of those read so far (a file may
 * repeat a class; an enumeration never does). Lines are written in the order they finish.
 */
@Command(name = "label", mixinStandardHelpOptions = true,
        description = {
            "Label configurations with exact (or proved-bounded) Hodge numbers into a reference TSV.",
            "Columns: config  h11  h21  [h31  h22]  status  source. Bounded values are written lo..hi; products "
                    + "have the source product. Input: --in F, or the bounds of 'enumerate' (--dim 4 ...) to label a "
                    + "space with no file in between. Rerunning with the same --out continues where the last run "
                    + "stopped."})
public final class LabelCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--in", paramLabel = "F", description = "Configurations, one a line ('#' comments).")
    Path in;

    @Mixin
    SpaceOptions space = new SpaceOptions();

    @Option(names = "--out", required = true, paramLabel = "F", description = "The reference TSV to create or extend.")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Hodge worker threads (default: available processors).")
    int threads = Runtime.getRuntime().availableProcessors();

    @Option(names = "--enumerate-threads", paramLabel = "N",
            description = "With bounds: enumeration threads (default: available processors).")
    int enumerateThreads = Runtime.getRuntime().availableProcessors();

    @Option(names = "--expect", paramLabel = "N",
            description = "With bounds: how many matrices the space holds, when known (from 'enumerate --count'), for "
                    + "an ETA from the start; without it the ETA appears when the enumeration has ended.")
    Long expect;

    /** Milliseconds between the plain status lines written when stderr is not a terminal; hidden, for tests. */
    @Option(names = "--status-every-ms", hidden = true, paramLabel = "MS")
    long statusEveryMs = 10_000;

    /** Marks the end of the queue for one worker; never a real input (its identity is what counts). */
    private static final Configuration END = Configuration.parse("4:5");

    private static final int QUEUE = 4096;

    private PrintWriter err;

    @Override
    public Integer call() throws InterruptedException {
        err = spec.commandLine().getErr();
        try {
            return label();
        } catch (LineTooLongException e) {
            return Exit.badInput(err, "label", e.getMessage());
        } catch (IOException e) {
            return failedWrite(e);
        } catch (UncheckedIOException e) {
            return failedWrite(e.getCause());
        } catch (IllegalStateException e) {
            if (e.getCause() instanceof UncheckedIOException u) {
                return failedWrite(u.getCause());
            }
            if (e.getCause() instanceof IOException io) {
                return failedWrite(io);
            }
            throw e;
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "label", e.getMessage());
        }
    }

    /** A failed read or write (a full disk, a directory in the way): one line; what was appended stays. */
    private int failedWrite(IOException e) {
        err.println("winnow label: " + out + ": " + ScanFiles.describe(e)
                + "; the lines written so far stay, rerun the same command to continue");
        err.flush();
        return Exit.STOPPED;
    }

    private int label() throws IOException, InterruptedException {
        if (Limits.threadsProblem(threads) != null) {
            return Exit.badInput(err, "label", Limits.threadsProblem(threads));
        }
        if (Limits.threadsProblem("--enumerate-threads", enumerateThreads) != null) {
            return Exit.badInput(err, "label", Limits.threadsProblem("--enumerate-threads", enumerateThreads));
        }
        if ((in == null) == !space.given()) {
            return Exit.badInput(err, "label", "give either --in F or the bounds of a space (--dim D ...), not "
                    + (in == null ? "neither" : "both"));
        }
        if (expect != null && (in != null || expect < 0)) {
            return Exit.badInput(err, "label", "--expect goes with bounds and must be at least 0, got " + expect
                    + (in != null ? " with --in" : ""));
        }
        if (statusEveryMs < 1) {
            return Exit.badInput(err, "label", "--status-every-ms must be at least 1, got " + statusEveryMs);
        }
        EnumeratedSpace es = null;
        if (in == null) {
            es = space.space();
            if (es.bounds().dim() < 2) {
                return Exit.badInput(err, "label", "dimension " + es.bounds().dim()
                        + ": Hodge numbers need dimension 2, 3 or 4");
            }
        } else if (Files.isDirectory(in)) {
            return Exit.badInput(err, "label", in + ": is a directory; give a file of configurations, one a line");
        } else if (!Files.exists(in)) {
            return Exit.badInput(err, "label", in + ": no such file");
        } else if (!Files.isRegularFile(in)) {
            // The input is read twice (a count for the progress, then the labelling) and again on a rerun.
            return Exit.badInput(err, "label", in + ": not a regular file (a pipe or a device); label reads its "
                    + "input more than once, so give a file of configurations, one a line");
        }
        long startNanos = System.nanoTime();
        Set<String> done = new HashSet<>();
        Boolean fourfoldColumns = readExisting(done);
        Counts counts = new Counts();
        long total;
        boolean wide;
        if (es == null) {
            // A cheap first pass: the total for the ETA and, for a new output, whether it needs four-fold columns.
            FilePass pass = prepass();
            if (pass.lines() == 0) {
                // Exit 0 and a header-only output would pass for a finished labelling.
                return Exit.badInput(err, "label", in + ": no configuration in it (empty, or only blank and comment "
                        + "lines); nothing to label");
            }
            total = pass.lines();
            wide = fourfoldColumns != null ? fourfoldColumns : pass.firstFourfold() != null;
            // Rows of another dimension than the columns were once refused one by one while the rest were
            // labelled, with exit 0: easy to miss in a long run. Refused up front now, nothing written.
            if (pass.firstFourfold() != null && pass.firstLower() != null) {
                Sighting later = pass.firstFourfold().line() > pass.firstLower().line() ? pass.firstFourfold()
                        : pass.firstLower();
                Sighting earlier = later == pass.firstFourfold() ? pass.firstLower() : pass.firstFourfold();
                return Exit.badInput(err, "label", in + " mixes dimensions: " + later + " after " + earlier
                        + "; four-folds have other columns (h31 h22), so label them into a file of their own");
            }
            Sighting other = wide ? pass.firstLower() : pass.firstFourfold();
            if (other != null) {
                return Exit.badInput(err, "label", in + " " + other + " does not fit the " + (wide ? "four-fold"
                        : "three-fold") + " columns of " + out + "; label it into another --out");
            }
        } else {
            boolean four = es.bounds().dim() == 4;
            if (fourfoldColumns != null && fourfoldColumns != four) {
                return Exit.badInput(err, "label", out + " has " + (fourfoldColumns ? "four-fold" : "three-fold")
                        + " columns but the space has dimension " + es.bounds().dim());
            }
            wide = four;
            total = expect == null ? -1 : expect;
        }
        BlockingQueue<Configuration> queue = new ArrayBlockingQueue<>(QUEUE);
        AtomicReference<Throwable> failure = new AtomicReference<>();
        long enumerated = -1;
        try (BufferedWriter writer = openForAppend(wide)) {
            List<Thread> workers = new ArrayList<>();
            for (int i = 0; i < threads; i++) {
                Thread t = new Thread(() -> work(queue, writer, wide, counts, failure), "label-" + i);
                t.setDaemon(true);
                workers.add(t);
                t.start();
            }
            Progress progress = new Progress(counts, total, startNanos, statusEveryMs, err);
            try {
                Consumer<Configuration> offer = c -> {
                    try {
                        while (!queue.offer(c, 200, TimeUnit.MILLISECONDS)) {
                            if (failure.get() != null) {
                                throw new CancellationException("a worker failed");
                            }
                        }
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                        throw new CancellationException("interrupted");
                    }
                };
                if (es == null) {
                    readInput(done, offer, counts);
                } else {
                    enumerated = new Enumerator().run(es.bounds(), es.rules(), es.shard(), enumerateThreads, e -> {
                        counts.enumerated.incrementAndGet();
                        if (done.contains(e.text())) {
                            counts.skipped.incrementAndGet();
                        } else {
                            offer.accept(e.configuration());
                        }
                    });
                    progress.total(enumerated);
                }
            } catch (CancellationException e) {
                if (failure.get() == null) {
                    throw e;
                }
            } finally {
                // Workers that failed keep taking until END, so these puts never block for good.
                for (int i = 0; i < threads; i++) {
                    queue.put(END);
                }
                for (Thread t : workers) {
                    t.join();
                }
                progress.close();
            }
        }
        Throwable f = failure.get();
        if (f instanceof RuntimeException r) {
            throw r;
        }
        if (f != null) {
            throw new IllegalStateException("labelling failed: " + f, f);
        }
        err.printf(Locale.ROOT, "winnow label: %d labelled (%d exact, %d bounded; %d of them products), %d refused, %d"
                + " already labelled or repeated; %.1f s wall%n", counts.exact.get() + counts.bounded.get(),
                counts.exact.get(), counts.bounded.get(), counts.products.get(), counts.refused.get(),
                counts.skipped.get(), (System.nanoTime() - startNanos) / 1e9);
        if (expect != null && enumerated != expect) {
            err.printf(Locale.ROOT, "winnow label: note: the space held %d matrices, --expect said %d%n", enumerated,
                    expect);
        }
        err.flush();
        return counts.bad.get() == 0 ? 0 : Exit.BAD_INPUT;
    }

    /** Counters shared by the reader, the workers and the status line. */
    static final class Counts {
        final AtomicLong exact = new AtomicLong();
        final AtomicLong bounded = new AtomicLong();
        final AtomicLong refused = new AtomicLong();
        final AtomicLong products = new AtomicLong();
        final AtomicLong skipped = new AtomicLong();
        final AtomicLong bad = new AtomicLong();
        final AtomicLong enumerated = new AtomicLong();

        /** Inputs dealt with, whichever way: the progress numerator, comparable with the count of inputs. */
        long settled() {
            return exact.get() + bounded.get() + refused.get() + skipped.get() + bad.get();
        }
    }

    private void work(BlockingQueue<Configuration> queue, BufferedWriter writer, boolean wide, Counts counts,
            AtomicReference<Throwable> failure) {
        HodgeEngine engine = HodgeEngine.standard();
        try {
            while (true) {
                Configuration c = queue.take();
                if (c == END) {
                    return;
                }
                if (failure.get() != null) {
                    continue;
                }
                HodgeResult r = engine.compute(c);
                if (r.status() == Status.REFUSED || (r.dim() == 4) != wide) {
                    counts.refused.incrementAndGet();
                    err.println("winnow label: " + c.toText() + ": not labelled: "
                            + (r.status() == Status.REFUSED ? r.reason()
                                    : "dimension " + r.dim() + " does not match the file's columns; label "
                                            + "four-folds and lower dimensions into separate files"));
                    err.flush();
                    continue;
                }
                String line = HodgeFormat.tsv(c, r, wide);
                synchronized (writer) {
                    writeLine(writer, line);
                }
                if (r.isProduct()) {
                    counts.products.incrementAndGet();
                }
                (r.status() == Status.EXACT ? counts.exact : counts.bounded).incrementAndGet();
            }
        } catch (Throwable e) {
            failure.compareAndSet(null, e);
            try {
                while (queue.take() != END) {
                    // Drain, so that the reader never waits on a full queue.
                }
            } catch (InterruptedException x) {
                Thread.currentThread().interrupt();
            }
        }
    }

    private static BoundedLineReader open(Path file) throws IOException {
        // Bytes that are not UTF-8 become U+FFFD: that line is refused with its number, the rest is read.
        return BoundedLineReader.open(file);
    }

    /** A line of the input: its number, its text and the dimension of its configuration. */
    private record Sighting(int line, String text, int dim) {
        @Override
        public String toString() {
            return "line " + line + " '" + Limits.excerpt(text) + "' (dimension " + dim + ")";
        }
    }

    /** The count of input lines that are not comments, and the first four-fold and first lower-dimension line. */
    private record FilePass(long lines, Sighting firstFourfold, Sighting firstLower) {}

    /**
     * Counts the input lines that are not comments and finds the first four-fold and the first configuration
     * of a lower dimension among the lines that will be labelled, so that a file mixing them (whose rows
     * cannot share one set of columns) is refused before any work.
     */
    private FilePass prepass() throws IOException {
        long lines = 0;
        int number = 0;
        Sighting four = null;
        Sighting lower = null;
        try (BoundedLineReader reader = open(in)) {
            String line;
            while ((line = reader.readLine()) != null) {
                number++;
                String body = ConfigurationText.stripComment(line);
                if (body == null) {
                    continue;
                }
                lines++;
                if (four != null && lower != null) {
                    continue;
                }
                String text = body.strip();
                Configuration c;
                try {
                    c = ConfigurationText.parse(text, number);
                } catch (ConfigurationFormatException e) {
                    continue; // reported with its line number by the main pass
                }
                if (ConfigurationValidator.problemForCalabiYau(c).isPresent() || c.dimension() < 2) {
                    continue; // likewise
                }
                if (c.dimension() == 4 && four == null) {
                    four = new Sighting(number, text, 4);
                } else if (c.dimension() < 4 && lower == null) {
                    lower = new Sighting(number, text, c.dimension());
                }
            }
        } catch (NoSuchFileException e) {
            throw new IllegalArgumentException(in + ": no such file", e);
        }
        return new FilePass(lines, four, lower);
    }

    private void readInput(Set<String> done, Consumer<Configuration> offer, Counts counts) throws IOException {
        try (BoundedLineReader reader = open(in)) {
            String line;
            int number = 0;
            while ((line = reader.readLine()) != null) {
                number++;
                String body = ConfigurationText.stripComment(line);
                if (body == null) {
                    continue;
                }
                Optional<Configuration> c = parse(body.strip(), number, counts);
                if (c.isEmpty()) {
                    continue;
                }
                Configuration canonical = c.get().canonical();
                if (done.add(canonical.toText())) {
                    offer.accept(canonical);
                } else {
                    counts.skipped.incrementAndGet();
                }
            }
        }
    }

    private static void writeLine(BufferedWriter writer, String line) {
        try {
            writer.write(line);
            writer.write('\n');
            writer.flush();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot append to the reference file", e);
        }
    }

    private Optional<Configuration> parse(String input, int number, Counts counts) {
        Configuration c;
        try {
            c = ConfigurationText.parse(input, number);
        } catch (ConfigurationFormatException e) {
            reportBad(number, input, e.getMessage(), counts);
            return Optional.empty();
        }
        Optional<String> problem = ConfigurationValidator.problemForCalabiYau(c);
        if (problem.isPresent()) {
            reportBad(number, input, problem.get(), counts);
            return Optional.empty();
        }
        if (c.dimension() < 2) {
            reportBad(number, input, "dimension " + c.dimension() + ": Hodge numbers need dimension 2, 3 or 4", counts);
            return Optional.empty();
        }
        return Optional.of(c);
    }

    private void reportBad(int number, String input, String reason, Counts counts) {
        counts.bad.incrementAndGet();
        err.println("winnow label: " + in + " line " + number + " '" + Limits.excerpt(input) + "': " + reason);
    }

    /**
     * Reads the labelled configurations of an existing output into {@code done} after cutting off a
     * torn last line; returns whether it has four-fold columns, or null if there is no output yet.
     */
    private Boolean readExisting(Set<String> done) throws IOException {
        if (!Files.exists(out) || Files.size(out) == 0) {
            return null;
        }
        try (RandomAccessFile raf = new RandomAccessFile(out.toFile(), "rw")) {
            long len = raf.length();
            long keep = len;
            while (keep > 0) {
                raf.seek(keep - 1);
                if (raf.read() == '\n') {
                    break;
                }
                keep--;
            }
            if (keep < len) {
                raf.setLength(keep);
            }
        }
        // Bytes that are not UTF-8 become U+FFFD, so a damaged line is named by its number rather than ending
        // the run with "Input length = 1" and the advice to rerun, which failed the same way.
        try (BoundedLineReader reader = open(out)) {
            String header = reader.readLine();
            if (header == null) {
                return null;
            }
            if (!header.equals(HodgeFormat.HEADER) && !header.equals(HodgeFormat.HEADER_4)) {
                throw new IllegalArgumentException(out + " is not a reference file (header '"
                        + Limits.excerpt(header) + "')");
            }
            int fields = header.split("\t", -1).length;
            String line;
            int number = 1;
            while ((line = reader.readLine()) != null) {
                number++;
                int found = line.split("\t", -1).length;
                if (found != fields || line.indexOf('\uFFFD') >= 0) {
                    // A row this command did not write whole would be taken as labelled and never redone.
                    throw new IllegalArgumentException(out + " line " + number + " '" + Limits.excerpt(line)
                            + "': damaged (" + (found != fields ? found + " tab-separated fields, expected " + fields
                            : "bytes that are not UTF-8") + "); fix or delete that line, then rerun");
                }
                done.add(line.substring(0, line.indexOf('\t')));
            }
            return header.equals(HodgeFormat.HEADER_4);
        }
    }

    private BufferedWriter openForAppend(boolean wide) throws IOException {
        boolean fresh = !Files.exists(out) || Files.size(out) == 0;
        BufferedWriter w = new BufferedWriter(new OutputStreamWriter(Files.newOutputStream(out,
                StandardOpenOption.CREATE, StandardOpenOption.APPEND), StandardCharsets.UTF_8));
        if (fresh) {
            w.write(wide ? HodgeFormat.HEADER_4 : HodgeFormat.HEADER);
            w.write('\n');
            w.flush();
        }
        return w;
    }

    /**
     * Progress on stderr: a bar with an ETA on a terminal, else a plain line every {@code periodMs}. From
     * bounds without {@code --expect} the total is known only once the enumeration has ended; until then
     * the status shows the count, the rate and how far the enumeration has got, and no ETA.
     */
    static final class Progress {
        private final Thread thread;
        private volatile long total;
        private volatile long lastLineNanos;
        private final boolean terminal;
        private final Counts counts;
        private final long startNanos;
        private final long periodMs;
        private final PrintWriter plain;

        Progress(Counts counts, long total, long startNanos, long periodMs, PrintWriter plain) {
            this.total = total;
            this.counts = counts;
            this.startNanos = startNanos;
            this.periodMs = periodMs;
            this.plain = plain;
            this.lastLineNanos = startNanos;
            terminal = Terminal.stderrIsTerminal();
            thread = new Thread(() -> {
                try {
                    if (terminal) {
                        try (ProgressBar bar = new ProgressBarBuilder().setTaskName("label").setInitialMax(this.total)
                                .showSpeed().setConsumer(new ConsoleProgressBarConsumer(System.err)).build()) {
                            try {
                                while (!Thread.currentThread().isInterrupted()) {
                                    if (this.total >= 0 && bar.getMax() != this.total) {
                                        bar.maxHint(this.total);
                                    }
                                    bar.setExtraMessage(this.total < 0 ? "enumerated " + counts.enumerated.get() : "");
                                    bar.stepTo(counts.settled());
                                    Thread.sleep(1_000);
                                }
                            } finally {
                                bar.stepTo(counts.settled());
                            }
                        }
                    } else {
                        while (true) {
                            Thread.sleep(periodMs);
                            printLine();
                        }
                    }
                } catch (InterruptedException e) {
                    // The run is over.
                }
            }, "label-progress");
            thread.setDaemon(true);
            thread.start();
        }

        void total(long t) {
            total = t;
        }

        private synchronized void printLine() {
            plain.println(line(counts, total, startNanos, System.nanoTime()));
            plain.flush();
            lastLineNanos = System.nanoTime();
        }

        /**
         * Stops the status; when piped, a last status line if a whole period has passed since the last one,
         * so that a log has one at least every period however the thread was scheduled.
         */
        void close() throws InterruptedException {
            thread.interrupt();
            thread.join(2_000);
            if (!terminal && System.nanoTime() - lastLineNanos >= periodMs * 1_000_000L) {
                printLine();
            }
        }

        static String line(Counts counts, long total, long startNanos, long nowNanos) {
            double seconds = (nowNanos - startNanos) / 1e9;
            long settled = counts.settled();
            double rate = settled / Math.max(seconds, 1e-9);
            // Until the first input is settled there is no rate to show, and an ETA from a rate of 0 is endless.
            boolean measured = settled > 0;
            String of = total >= 0
                    ? String.format(Locale.ROOT, " of %d (%.1f%%), ETA %s s", total, 100.0 * settled / Math.max(total, 1),
                            measured ? String.format(Locale.ROOT, "%.0f", Math.max(0, total - settled) / rate) : "--")
                    : " (enumerated " + counts.enumerated.get() + ", total not known yet)";
            return String.format(Locale.ROOT, "winnow label: %d done%s, %s/s, %.0f s", settled, of,
                    measured ? String.format(Locale.ROOT, "%.0f", rate) : "--", seconds);
        }
    }
}
