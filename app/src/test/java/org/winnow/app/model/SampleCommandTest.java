package org.winnow.app.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.TreeMap;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import picocli.CommandLine;

/** {@code winnow sample}: per-class counts, products left out, independent of the input order. */
class SampleCommandTest {
    private static int run(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(new StringWriter(), true));
        return cl.execute(args);
    }

    @Test
    void drawsEachClassLikeTrainingAndLeavesProductsOut(@TempDir Path dir) throws IOException {
        Path space = dir.resolve("space.txt");
        assertEquals(0, run("enumerate", "--dim", "3", "--max-rows", "3", "--out", space.toString()));
        Path all = dir.resolve("all.tsv");
        assertEquals(0, run("label", "--in", space.toString(), "--out", all.toString()));
        List<String> lines = Files.readAllLines(all);
        Map<Integer, Integer> perClass = new TreeMap<>();
        int products = 0;
        for (String l : lines.subList(1, lines.size())) {
            if (l.endsWith("\tproduct")) {
                products++;
                continue;
            }
            perClass.merge(Integer.parseInt(l.split("\t")[1]), 1, Integer::sum);
        }
        assertTrue(products > 0, "the space has products");
        Path sample = dir.resolve("sample.tsv");
        assertEquals(0, run("sample", "--reference", all.toString(), "--out", sample.toString(), "--fraction", "0.1",
                "--min-per-class", "2", "--seed", "7"));
        List<String> drawn = Files.readAllLines(sample);
        assertEquals(lines.get(0), drawn.get(0));
        Map<Integer, Integer> drawnPerClass = new TreeMap<>();
        for (String l : drawn.subList(1, drawn.size())) {
            assertTrue(lines.contains(l), l);
            assertTrue(l.endsWith("\tcomputed"), l);
            drawnPerClass.merge(Integer.parseInt(l.split("\t")[1]), 1, Integer::sum);
        }
        for (Map.Entry<Integer, Integer> e : perClass.entrySet()) {
            int s = e.getValue();
            assertEquals((int) Math.max(Math.round(0.1 * s), Math.min(2, s)), drawnPerClass.get(e.getKey()),
                    "h11 = " + e.getKey());
        }
        // The same draw from the same rows in another order.
        List<String> body = new ArrayList<>(lines.subList(1, lines.size()));
        Collections.shuffle(body, new Random(3));
        body.add(0, lines.get(0));
        Path shuffled = dir.resolve("shuffled.tsv");
        Files.write(shuffled, body);
        Path again = dir.resolve("again.tsv");
        assertEquals(0, run("sample", "--reference", shuffled.toString(), "--out", again.toString(), "--fraction", "0.1",
                "--min-per-class", "2", "--seed", "7"));
        assertEquals(drawn, Files.readAllLines(again));
        assertEquals(Exit.BAD_INPUT, run("sample", "--reference", all.toString(), "--out", again.toString(), "--fraction",
                "0"));
    }

    /**
     * {@code --min-per-class 0} with a fraction too small for any class wrote a header-only file with exit 0;
     * refused now, and a class that drops out is named in a warning.
     */
    @Test
    void aSampleWithNoRowIsRefusedAndADroppedClassIsWarnedAbout(@TempDir Path dir) throws IOException {
        // Hodge numbers of the quintic, the (3,3) and (2,4) complete intersections in P^5 and the bicubic in
        // P^2 x P^2: standard values, from memory.
        Path ref = Files.writeString(dir.resolve("ref.tsv"), "config\th11\th21\tstatus\tsource\n"
                + "4:5\t1\t101\texact\tcomputed\n5:3,3\t1\t73\texact\tcomputed\n5:2,4\t1\t89\texact\tcomputed\n"
                + "2:3/2:3\t2\t83\texact\tcomputed\n");
        Path out = dir.resolve("sample.tsv");
        StringWriter err = new StringWriter();
        CommandLine cl = WinnowCli.commandLine();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(err, true));
        assertEquals(Exit.BAD_INPUT, cl.execute("sample", "--reference", ref.toString(), "--out", out.toString(),
                "--fraction", "0.01", "--min-per-class", "0"));
        assertEquals("winnow sample: --fraction 0.01 with --min-per-class 0 picks no row of the 4 exact rows; raise "
                + "--fraction or --min-per-class\n", err.toString());
        assertTrue(Files.notExists(out), "no header-only file");
        // round(0.4 * 3) = 1 of h11 = 1, round(0.4 * 1) = 0 of h11 = 2.
        StringWriter err2 = new StringWriter();
        cl.setErr(new PrintWriter(err2, true));
        assertEquals(0, cl.execute("sample", "--reference", ref.toString(), "--out", out.toString(), "--fraction",
                "0.4", "--min-per-class", "0"));
        assertEquals(2, Files.readAllLines(out).size());
        assertEquals(List.of("winnow sample: 1 of 4 exact rows (1 h11 classes), 0 products left out",
                "winnow sample: warning: 1 of the 2 h11 classes have no row in the sample (--min-per-class 0); a model"
                        + " trained on it cannot predict them"), List.of(err2.toString().split("\n")));
        Path none = Files.writeString(dir.resolve("bounded.tsv"), "config\th11\th21\tstatus\tsource\n"
                + "4:5\t1\t101\tbounded\tcomputed\n");
        StringWriter err3 = new StringWriter();
        cl.setErr(new PrintWriter(err3, true));
        assertEquals(Exit.BAD_INPUT, cl.execute("sample", "--reference", none.toString(), "--out",
                dir.resolve("s2.tsv").toString(), "--fraction", "1"));
        assertEquals("winnow sample: " + none + ": no exact row to sample from (1 rows, 0 products left out; --products"
                + " keeps them)\n", err3.toString());
    }
}
