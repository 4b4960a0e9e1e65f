package org.winnow.app.scan;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import org.winnow.sink.ScanDirectory;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SurvivorLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine;

/**
 * {@code winnow demo}: the main job on the built-in demo data. It scans the three-fold space (or with
 * {@code --dim 4} the four-fold space) straight from the producer's enumeration with the shipped frozen
 * model and rules file of that dimension, and summarises the survivors. It is the same code path a
 * researcher runs with {@code scan --dim D}; no candidates file is written, because the scan's survivors
 * and rejects already name every matrix of the space.
 */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = "Scan the built-in demo space (all three-fold configuration matrices, or with --dim 4 all "
                + "four-fold ones, rule set lossless) with the shipped model and rules, and summarise the survivors.")
public final class DemoCommand implements Callable<Integer> {
    /** The shipped files of each demo: model, rules, and the words for its space. */
    private record Demo(String model, String rules, String space) {}

    private static final Demo THREEFOLDS = new Demo("threefolds-1pct.wnm", "rules.txt", "three-fold");
    private static final Demo FOURFOLDS = new Demo("fourfolds-1pct.wnm", "rules-fourfolds.txt", "four-fold");

    @Option(names = "--dim", paramLabel = "D",
            description = "3 (default): the three-fold demo; 4: the four-fold demo (1,073,425 matrices, minutes).")
    int dim = 3;

    @Option(names = "--max-rows", paramLabel = "M",
            description = "Only the matrices with at most M rows: a quicker look at a part of the space.")
    Integer maxRows;

    @Option(names = "--out", paramLabel = "DIR", description = "Where the demo run goes (default ${DEFAULT-VALUE}).")
    Path out = Path.of("demo-out");

    @Option(names = "--data", paramLabel = "DIR",
            description = "The demo data folder (default: demo-data beside the launcher, else ./demo-data).")
    Path data;

    @Option(names = "--threads", paramLabel = "N", description = "Scorer threads (default: the number of processors).")
    Integer threads;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter o = spec.commandLine().getOut();
        if (dim != 3 && dim != 4) {
            return Exit.badInput(err, "demo", "--dim must be 3 or 4, got " + dim);
        }
        if (maxRows != null && maxRows < 1) {
            return Exit.badInput(err, "demo", "--max-rows must be at least 1, got " + maxRows);
        }
        Demo demo = dim == 4 ? FOURFOLDS : THREEFOLDS;
        Path dir = data != null ? data : defaultDataDir();
        Path model = dir.resolve(demo.model());
        Path rules = dir.resolve(demo.rules());
        for (Path p : List.of(model, rules)) {
            if (!Files.isReadable(p)) {
                return Exit.badInput(err, "demo", "missing demo file " + p + " (give --data DIR, the folder demo-data of the project)");
            }
        }
        if (Files.exists(out) && !Files.isDirectory(out)) {
            return Exit.badInput(err, "demo", "--out " + out + ": exists and is not a directory; the demo writes its "
                    + "scan into a directory (" + out.resolve("scan") + "), give another --out DIR");
        }
        try {
            Files.createDirectories(out);
        } catch (IOException e) {
            return Exit.badInput(err, "demo", "--out " + out + ": cannot create the directory ("
                    + ScanFiles.describe(e) + ")");
        }
        Path scanDir = out.resolve("scan");
        o.println("winnow demo: scanning every " + demo.space() + " configuration matrix (rule set lossless"
                + (maxRows == null ? "" : ", at most " + maxRows + " rows") + ") as the producer enumerates it, with model "
                + model + " and rules " + rules);
        o.flush();
        List<String> scan = new ArrayList<>(List.of("scan", "--model", model.toString(), "--dim", Integer.toString(dim),
                "--exclusions", "lossless", "--rules-file", rules.toString(), "--out", scanDir.toString(), "--rejects"));
        if (maxRows != null) {
            scan.add("--max-rows");
            scan.add(maxRows.toString());
        }
        if (threads != null) {
            scan.add("--threads");
            scan.add(threads.toString());
        }
        int rc = run(scan.toArray(String[]::new));
        if (rc != 0) {
            return rc;
        }
        List<SurvivorLine> survivors;
        try {
            survivors = readSurvivors(scanDir);
        } catch (IOException e) {
            // The scan itself succeeded; its files changed under us (another process, a full disk).
            err.println("winnow demo: cannot read the survivors back: " + e.getMessage());
            err.flush();
            return Exit.STOPPED;
        }
        survivors.sort(Comparator.comparingDouble(SurvivorLine::novelty).reversed().thenComparing(SurvivorLine::config));
        o.println();
        o.println("most novel survivors (novelty near 1 = unlike the reference):");
        o.printf(Locale.ROOT, "  %-9s %-7s %-5s %-15s %-10s %s%n", "novelty", "chi", "h11", "h11 basis", "confidence",
                "config");
        for (SurvivorLine s : survivors.subList(0, Math.min(10, survivors.size()))) {
            // How h11 is known (proved, bounded LO..HI or estimated) beside the value: a guess never passes for a proof.
            o.printf(Locale.ROOT, "  %-9.4f %-7d %-5d %-15s %-10.3f %s%n", s.novelty(), s.chi(), s.h11(),
                    s.h11Value().describeBasis(), s.confidence(), s.config());
        }
        o.println();
        o.println("files: survivors in " + scanDir.resolve(ScanFiles.SURVIVORS) + "*, counts in "
                + scanDir.resolve(ScanFiles.MANIFEST) + ", rejects with reasons in " + scanDir.resolve(ScanFiles.REJECTS) + "*");
        o.println("next: compute the survivors exactly with  winnow hodge --file <survivor file>");
        o.println("      a page of the result with  winnow report " + out + " --out report.html");
        o.flush();
        return 0;
    }

    private int run(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(spec.commandLine().getOut());
        cl.setErr(spec.commandLine().getErr());
        return cl.execute(args);
    }

    private static List<SurvivorLine> readSurvivors(Path scanDir) throws IOException {
        try {
            return new ArrayList<>(ScanDirectory.read(scanDir).survivors());
        } catch (ScanDirectory.UnreadableException e) {
            throw new IOException(e.getMessage(), e);
        }
    }

    private static Path defaultDataDir() {
        String home = System.getenv("WINNOW_HOME");
        if (home != null && Files.isDirectory(Path.of(home, "demo-data"))) {
            return Path.of(home, "demo-data");
        }
        return Path.of("demo-data");
    }
}
