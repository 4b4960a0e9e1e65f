package org.winnow.app.hodge;

import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/** {@code winnow hodge} and {@code winnow label}: formats, refusals, resumption. */
class HodgeCommandTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    private record Run(int exit, List<String> out, List<String> err) {}

    private static Run run(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, lines(out.toString()), lines(err.toString()));
    }

    private static List<String> lines(String s) {
        return s.isEmpty() ? List.of() : List.of(s.split("\n"));
    }

    @Test
    void jsonLinesForExactAndRefusedInput() throws IOException {
        // Quintic (1, 101): standard textbook value, from memory. (14, 23): "New Calabi-Yau
        // Manifolds with Small Hodge Numbers", arXiv:0809.4681 (2008).
        Run r = run("hodge", "--json", "--threads", "2", "4:5", "3:0,3,1/3:3,0,1", "3:4,0/3:0,4");
        assertEquals(0, r.exit(), String.join("\n", r.err()));
        assertEquals(3, r.out().size());
        JsonNode quintic = JSON.readTree(r.out().get(0));
        assertEquals("4:5", quintic.get("input").asText());
        assertEquals(3, quintic.get("dim").asInt());
        assertEquals(-200, quintic.get("chi").asLong());
        assertEquals(1, quintic.get("h11").asLong());
        assertEquals(101, quintic.get("h21").asLong());
        assertEquals("exact", quintic.get("status").asText());
        assertEquals("dimensions", quintic.get("method").asText());
        assertTrue(quintic.get("seconds").asDouble() >= 0);
        JsonNode nf = JSON.readTree(r.out().get(1));
        assertEquals("3:0,3,1/3:3,0,1", nf.get("input").asText());
        assertFalse(nf.get("canonical").asText().isEmpty());
        assertEquals(14, nf.get("h11").asLong());
        assertEquals(23, nf.get("h21").asLong());
        assertEquals("d1", nf.get("method").asText());
        assertFalse(quintic.get("product").asBoolean());
        // K3 x K3: chi = 24 * 24 (common practice, no source), diamond derived in docs/hodge-coverage.md.
        JsonNode product = JSON.readTree(r.out().get(2));
        assertEquals("exact", product.get("status").asText());
        assertEquals("product", product.get("method").asText());
        assertTrue(product.get("product").asBoolean());
        assertEquals(576, product.get("chi").asLong());
        assertEquals(2, product.get("factors").size());
        assertEquals("3:4", product.get("factors").get(0).asText());
        assertEquals(40, product.get("h11").asLong());
        assertEquals(40, product.get("h31").asLong());
        assertEquals(404, product.get("h22").asLong());
        assertEquals(2, product.get("diamond").get(2).get(0).asLong(), "h^{2,0} of K3 x K3");
    }

    @Test
    void textMarksProducts() {
        // T2 x K3: chi = 0 * 24 (common practice, no source); h11 = h21 = 21 derived in docs/hodge-coverage.md.
        Run r = run("hodge", "2:3,0/3:0,4");
        assertEquals(0, r.exit(), String.join("\n", r.err()));
        String line = r.out().get(0);
        assertTrue(line.contains("chi 0  h11 21  h21 21  h10 1  h20 1  h30 1  exact (product)"), line);
        assertTrue(line.endsWith("product 2:3 x 3:4") || line.contains("  product 2:3 x 3:4  "), line);
    }

    @Test
    void fourfoldsCarryAllFourNumbers() throws IOException {
        // Sextic four-fold (1, 0, 426, 1752): "All Complete Intersection Calabi-Yau Four-Folds",
        // arXiv:1303.1832, JHEP (2013) (chi range) and standard textbook values.
        JsonNode o = JSON.readTree(run("hodge", "--json", "5:6").out().get(0));
        assertEquals(2610, o.get("chi").asLong());
        assertEquals(426, o.get("h31").asLong());
        assertEquals(1752, o.get("h22").asLong());
    }

    @Test
    void badInputGetsOneLineOnStderrAndExitTwo() {
        Run r = run("hodge", "4:5", "4:4", "4:5/");
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(1, r.out().size());
        assertEquals(2, r.err().size(), String.join("\n", r.err()));
        assertTrue(r.err().get(0).contains("'4:4'") && r.err().get(0).contains("not Calabi-Yau"), r.err().get(0));
    }

    @Test
    void labelWritesTheReferenceFormatAndResumes(@TempDir Path dir) throws IOException {
        Path in = dir.resolve("in.txt");
        Path out = dir.resolve("reference.tsv");
        Files.writeString(in, "# three-folds\n4:5\n2:3/2:3\n2:3,0/2:0,3/1:1,1\n1:1,1/2:0,3/2:3,0\n2:3,0/3:0,4\nbad\n",
                StandardCharsets.UTF_8);
        Run first = run("label", "--in", in.toString(), "--out", out.toString(), "--threads", "2");
        assertEquals(Exit.BAD_INPUT, first.exit(), "the bad line makes the exit code 2");
        List<String> lines = Files.readAllLines(out);
        assertEquals("config\th11\th21\tstatus\tsource", lines.get(0));
        assertEquals(5, lines.size(), String.join("\n", lines));
        assertTrue(lines.contains("4:5\t1\t101\texact\tcomputed"));
        // T2 x K3, a product: h11 = h21 = 21 (derived in docs/hodge-coverage.md), marked by its source.
        assertEquals(1, lines.stream().filter(l -> l.endsWith("\t21\t21\texact\tproduct")).count(), String.join("\n", lines));
        // (19, 19): arXiv:0809.4681 (2008); the permuted copy is the same canonical matrix
        assertEquals(1, lines.stream().filter(l -> l.endsWith("\t19\t19\texact\tcomputed")).count());
        // simulate a kill in the middle of a line: the torn line is cut off and redone
        String kept = String.join("\n", lines.subList(0, 4)) + "\n";
        Files.writeString(out, kept + lines.get(4).substring(0, 3), StandardCharsets.UTF_8);
        Run second = run("label", "--in", in.toString(), "--out", out.toString());
        List<String> again = Files.readAllLines(out);
        assertEquals(5, again.size(), String.join("\n", again));
        assertTrue(second.err().get(second.err().size() - 1).contains("1 labelled"), String.join("\n", second.err()));
    }

    @Test
    void k3RowsAreIntegral(@TempDir Path dir) throws IOException {
        // K3 surfaces: h11 = 20 (standard textbook value, from memory); h21 = 0 is written explicitly.
        Path in = dir.resolve("k3.txt");
        Path out = dir.resolve("k3.tsv");
        Files.writeString(in, "3:4\n", StandardCharsets.UTF_8);
        assertEquals(0, run("label", "--in", in.toString(), "--out", out.toString()).exit());
        assertEquals(List.of("config\th11\th21\tstatus\tsource", "3:4\t20\t0\texact\tcomputed"), Files.readAllLines(out));
    }

    @Test
    void resultsKeepTheInputOrderBeyondTheWindowOfResultsInFlight(@TempDir Path dir) throws IOException {
        // More lines than the 2 x 256 results held in flight with 2 threads: the printing must go on while
        // the input is read, in input order, and a bad line among them is still reported.
        Path space = dir.resolve("space.txt");
        assertEquals(0, run("enumerate", "--dim", "3", "--max-rows", "4", "--out", space.toString()).exit());
        List<String> lines = new java.util.ArrayList<>(Files.readAllLines(space));
        assertTrue(lines.size() > 2 * 256 + 100, "size " + lines.size());
        lines.add(300, "not a matrix");
        Files.write(space, lines);
        Run r = run("hodge", "--json", "--threads", "2", "--file", space.toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(1, r.err().size(), String.join("\n", r.err()));
        assertTrue(r.err().get(0).contains("line 301"), r.err().get(0));
        assertEquals(lines.size() - 1, r.out().size());
        List<String> inputs = new java.util.ArrayList<>();
        for (String line : r.out()) {
            inputs.add(JSON.readTree(line).get("input").asText());
        }
        List<String> expected = new java.util.ArrayList<>();
        for (String line : lines) {
            expected.add(line.split("\t")[0].strip());
        }
        expected.remove(300);
        assertEquals(expected, inputs);
    }
}
