package org.winnow.app.hodge;

import org.winnow.app.cli.WinnowCli;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import picocli.CommandLine;

/** {@code winnow invariants}: output formats and one-line errors for every class of bad input. */
class InvariantsCommandTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    private record Run(int exit, String out, String err) {
        List<String> outLines() {
            return out.isEmpty() ? List.of() : List.of(out.split("\n"));
        }

        List<String> errLines() {
            return err.isEmpty() ? List.of() : List.of(err.split("\n"));
        }
    }

    private static Run run(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    /** Quintic: chi = -200, d111 = 5, c2.J = 50 (standard textbook values, from memory). */
    @Test
    void jsonForTheQuintic() throws IOException {
        Run r = run("invariants", "--json", "4:5");
        assertEquals(0, r.exit(), r.err());
        JsonNode o = JSON.readTree(r.outLines().get(0));
        assertEquals("4:5", o.get("input").asText());
        assertEquals("4:5", o.get("canonical").asText());
        assertEquals(3, o.get("dim").asInt());
        assertEquals(1, o.get("rows").asInt());
        assertEquals(1, o.get("cols").asInt());
        assertEquals(-200, o.get("chi").asLong());
        assertEquals(1, o.get("blocks").asInt());
        assertEquals(50, o.get("c2J").get(0).asLong());
        assertEquals(5, o.get("triple").get("0,0,0").asLong());
        assertEquals(1, o.get("triple").size());
    }

    /**
     * {@code 1:2/3:4}: d122 = 4, d222 = 2, c2.J = (24, 44) in the written order (standard textbook
     * values, from memory). The JSON reports the canonical row order, so the check maps the written
     * rows to canonical rows by their dimension (P^1 and P^3 are told apart).
     */
    @Test
    void jsonUsesCanonicalRowOrder() throws IOException {
        Run r = run("invariants", "--json", "1:2/3:4");
        assertEquals(0, r.exit(), r.err());
        JsonNode o = JSON.readTree(r.outLines().get(0));
        String canonical = o.get("canonical").asText();
        String[] rows = canonical.split("/");
        int p1 = rows[0].startsWith("1:") ? 0 : 1;
        int p3 = 1 - p1;
        assertEquals(24, o.get("c2J").get(p1).asLong());
        assertEquals(44, o.get("c2J").get(p3).asLong());
        assertEquals(4, o.get("triple").get(key(p1, p3, p3)).asLong());
        assertEquals(2, o.get("triple").get(key(p3, p3, p3)).asLong());
        assertEquals(2, o.get("triple").size());
        assertEquals(-168, o.get("chi").asLong());
    }

    /** Sextic four-fold: chi 2610, int c2^2 = 1350 (arXiv:1303.1832, JHEP 2013; textbook values). */
    @Test
    void fourFoldAndPlainText() throws IOException {
        Run r = run("invariants", "--json", "5:6");
        JsonNode o = JSON.readTree(r.outLines().get(0));
        assertEquals(2610, o.get("chi").asLong());
        assertEquals(1350, o.get("c2sq").asLong());
        assertTrue(o.get("c2J") == null && o.get("triple") == null);
        Run text = run("invariants", "2:3/2:3");
        assertEquals(0, text.exit());
        assertTrue(text.out().contains("chi -162"), text.out());
        assertTrue(text.out().contains("c2.J 36 36"), text.out());
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "empty                 | ''                   | empty input",
        "bad token             | 4:5x                 | column 4: expected",
        "ragged rows           | 2:3,0/2:3            | ragged rows",
        "zero column           | 4:5,0                | zero column 2",
        "negative entry        | 4:6,-1               | negative entry -1",
        "non-Calabi-Yau row    | 4:4                  | not Calabi-Yau: row 1",
        "dimension out of range| 6:7                  | dimension out of range",
        "too large             | 40:41                | exceeds the supported",
        "too large number      | 4:5000000000         | too large",
    })
    void badInputGetsOneLineNamingInputAndReason(String kind, String input, String reason) {
        Run r = run("invariants", "4:5", input, "3:4");
        assertEquals(2, r.exit(), kind);
        assertEquals(1, r.errLines().size(), r.err());
        String line = r.errLines().get(0);
        assertTrue(line.contains("argument 2"), line);
        assertTrue(input.isEmpty() || line.contains("'" + input + "'"), line);
        assertTrue(line.contains(reason), kind + ": " + line);
        // Valid inputs around the bad one are still processed.
        assertEquals(2, r.outLines().size(), r.out());
    }

    @Test
    void tooManyRowsIsReported() {
        String seventeen = String.join("/", java.util.Collections.nCopies(17, "1:2"));
        Run r = run("invariants", seventeen);
        assertEquals(2, r.exit());
        // The parser stops at the 17th row rather than read the rest of a runaway line.
        assertTrue(r.err().contains("too large: more than 16 rows"), r.err());
    }

    @Test
    void fileWithCommentsAnnotationsAndABadLine(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("in.txt");
        Files.writeString(f, "# a header\n4:5\tsome annotation\n\n4:4  # not CY\n2:3/2:3\n");
        Run r = run("invariants", "--json", "--file", f.toString());
        assertEquals(2, r.exit());
        assertEquals(2, r.outLines().size(), r.out());
        assertEquals(1, r.errLines().size(), r.err());
        assertTrue(r.err().contains("line 4 '4:4'"), r.err());
        assertEquals(-162, JSON.readTree(r.outLines().get(1)).get("chi").asLong());
    }

    @Test
    void missingFileAndNoInput() {
        Run r = run("invariants", "--file", "/nonexistent/winnow-input.txt");
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("no such file"), r.err());
        Run none = run("invariants");
        assertEquals(2, none.exit());
        assertTrue(none.err().contains("no configuration given"), none.err());
    }

    private static String key(int r, int s, int t) {
        int[] a = {r, s, t};
        java.util.Arrays.sort(a);
        return a[0] + "," + a[1] + "," + a[2];
    }
}
