package org.winnow.app.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * An output path that names the command's own input once replaced it with exit 0: {@code sample} and
 * {@code train} wrote over the labelled reference, {@code export-weights} over the model, {@code report} over
 * the scan's manifest. Each is refused in one line, and the input is left byte for byte as it was.
 */
class OutputOverInputTest {
    private static final Path MODEL = Path.of("..", "demo-data", "threefolds-1pct.wnm");

    private static String refused(String... args) {
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(err, true));
        assertEquals(Exit.BAD_INPUT, cl.execute(args), err.toString());
        return err.toString().strip();
    }

    @Test
    void noCommandWritesOverWhatItReads(@TempDir Path dir) throws Exception {
        Path ref = dir.resolve("r.tsv");
        // Hodge numbers of the quintic and of 2:3/2:3, from memory.
        Files.writeString(ref, "config\th11\th21\tstatus\tsource\n4:5\t1\t101\texact\tcomputed\n"
                + "2:3/2:3\t2\t83\texact\tcomputed\n");
        byte[] refBytes = Files.readAllBytes(ref);
        assertEquals("winnow sample: --out " + ref + " is the --reference file; writing it would destroy what is read; "
                + "give another name", refused("sample", "--reference", ref.toString(), "--out", ref.toString(),
                "--fraction", "0.5"));
        assertEquals("winnow train: --out " + ref + " is the --reference file; writing it would destroy what is read; "
                + "give another name", refused("train", "--reference", ref.toString(), "--out",
                dir.resolve(".").resolve("r.tsv").toString(), "--epochs", "1").replace("/./", "/"));
        assertArrayEquals(refBytes, Files.readAllBytes(ref));

        Path model = Files.copy(MODEL, dir.resolve("m.wnm"));
        byte[] modelBytes = Files.readAllBytes(model);
        assertEquals("winnow export-weights: --out " + model + " is the --model file; writing it would destroy what is "
                + "read; give another name", refused("export-weights", "--model", model.toString(), "--out",
                model.toString()));
        assertArrayEquals(modelBytes, Files.readAllBytes(model));

        Path input = Files.writeString(dir.resolve("in.txt"), "4:5\n2:3/2:3\n");
        Path scan = dir.resolve("scan");
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(new StringWriter(), true));
        assertEquals(0, cl.execute("scan", "--input", input.toString(), "--model", model.toString(), "--out",
                scan.toString()));
        Path manifest = scan.resolve("manifest.json");
        byte[] manifestBytes = Files.readAllBytes(manifest);
        assertEquals("winnow report: --out " + manifest + " is a file of the run in " + scan + "; writing it would "
                + "damage that run; give another name", refused("report", scan.toString(), "--out", manifest.toString()));
        assertArrayEquals(manifestBytes, Files.readAllBytes(manifest));
    }
}
