package org.winnow.app.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.sink.Manifest;
import picocli.CommandLine;

/**
 * A file saved by an editor that starts UTF-8 with a byte-order mark (U+FEFF) and ends lines with CR LF once
 * lost its first line: the first configuration was a bad line in {@code scan} and refused by {@code invariants}
 * and {@code hodge}, a reference file's header was not recognised, a rules file's first rule unreadable.
 */
class ByteOrderMarkTest {
    private static final byte[] MARK = {(byte) 0xEF, (byte) 0xBB, (byte) 0xBF};

    private record Run(int exit, String out, String err) {}

    private static Run winnow(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        return new Run(cl.execute(args), out.toString(), err.toString());
    }

    private static Path marked(Path file, String text) throws Exception {
        byte[] body = text.getBytes(StandardCharsets.UTF_8);
        byte[] all = new byte[MARK.length + body.length];
        System.arraycopy(MARK, 0, all, 0, MARK.length);
        System.arraycopy(body, 0, all, MARK.length, body.length);
        return Files.write(file, all);
    }

    @Test
    void aLeadingByteOrderMarkCostsNoLine(@TempDir Path dir) throws Exception {
        Path configs = marked(dir.resolve("c.txt"), "4:5\r\n5:6\r\n");
        Run inv = winnow("invariants", "--file", configs.toString());
        assertEquals(0, inv.exit(), inv.err());
        assertEquals(2, inv.out().lines().count(), inv.out());
        Run hodge = winnow("hodge", "--file", configs.toString());
        assertEquals(0, hodge.exit(), hodge.err());
        // The quintic's h21 = 101 and the sextic's h31 = 426, from memory.
        assertTrue(hodge.out().contains("h21 101") && hodge.out().contains("h31 426"), hodge.out());

        Path rules = marked(dir.resolve("rules.txt"), "keep h11=1..3\r\n");
        Path model = Files.copy(Path.of("..", "demo-data", "threefolds-1pct.wnm"), dir.resolve("m.wnm"));
        Path scan = dir.resolve("scan");
        Run s = winnow("scan", "--input", configs.toString(), "--model", model.toString(), "--out", scan.toString(),
                "--rules-file", rules.toString());
        assertEquals(0, s.exit(), s.err());
        Manifest m = Manifest.read(scan.resolve("manifest.json"));
        assertEquals(0, m.counts().badInput(), "no bad line");
        assertEquals(2, m.counts().candidates());

        Path ref = marked(dir.resolve("r.tsv"), "config\th11\th21\tstatus\tsource\r\n4:5\t1\t101\texact\tcomputed\r\n"
                + "2:3/2:3\t2\t83\texact\tcomputed\r\n");
        Run sample = winnow("sample", "--reference", ref.toString(), "--fraction", "1", "--out",
                dir.resolve("s.tsv").toString());
        assertEquals(0, sample.exit(), sample.err());
        assertEquals(3, Files.readAllLines(dir.resolve("s.tsv")).size(), "header and both rows");
    }
}
