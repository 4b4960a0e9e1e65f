package org.winnow.app.hodge;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import picocli.CommandLine;

/**
 * {@code label} continues an existing output. A damaged row in it once either ended every rerun with
 * "Input length = 1; ... rerun the same command to continue" (a byte that is not UTF-8), or was taken as
 * labelled and never redone (a row cut short in the middle of the file). Now the row is named by its line.
 */
class LabelResumeDamageTest {
    private static String refused(Path in, Path out) {
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(err, true));
        assertEquals(Exit.BAD_INPUT, cl.execute("label", "--in", in.toString(), "--out", out.toString()), err.toString());
        return err.toString().strip();
    }

    @Test
    void aDamagedRowOfTheOutputIsNamedByItsLine(@TempDir Path dir) throws Exception {
        Path in = Files.writeString(dir.resolve("in.txt"), "4:5\n5:3,3\n");
        Path out = dir.resolve("out.tsv");
        // The quintic's (1, 101), from memory; the byte 0xFF is not UTF-8.
        byte[] damaged = "config\th11\th21\tstatus\tsource\n4:5\t1\t1\u00ff01\texact\tcomputed\n"
                .getBytes(StandardCharsets.ISO_8859_1);
        Files.write(out, damaged);
        assertEquals("winnow label: " + out + " line 2 '4:5\\u00091\\u00091\\uFFFD01\\u0009exact\\u0009computed': damaged "
                + "(bytes that are not UTF-8); fix or delete that line, then rerun", refused(in, out));
        assertArrayEquals(damaged, Files.readAllBytes(out), "nothing appended to a damaged file");
        Files.writeString(out, "config\th11\th21\tstatus\tsource\n4:5\t1\n5:3,3\t1\t73\texact\tcomputed\n");
        assertEquals("winnow label: " + out + " line 2 '4:5\\u00091': damaged (2 tab-separated fields, expected 5); fix "
                + "or delete that line, then rerun", refused(in, out));
    }
}
