package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.winnow.app.cli.WinnowCli;

/**
 * A run like the demo's, small enough for a test: every {@code stride}-th row of the shipped demo
 * space, scanned by the real scan pipeline with the shipped model and rules, and evaluated by
 * {@code winnow evaluate --out}. Tests read its outputs but assume nothing about the model's numbers,
 * since the shipped model is retrained from time to time.
 */
final class DemoRun {
    /** The command's exit code and both streams. */
    record Run(int exit, String out, String err) {}

    static final Path DATA = Path.of("..", "demo-data");
    static final Path MODEL = DATA.resolve("threefolds-1pct.wnm");

    /** One run per test JVM, shared by the test classes that read it. */
    record Outputs(Path sample, Path scan, Path evaluation) {}

    private static Outputs shared;

    private DemoRun() {}

    /**
     * Every twentieth configuration of the demo space scanned and evaluated, once per JVM, in a temporary
     * directory removed when the JVM exits.
     */
    static synchronized Outputs shared() throws IOException {
        if (shared == null) {
            Path dir = Files.createTempDirectory("winnow-demo-run");
            Runtime.getRuntime().addShutdownHook(new Thread(() -> delete(dir)));
            Path sample = sample(dir, 20);
            shared = new Outputs(sample, scan(dir, sample), evaluate(dir, sample));
        }
        return shared;
    }

    private static void delete(Path dir) {
        try (var walk = Files.walk(dir)) {
            walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        } catch (IOException e) {
            // Best effort: the directory is under the system's temporary folder.
        }
    }

    static Run winnow(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        var cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    /** Every {@code stride}-th data row of the demo's labelled space, with the header. */
    private static Path sample(Path dir, int stride) throws IOException {
        assertTrue(Files.isRegularFile(MODEL), "the shipped demo model at " + MODEL.toAbsolutePath());
        List<String> lines = Files.readAllLines(DATA.resolve("threefolds-exact.tsv"));
        List<String> kept = new ArrayList<>();
        kept.add(lines.get(0));
        for (int i = 1; i < lines.size(); i++) {
            if (i % stride == 0) {
                kept.add(lines.get(i));
            }
        }
        Path f = dir.resolve("sample-" + stride + ".tsv");
        Files.write(f, kept);
        return f;
    }

    /** Scans the sample's configurations with the demo model and rules into {@code dir/scan}. */
    private static Path scan(Path dir, Path sample) throws IOException {
        List<String> configs = new ArrayList<>();
        List<String> rows = Files.readAllLines(sample);
        for (String line : rows.subList(1, rows.size())) {
            configs.add(line.substring(0, line.indexOf('\t')));
        }
        Path input = dir.resolve("candidates.txt");
        Files.write(input, configs);
        Path out = dir.resolve("scan");
        Run r = winnow("scan", "--model", MODEL.toString(), "--input", input.toString(), "--rules-file",
                DATA.resolve("rules.txt").toString(), "--out", out.toString(), "--threads", "2");
        assertEquals(0, r.exit(), r.err());
        return out;
    }

    /** Evaluates the demo model on the sample into {@code dir/eval}. */
    private static Path evaluate(Path dir, Path sample) {
        Path out = dir.resolve("eval");
        Run r = winnow("evaluate", "--model", MODEL.toString(), "--reference", sample.toString(), "--out",
                out.toString());
        assertEquals(0, r.exit(), r.err());
        return out;
    }
}
