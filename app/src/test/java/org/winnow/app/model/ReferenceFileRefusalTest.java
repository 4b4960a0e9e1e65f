package org.winnow.app.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import picocli.CommandLine;

/**
 * The commands that read a reference file refuse a bad one in one line naming the file and, where a line is
 * at fault, its number: bytes that are not UTF-8 (once a stack trace in {@code sample} and a bare "Input length
 * = 1" in {@code train}), a directory (a stack trace in {@code sample}), an empty file, and four-folds under the
 * two-value header (once read as a four-fold reference without h31 and h22).
 */
class ReferenceFileRefusalTest {
    private static int run(StringWriter err, String... args) {
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(err, true));
        return cl.execute(args);
    }

    private static String[] args(String command, Path reference, Path dir) {
        return command.equals("sample")
                ? new String[] {"sample", "--reference", reference.toString(), "--fraction", "0.5", "--out",
                    dir.resolve("out.tsv").toString()}
                : new String[] {"train", "--reference", reference.toString(), "--epochs", "1", "--out",
                    dir.resolve("out.wnm").toString()};
    }

    private static void refused(String command, Path reference, Path dir, String expected) {
        StringWriter err = new StringWriter();
        assertEquals(Exit.BAD_INPUT, run(err, args(command, reference, dir)), err.toString());
        String text = err.toString().strip();
        assertFalse(text.contains("\n") || text.contains("Exception"), text);
        assertTrue(text.startsWith("winnow " + command + ": " + reference + ": " + expected), text);
    }

    @ParameterizedTest
    @ValueSource(strings = {"sample", "train"})
    void badReferencesAreOneLineNamingFileAndLine(String command, @TempDir Path dir) throws Exception {
        Path bad = dir.resolve("bad.tsv");
        Files.write(bad, ("config\th11\th21\tstatus\tsource\n4:5\t1\t10\u00ff1\texact\tcomputed\n")
                .getBytes(StandardCharsets.ISO_8859_1));
        refused(command, bad, dir, "line 2: h21 of an exact row must be a whole number");
        Path empty = Files.createFile(dir.resolve("empty.tsv"));
        refused(command, empty, dir, "line 1: empty reference file");
        Path folder = Files.createDirectory(dir.resolve("folder.tsv"));
        refused(command, folder, dir, "cannot read (Is a directory)");
        Path fourfolds = dir.resolve("fourfolds.tsv");
        // Hodge numbers of the sextic four-fold, from memory.
        Files.writeString(fourfolds, "config\th11\th21\tstatus\tsource\n5:6\t1\t0\texact\tcomputed\n");
        refused(command, fourfolds, dir, "line 2: 5:6 has dimension 4, but the header has no h31 h22 columns");
    }

    /** A held-out class the file does not have once trained "holding out 0" and exit 0: nothing to measure on. */
    @org.junit.jupiter.api.Test
    void aHoldoutClassTheFileDoesNotHaveIsRefused(@TempDir Path dir) throws Exception {
        Path ref = dir.resolve("r.tsv");
        // Hodge numbers of the quintic and of 2:3/2:3, from memory.
        Files.writeString(ref, "config\th11\th21\tstatus\tsource\n4:5\t1\t101\texact\tcomputed\n"
                + "2:3/2:3\t2\t83\texact\tcomputed\n");
        StringWriter err = new StringWriter();
        assertEquals(Exit.BAD_INPUT, run(err, "train", "--reference", ref.toString(), "--epochs", "1", "--out",
                dir.resolve("m.wnm").toString(), "--holdout-class", "h11=999"));
        assertEquals("winnow train: --holdout-class h11=999: " + ref + " has no exact row of that class to hold out",
                err.toString().strip());
        assertFalse(Files.exists(dir.resolve("m.wnm")));
        // evaluate likewise: the novelty AUROC was n/a with exit 0, as if measured.
        Path more = dir.resolve("more.tsv");
        Files.writeString(more, Files.readString(ref) + "3:4/1:2\t2\t86\texact\tcomputed\n");
        assertEquals(0, run(new StringWriter(), "train", "--reference", ref.toString(), "--epochs", "1", "--out",
                dir.resolve("m.wnm").toString()));
        err = new StringWriter();
        assertEquals(Exit.BAD_INPUT, run(err, "evaluate", "--model", dir.resolve("m.wnm").toString(), "--reference",
                more.toString(), "--holdout-class", "h11=999"));
        assertEquals("winnow evaluate: --holdout-class h11=999: " + more + " has no exact row of that class to measure "
                + "novelty on", err.toString().strip());
    }
}
