package org.winnow.app.model;

import org.winnow.app.cli.WinnowCli;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceTsv;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import picocli.CommandLine;

/** {@code winnow train} and {@code winnow evaluate} end to end on a small synthetic reference file. */
class ModelCommandsTest {
    @TempDir
    Path dir;

    private record Run(int code, String out, String err) {}

    private static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int code = cl.execute(args);
        return new Run(code, out.toString(), err.toString());
    }

    private Path syntheticReference() throws IOException {
        InvariantCalculator calc = new InvariantCalculator();
        List<ReferenceTsv.Row> rows = new ArrayList<>();
        for (LabelledExample e : SyntheticScenario.generate(400, 12)) {
            long chi = calc.chi(e.config());
            rows.add(new ReferenceTsv.Row(e.config(), new int[] {e.h11(), (int) (e.h11() - chi / 2)},
                    ReferenceTsv.Status.EXACT, ReferenceTsv.Source.COMPUTED, 0));
        }
        Path tsv = dir.resolve("synthetic.tsv");
        ReferenceTsv.write(tsv, rows);
        return tsv;
    }

    @Test
    void trainThenEvaluateWithAHeldOutClass() throws IOException {
        Path tsv = syntheticReference();
        Path model = dir.resolve("m.wnm");
        Run train = run("train", "--reference", tsv.toString(), "--out", model.toString(), "--dim", "4",
                "--epochs", "2", "--labelled-fraction", "0.2", "--holdout-class", "h11=9", "--seed", "3");
        assertEquals(0, train.code(), train.err());
        assertTrue(train.out().contains("h11 accuracy: "), train.out());
        assertTrue(train.out().contains("novelty AUROC: "), train.out());
        FrozenModel loaded = FrozenModel.load(model);
        assertTrue(loaded.metadata().evaluation().contains("h11 accuracy: "));
        assertTrue(train.out().contains("model checksum: " + loaded.checksum()));

        Run eval = run("evaluate", "--model", model.toString(), "--reference", tsv.toString(),
                "--holdout-class", "h11=9", "--plots", dir.toString());
        assertEquals(0, eval.code(), eval.err());
        for (String name : new String[] {"h11 accuracy", "min class recall (n>=5)", "novelty AUROC"}) {
            assertTrue(eval.out().lines().anyMatch(l -> l.matches(java.util.regex.Pattern.quote(name)
                    + ": (\\d\\.\\d{4}|n/a)")), name + " missing in\n" + eval.out());
        }
        assertTrue(eval.out().contains("confusion matrix"));
        assertTrue(eval.out().contains("reliability"));
        for (String png : new String[] {"m-embedding.png", "m-confusion.png"}) {
            assertTrue(ImageIO.read(dir.resolve(png).toFile()).getWidth() > 100, png);
        }
        // Odd options are refused before the evaluation runs, not after its tables are printed.
        Path file = Files.writeString(dir.resolve("afile"), "x");
        for (String[] c : new String[][] {{"--max-plot-points", "0", "--max-plot-points must be at least 1, got 0"},
            {"--plots", file.toString(), "--plots " + file + ": exists and is not a directory"},
            {"--out", file.toString(), "--out " + file + ": exists and is not a directory"}}) {
            Run bad = run("evaluate", "--model", model.toString(), "--reference", tsv.toString(), c[0], c[1]);
            assertEquals(2, bad.code(), c[2]);
            assertEquals("winnow evaluate: " + c[2], bad.err().strip());
            assertEquals("", bad.out());
        }
    }

    @Test
    void evaluatingAHeldOutClassTheModelKnowsIsRefused() throws IOException {
        Path tsv = syntheticReference();
        Path model = dir.resolve("m.wnm");
        assertEquals(0, run("train", "--reference", tsv.toString(), "--out", model.toString(), "--dim", "3",
                "--epochs", "1").code());
        Run eval = run("evaluate", "--model", model.toString(), "--reference", tsv.toString(),
                "--holdout-class", "h11=6");
        assertEquals(2, eval.code());
        assertTrue(eval.err().startsWith("winnow evaluate: " + model + ": the model was trained on h11=6"),
                eval.err());
    }

    @Test
    void badInputsGiveOneLineAndExitTwo() throws IOException {
        Path bad = dir.resolve("bad.tsv");
        Files.writeString(bad, "config\th11\th21\tstatus\tsource\n4:5\tone\t101\texact\tcomputed\n");
        Run r = run("train", "--reference", bad.toString(), "--out", dir.resolve("x.wnm").toString());
        assertEquals(2, r.code());
        assertEquals("winnow train: " + bad + ": line 2: h11 of an exact row must be a whole number of ASCII digits "
                + "below 2^31, got 'one'",
                r.err().strip());
        Path junk = dir.resolve("junk.wnm");
        Files.writeString(junk, "hello");
        Run e = run("evaluate", "--model", junk.toString(), "--reference", bad.toString());
        assertEquals(2, e.code());
        assertEquals("winnow evaluate: " + junk + ": not a winnow model file (wrong magic header)", e.err().strip());
        Run h = run("train", "--reference", bad.toString(), "--out", "x.wnm", "--holdout-class", "9");
        assertEquals(2, h.code());
        assertEquals("winnow train: --holdout-class must look like h11=V, got '9'", h.err().strip());
        // Zero epochs wrote an untrained model with exit 0 and "final loss: NaN".
        Path none = dir.resolve("none.wnm");
        Run z = run("train", "--reference", bad.toString(), "--out", none.toString(), "--epochs", "0");
        assertEquals(2, z.code());
        assertEquals("winnow train: --epochs must be at least 1, got 0", z.err().strip());
        assertFalse(Files.exists(none));
    }
}
