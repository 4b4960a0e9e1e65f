package org.winnow.app.report;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import java.util.ArrayList;
import java.util.List;
import org.winnow.app.cli.CheckedOutput;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.OutputPaths;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.sink.ScanFiles;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code winnow report}: one self-contained HTML page of a scan's result. */
@Command(name = "report", mixinStandardHelpOptions = true,
        description = {"Write one self-contained HTML page of a scan's or an evaluation's result.",
            "Pictures are inline and nothing is fetched from a network. For a scan: run summary, rejection funnel, "
                    + "novelty and confidence distributions, a sortable table of the most novel survivors, and an "
                    + "embedding map of the reference and the survivors with the clusters of novel survivors (from "
                    + "the model the scan used, or --model). For an evaluation: summary, per-class recall and "
                    + "precision, confusion matrix, reliability diagram and embedding picture. The parts a scan "
                    + "committed are checked against their recorded lengths and SHA-256 first."})
public final class ReportCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR",
            description = "The --out directory of a scan, or of `winnow evaluate` (holding " + EvaluationFile.FILE + ").")
    Path dir;

    @Option(names = "--out", required = true, paramLabel = "report.html", description = "The HTML file to write.")
    Path out;

    @Option(names = "--model", paramLabel = "M.wnm",
            description = {"The run's frozen model, for the embedding map and the clusters of novel survivors "
                    + "(default: the model file the scan's manifest names, when its checksum still matches)."})
    Path model;

    @Option(names = "--max-map-points", defaultValue = "20000", paramLabel = "N",
            description = "Largest number of novel survivors, and of other survivors, embedded for the map and the "
                    + "clusters (an even sample beyond; default ${DEFAULT-VALUE}).")
    int maxMapPoints;

    @Option(names = "--top", defaultValue = "500", paramLabel = "N",
            description = "Rows in the survivors table, most novel first (default ${DEFAULT-VALUE}).")
    int top;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        if (top < 1) {
            return Exit.badInput(err, "report", "--top " + top + ": must be at least 1");
        }
        if (maxMapPoints < 1) {
            return Exit.badInput(err, "report", "--max-map-points " + maxMapPoints + ": must be at least 1");
        }
        Path evaluation = dir.resolve(EvaluationFile.FILE);
        String inside = OutputPaths.insideRunProblem(out, dir);
        if (inside != null) {
            return Exit.badInput(err, "report", inside);
        }
        if (Files.isRegularFile(evaluation)) {
            if (Files.exists(dir.resolve(ScanFiles.MANIFEST))) {
                return Exit.badInput(err, "report", dir + ": holds both " + ScanFiles.MANIFEST + " and " + EvaluationFile.FILE
                        + "; give a scan's or an evaluation's own directory");
            }
            if (model != null) {
                return Exit.badInput(err, "report", "--model applies to a scan directory; " + evaluation + " names its own model");
            }
            return evaluationReport(evaluation, err);
        }
        Path scanDir;
        try {
            scanDir = scanDirectory(dir, err);
        } catch (ScanResult.BadScanDir e) {
            return Exit.badInput(err, "report", e.getMessage());
        }
        inside = OutputPaths.insideRunProblem(out, scanDir);
        if (inside != null) {
            return Exit.badInput(err, "report", inside);
        }
        ScanResult scan;
        try {
            scan = ScanResult.read(scanDir);
        } catch (ScanResult.BadScanDir e) {
            return Exit.badInput(err, "report", e.getMessage());
        }
        Path modelFile = model;
        if (modelFile == null) {
            modelFile = scanModel(scan, err);
        }
        ModelView view = null;
        if (modelFile != null) {
            FrozenModel frozen;
            try {
                frozen = FrozenModel.load(modelFile);
            } catch (IOException e) {
                return Exit.badInput(err, "report", e.getMessage());
            }
            try {
                view = ModelView.build(scan, frozen, maxMapPoints);
            } catch (IllegalArgumentException e) {
                return Exit.badInput(err, "report", modelFile + ": " + e.getMessage());
            }
            if (!view.sameModel()) {
                err.println("winnow report: warning: " + modelFile + " has checksum " + frozen.checksum()
                        + " but the run was scored with " + scan.manifest().modelChecksum());
                err.flush();
            }
        }
        try {
            write(ReportHtml.render(scan, view, "winnow scan " + scan.manifest().runId(), top));
        } catch (IOException e) {
            return Exit.badInput(err, "report", out + ": cannot write the report (" + e.getMessage() + ")");
        }
        PrintWriter o = spec.commandLine().getOut();
        o.println("report: " + out + " (" + scan.survivors().size() + " survivors)");
        o.flush();
        return 0;
    }

    private int evaluationReport(Path file, PrintWriter err) {
        EvaluationFile e;
        try {
            e = EvaluationFile.read(file);
        } catch (IOException ex) {
            return Exit.badInput(err, "report", ex.getMessage());
        }
        try {
            write(EvaluationHtml.render(e, dir, "winnow evaluate " + Path.of(e.model()).getFileName() + " on "
                    + Path.of(e.testFile()).getFileName()));
        } catch (IOException ex) {
            return Exit.badInput(err, "report", out + ": cannot write the report (" + ex.getMessage() + ")");
        }
        PrintWriter o = spec.commandLine().getOut();
        o.println("report: " + out + " (evaluation of " + e.testRows() + " test rows)");
        o.flush();
        return 0;
    }

    private void write(String html) throws IOException {
        // Through a temporary name, so a full disk never leaves half a page under the report's name.
        CheckedOutput.replace(out, w -> w.write(html));
    }

    /**
     * The scan directory to report on: {@code dir} itself when it holds a manifest, else its one
     * subdirectory that does (the directory given to {@code winnow demo --out} holds the scan one level
     * down). Several candidates are refused, naming them, rather than picking one.
     */
    static Path scanDirectory(Path dir, PrintWriter err) throws ScanResult.BadScanDir {
        if (Files.exists(dir.resolve(ScanFiles.MANIFEST)) || !Files.isDirectory(dir)) {
            return dir;
        }
        List<Path> inside = new ArrayList<>();
        try (var entries = Files.list(dir)) {
            for (Path p : (Iterable<Path>) entries::iterator) {
                if (Files.isDirectory(p) && Files.isRegularFile(p.resolve(ScanFiles.MANIFEST))) {
                    inside.add(p);
                }
            }
        } catch (IOException e) {
            throw new ScanResult.BadScanDir(dir + ": cannot list (" + ScanFiles.describe(e) + ")");
        }
        if (inside.size() == 1) {
            err.println("winnow report: " + dir + " holds no scan itself; reporting on " + inside.get(0));
            err.flush();
            return inside.get(0);
        }
        if (inside.size() > 1) {
            inside.sort(null);
            throw new ScanResult.BadScanDir(dir + ": holds " + inside.size() + " scans (" + inside.get(0) + ", "
                    + inside.get(1) + (inside.size() > 2 ? ", ..." : "") + "); give one of them");
        }
        return dir;
    }

    /**
     * The model file the scan's manifest names, when it is still there with the checksum the scan ran
     * with; else null, with a note saying why there is no embedding map.
     */
    private static Path scanModel(ScanResult scan, PrintWriter err) {
        String recorded = scan.manifest().modelFile();
        if (recorded == null) {
            return null;
        }
        Path file = Path.of(recorded);
        String why;
        if (!Files.isRegularFile(file)) {
            why = "is no longer there";
        } else {
            try {
                String checksum = FrozenModel.load(file).checksum();
                if (scan.manifest().modelChecksum().endsWith(checksum)) {
                    err.println("winnow report: embedding map with the scan's model " + file);
                    err.flush();
                    return file;
                }
                why = "now has another checksum than the scan's model";
            } catch (IOException e) {
                why = "does not load (" + e.getMessage() + ")";
            }
        }
        err.println("winnow report: note: the scan's model " + file + " " + why
                + "; no embedding map (give --model M.wnm)");
        err.flush();
        return null;
    }
}
