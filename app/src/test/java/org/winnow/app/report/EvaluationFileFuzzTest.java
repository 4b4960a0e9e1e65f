package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.random.RandomGenerator;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.model.Evaluation;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceTsv;
import org.winnow.testsupport.Damage;

/**
 * Seeded fuzzing of the {@code evaluation.json} reader behind {@code winnow report}: a real evaluation of the
 * demo model (on 300 rows of its labelled space that are not in its reference) edited at random, half of the
 * inputs with their checksum recomputed afterwards so that the consistency checks are reached too. Each input
 * must either read (and then render as a report page without an exception) or be refused with one line naming
 * the file; nothing else may come out. {@code -Dwinnow.fuzz.inputs=N} scales the run (N / 20, 5,000 by default).
 */
class EvaluationFileFuzzTest {
    private static final String[] TOKENS = {"null", "{}", "[]", "-1", "0", "1e400", "\"\"", "\"x\"", "true", ",", ":",
        "\"support\"", "\"confusion\"", "2147483648", "-0.5", "1.5", "NaN", "\u0000", "\uFF15", "\"", "{", "}", "[",
        "]", "\"/dev/zero\"", "\"../../x.png\""};
    private static final ObjectMapper JSON = new ObjectMapper();

    private static Path dir;
    private static String seed;

    @BeforeAll
    static void evaluate(@TempDir Path tmp) throws Exception {
        FrozenModel model = FrozenModel.load(DemoRun.MODEL);
        java.util.Set<String> seen = new java.util.HashSet<>(java.util.Arrays.asList(model.reference().configs()));
        InvariantCalculator calc = new InvariantCalculator();
        List<LabelledExample> test = new ArrayList<>();
        for (ReferenceTsv.Row r : ReferenceTsv.read(DemoRun.DATA.resolve("threefolds-exact.tsv"))) {
            if (r.exact() && !seen.contains(r.config().toText()) && test.size() < 300) {
                test.add(new LabelledExample(r.config(), calc.chi(r.config()), r.hodge()));
            }
        }
        Evaluation ev = Evaluation.of(model, test, test.get(0).h11());
        dir = tmp;
        Path png = Files.write(tmp.resolve("p.png"), new byte[] {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1A, '\n'});
        EvaluationFile.Context c = new EvaluationFile.Context(DemoRun.MODEL, model.checksum(), model.reference().size(),
                Path.of("test.tsv"), 0, 0, List.of("h11 accuracy: 0.5", "no colon here"), png, png, 0.25);
        seed = Files.readString(EvaluationFile.of(ev, c, tmp).write(tmp));
    }

    @Test
    void theSeedReadsAndRenders() throws Exception {
        EvaluationFile f = EvaluationFile.parse(seed.getBytes(StandardCharsets.UTF_8), dir.resolve("e.json"));
        assertTrue(f.examples() > 0 && f.holdoutExamples() > 0, "both parts of the evaluation are present");
        assertTrue(EvaluationHtml.render(f, dir, "t").contains("<section id=\"reliability\">"));
    }

    @Test
    void everyEditedFileReadsAndRendersOrIsRefusedInOneLine() throws Exception {
        int inputs = Integer.getInteger("winnow.fuzz.inputs", 100_000) / 20;
        RandomGenerator rnd = new SplittableRandom(20261205L);
        Path name = dir.resolve("fuzzed.json");
        int read = 0;
        int rendered = 0;
        int refused = 0;
        long start = System.nanoTime();
        for (int i = 0; i < inputs; i++) {
            String text = edit(seed, rnd);
            if (rnd.nextBoolean()) {
                text = rechecksummed(text);
            }
            try {
                EvaluationFile f = EvaluationFile.parse(text.getBytes(StandardCharsets.UTF_8), name);
                read++;
                // Rendering draws a chart; a sample of the files that read is enough to reach every branch.
                if (rendered < 60) {
                    EvaluationHtml.render(f, dir, "t");
                    rendered++;
                }
            } catch (IOException e) {
                String m = e.getMessage();
                assertTrue(m.startsWith(name + ": ") && !m.contains("\n") && m.length() < 500, "input " + i + ": " + m);
                refused++;
            } catch (RuntimeException e) {
                fail("input " + i + " threw " + e);
            }
        }
        assertTrue(refused > inputs / 2 && read > inputs / 100, "read " + read + ", refused " + refused);
        System.out.printf("evaluation file fuzz: %d inputs, %d read (%d rendered), %d refused, %.1f s%n", inputs, read,
                rendered, refused, (System.nanoTime() - start) / 1e9);
    }

    @Test
    void aPictureNameCannotMakeTheReportReadADeviceOrAnyFile(@TempDir Path tmp) throws Exception {
        ObjectNode tree = (ObjectNode) JSON.readTree(seed);
        tree.put("embeddingPlot", "/dev/zero");
        tree.put("confusionPlot", DemoRun.MODEL.toAbsolutePath().toString());
        EvaluationFile f = EvaluationFile.parse(rechecksummed(tree.toString()).getBytes(StandardCharsets.UTF_8),
                tmp.resolve("e.json"));
        String page = EvaluationHtml.render(f, tmp, "t");
        assertTrue(page.contains("<code>/dev/zero</code> cannot be read (not a regular file"), "device refused");
        assertTrue(page.contains("cannot be read (not a PNG picture)"), "a file that is not a PNG is not inlined");
    }

    @Test
    void anOlderFileOrOneEditedAfterWritingIsRefusedNamingIt(@TempDir Path tmp) throws Exception {
        Path file = tmp.resolve("evaluation.json");
        ObjectNode tree = (ObjectNode) JSON.readTree(seed);
        tree.put("formatVersion", 1);
        tree.remove("checksum");
        Files.writeString(file, tree.toString());
        IOException e = assertThrows(IOException.class, () -> EvaluationFile.read(file));
        assertEquals(file + ": evaluation file format 1, this version reads 2; run winnow evaluate --out again",
                e.getMessage());
        Files.writeString(file, seed.replaceFirst("\"examples\" : (\\d)", "\"examples\" : 9$1"));
        e = assertThrows(IOException.class, () -> EvaluationFile.read(file));
        assertEquals(file + ": its content differs from its own checksum (edited or damaged after it was written)",
                e.getMessage());
        Files.writeString(file, rechecksummed(seed.replaceFirst("\"examples\" : (\\d)", "\"examples\" : 9$1")));
        e = assertThrows(IOException.class, () -> EvaluationFile.read(file));
        assertTrue(e.getMessage().startsWith(file + ": the confusion matrix holds "), e.getMessage());
    }

    /** {@code text} with its checksum recomputed, when it is still a JSON object; else as it is. */
    private static String rechecksummed(String text) {
        try {
            if (!(JSON.readTree(text) instanceof ObjectNode tree)) {
                return text;
            }
            tree.remove(EvaluationFile.CHECKSUM);
            java.security.MessageDigest d = java.security.MessageDigest.getInstance("SHA-256");
            tree.put(EvaluationFile.CHECKSUM, java.util.HexFormat.of().formatHex(d.digest(JSON.writeValueAsBytes(tree))));
            return tree.toString();
        } catch (Exception e) {
            return text;
        }
    }

    private static String edit(String seed, RandomGenerator rnd) {
        return Damage.text(seed, rnd, TOKENS, 3, 12);
    }
}
