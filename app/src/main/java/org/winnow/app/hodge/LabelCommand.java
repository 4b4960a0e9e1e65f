package org.winnow.app.hodge;

import java.io.BufferedReader;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.WinnowCli;
import org.winnow.sink.ScanFiles;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.hodge.Status;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow label}: labels a file of configurations with computed Hodge numbers in the reference
 * format. Resumable: configurations whose canonical text is already in the output are skipped, and
 * every line is appended and flushed on its own, so a kill loses at most the lines in flight (a
 * torn last line is cut off on the next run). Refused configurations are reported on stderr and not
 * written: the reference holds labels only.
 */
@Command(name = "label", mixinStandardHelpOptions = true,
        description = {
            "Label configurations with exact (or proved-bounded) Hodge numbers into a reference TSV.",
            "Columns: config  h11  h21  [h31  h22]  status  source. Bounded values are written lo..hi. Rerunning "
                    + "with the same --out continues where the last run stopped."})
public final class LabelCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--in", required = true, paramLabel = "F", description = "Configurations, one a line ('#' comments).")
    Path in;

    @Option(names = "--out", required = true, paramLabel = "F", description = "The reference TSV to create or extend.")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: available processors).")
    int threads = Runtime.getRuntime().availableProcessors();

    private PrintWriter err;
    private int bad;

    @Override
    public Integer call() throws InterruptedException {
        err = spec.commandLine().getErr();
        try {
            return label();
        } catch (IOException e) {
            return failedWrite(e);
        } catch (java.io.UncheckedIOException e) {
            return failedWrite(e.getCause());
        } catch (IllegalStateException e) {
            if (e.getCause() instanceof java.io.UncheckedIOException u) {
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
        Set<String> done = new HashSet<>();
        Boolean fourfoldColumns = readExisting(done);
        Map<String, Configuration> pending = new LinkedHashMap<>();
        int skipped = 0;
        if (Files.isDirectory(in)) {
            return Exit.badInput(err, "label", in + ": is a directory; give a file of configurations, one a line");
        }
        // Bytes that are not UTF-8 become U+FFFD: that line is refused with its number, the rest is read.
        try (BufferedReader reader = new BufferedReader(new java.io.InputStreamReader(Files.newInputStream(in),
                StandardCharsets.UTF_8.newDecoder().onMalformedInput(java.nio.charset.CodingErrorAction.REPLACE)
                        .onUnmappableCharacter(java.nio.charset.CodingErrorAction.REPLACE)), 1 << 16)) {
            String line;
            int number = 0;
            while ((line = reader.readLine()) != null) {
                number++;
                String body = ConfigurationText.stripComment(line);
                if (body == null) {
                    continue;
                }
                Optional<Configuration> c = parse(body.strip(), number);
                if (c.isEmpty()) {
                    continue;
                }
                Configuration canonical = c.get().canonical();
                String key = canonical.toText();
                if (done.contains(key) || pending.containsKey(key)) {
                    skipped++;
                } else {
                    pending.put(key, canonical);
                }
            }
        } catch (NoSuchFileException e) {
            return Exit.badInput(err, "label", in + ": no such file");
        }
        if (fourfoldColumns == null) {
            fourfoldColumns = pending.values().stream().anyMatch(c -> c.dimension() == 4);
        }
        boolean wide = fourfoldColumns;
        AtomicInteger exact = new AtomicInteger();
        AtomicInteger bounded = new AtomicInteger();
        AtomicInteger refused = new AtomicInteger();
        try (BufferedWriter writer = openForAppend(wide);
                ProgressBar progress = progressBar(pending.size())) {
            ThreadLocal<HodgeEngine> engines = ThreadLocal.withInitial(HodgeEngine::standard);
            ExecutorService pool = Executors.newFixedThreadPool(threads);
            try {
                List<Future<?>> futures = new ArrayList<>();
                for (Configuration c : pending.values()) {
                    futures.add(pool.submit(() -> {
                        HodgeResult r = engines.get().compute(c);
                        synchronized (writer) {
                            if (r.status() == Status.REFUSED || (r.dim() == 4) != wide) {
                                refused.incrementAndGet();
                                err.println("winnow label: " + c.toText() + ": not labelled: "
                                        + (r.status() == Status.REFUSED ? r.reason()
                                                : "dimension " + r.dim() + " does not match the file's columns; label "
                                                        + "four-folds and lower dimensions into separate files"));
                                err.flush();
                            } else {
                                (r.status() == Status.EXACT ? exact : bounded).incrementAndGet();
                                writeLine(writer, HodgeFormat.tsv(c, r, wide));
                            }
                            if (progress != null) {
                                progress.step();
                            }
                        }
                        return null;
                    }));
                }
                for (Future<?> f : futures) {
                    f.get();
                }
            } catch (ExecutionException e) {
                throw new IllegalStateException("labelling failed: " + e.getCause(), e.getCause());
            } finally {
                pool.shutdownNow();
            }
        }
        err.printf("winnow label: %d labelled (%d exact, %d bounded), %d refused, %d already labelled or repeated%n",
                exact.get() + bounded.get(), exact.get(), bounded.get(), refused.get(), skipped);
        err.flush();
        return bad == 0 ? 0 : Exit.BAD_INPUT;
    }

    private static void writeLine(BufferedWriter writer, String line) {
        try {
            writer.write(line);
            writer.write('\n');
            writer.flush();
        } catch (IOException e) {
            throw new java.io.UncheckedIOException("cannot append to the reference file", e);
        }
    }

    private Optional<Configuration> parse(String input, int number) {
        Configuration c;
        try {
            c = ConfigurationText.parse(input, number);
        } catch (ConfigurationFormatException e) {
            reportBad(number, input, e.getMessage());
            return Optional.empty();
        }
        Optional<String> problem = ConfigurationValidator.problemForCalabiYau(c);
        if (problem.isPresent()) {
            reportBad(number, input, problem.get());
            return Optional.empty();
        }
        if (c.dimension() < 2) {
            reportBad(number, input, "dimension " + c.dimension() + ": Hodge numbers need dimension 2, 3 or 4");
            return Optional.empty();
        }
        return Optional.of(c);
    }

    private void reportBad(int number, String input, String reason) {
        bad++;
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
        List<String> lines = Files.readAllLines(out, StandardCharsets.UTF_8);
        if (lines.isEmpty()) {
            return null;
        }
        String header = lines.get(0);
        if (!header.equals(HodgeFormat.HEADER) && !header.equals(HodgeFormat.HEADER_4)) {
            throw new IllegalArgumentException(out + " is not a reference file (header '" + header + "')");
        }
        for (String line : lines.subList(1, lines.size())) {
            int tab = line.indexOf('\t');
            if (tab > 0) {
                done.add(line.substring(0, tab));
            }
        }
        return header.equals(HodgeFormat.HEADER_4);
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

    private ProgressBar progressBar(int total) {
        if (System.console() == null) {
            return null;
        }
        return new ProgressBarBuilder().setTaskName("label").setInitialMax(total)
                .setConsumer(new ConsoleProgressBarConsumer(System.err)).build();
    }
}
