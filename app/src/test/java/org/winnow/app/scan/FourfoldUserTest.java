package org.winnow.app.scan;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import picocli.CommandLine;

/** What a new four-fold user ran into, each as a regression. */
class FourfoldUserTest {
    private record Run(int exit, String out, String err) {}

    private static Run winnow(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    /**
     * {@code winnow scan --dim 4} with a model of three-folds once ran the whole space: every candidate got the
     * three-fold model's h11 with confidence 1.000000 and a three-fold as its nearest reference, and exit 0.
     * Now it is refused before anything is written, in one line that says what to do.
     */
    @Test
    void boundsOfAnotherDimensionThanTheModelAreRefusedInOneLine(@TempDir Path dir) throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        Path out = dir.resolve("scan");
        Run r = winnow("scan", "--dim", "4", "--max-rows", "2", "--model", model.toString(), "--out", out.toString());
        assertEquals(Exit.BAD_INPUT, r.exit(), r.err());
        assertEquals("winnow scan: --model " + model + ": its reference set is of dimension 3, but the bounds ask for "
                + "dimension 4; its predictions mean nothing there. Give a model trained on dimension-4 rows (winnow "
                + "label, then winnow train), or --dim 3\n", r.err());
        assertFalse(Files.exists(out), "nothing written");
    }
}
