package org.winnow.app.report;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.sink.ScanFiles;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code winnow report}: one self-contained HTML page of a scan's result. */
@Command(name = "report", mixinStandardHelpOptions = true,
        description = {"Write one self-contained HTML file (pictures inline, nothing fetched from a network) that",
            "shows a scan's result: run summary, rejection funnel, novelty and confidence distributions, a",
            "sortable table of the most novel survivors and, with --model, an embedding map of the reference and",
            "the survivors and the clusters of novel survivors. On an evaluation's directory: summary, per-class",
            "recall and precision, confusion matrix, reliability diagram and embedding picture."})
public final class ReportCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR",
            description = "The --out directory of a scan, or of `winnow evaluate` (holding " + EvaluationFile.FILE + ").")
    Path dir;

    @Option(names = "--out", required = true, paramLabel = "report.html", description = "The HTML file to write.")
    Path out;

    @Option(names = "--model", paramLabel = "M.wnm",
            description = {"The run's frozen model: adds the embedding map and the clusters of novel survivors."})
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
        ScanResult scan;
        try {
            scan = ScanResult.read(dir);
        } catch (ScanResult.BadScanDir e) {
            return Exit.badInput(err, "report", e.getMessage());
        }
        ModelView view = null;
        if (model != null) {
            FrozenModel frozen;
            try {
                frozen = FrozenModel.load(model);
            } catch (IOException e) {
                return Exit.badInput(err, "report", e.getMessage());
            }
            try {
                view = ModelView.build(scan, frozen, maxMapPoints);
            } catch (IllegalArgumentException e) {
                return Exit.badInput(err, "report", model + ": " + e.getMessage());
            }
            if (!view.sameModel()) {
                err.println("winnow report: warning: " + model + " has checksum " + frozen.checksum()
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
        Path parent = out.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        Files.writeString(out, html, StandardCharsets.UTF_8);
    }
}
