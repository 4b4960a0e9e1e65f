package org.winnow.app.scan;

import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine;

/** {@code winnow enumerate}: lines, counts, shards and one-line errors for bad bounds. */
class EnumerateCommandTest {
    private record Run(int exit, String out, String err) {}

    private static Run run(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    @Test
    void oneRowThreeFoldsAreTheFiveKnownOnes() {
        // "Complete Intersection Calabi-Yau Manifolds", Nucl. Phys. B298 (1988) 493
        Run r = run("enumerate", "--dim", "3", "--max-rows", "1");
        assertEquals(0, r.exit(), r.err());
        assertEquals(List.of("4:5", "5:3,3", "5:4,2", "6:3,2,2", "7:2,2,2,2"), r.out().lines().sorted().toList());
    }

    @Test
    void outputIsByteIdenticalForAnyNumberOfThreads() {
        Run one = run("enumerate", "--dim", "3", "--threads", "1");
        assertEquals(0, one.exit(), one.err());
        // 9,133 lossless three-folds (docs/enumeration.md, equal to the enumeration design's prototype)
        assertEquals(9133, one.out().lines().count());
        for (String threads : new String[] {"2", "3"}) {
            Run many = run("enumerate", "--dim", "3", "--threads", threads);
            assertEquals(0, many.exit(), many.err());
            assertEquals(one.out(), many.out(), threads + " threads");
            assertEquals("total: 9133", run("enumerate", "--dim", "3", "--threads", threads, "--count").out().lines()
                    .reduce((a, b) -> b).orElseThrow());
        }
        Run bad = run("enumerate", "--dim", "3", "--threads", "0");
        assertEquals(Exit.BAD_INPUT, bad.exit());
        assertEquals("winnow enumerate: --threads must be at least 1, got 0", bad.err().strip());
    }

    @Test
    void countPrintsOneLinePerRowNumberThenTheTotal() {
        Run r = run("enumerate", "--dim", "3", "--max-rows", "3", "--rules", "base", "--count");
        assertEquals(0, r.exit(), r.err());
        // base counts by rows, enumeration design §10 (independent prototype)
        assertEquals(List.of("rows=1: 5", "rows=2: 63", "rows=3: 438", "total: 506"), r.out().lines().toList());
    }

    @Test
    void theOlderSpellingRulesStillNamesTheExclusionSet() {
        Run old = run("enumerate", "--dim", "3", "--max-rows", "2", "--rules", "base");
        Run now = run("enumerate", "--dim", "3", "--max-rows", "2", "--exclusions", "base");
        Run lossless = run("enumerate", "--dim", "3", "--max-rows", "2", "--exclusions", "lossless");
        assertEquals(0, old.exit(), old.err());
        assertEquals(0, now.exit(), now.err());
        assertEquals(old.out(), now.out());
        // The base set drops fewer matrices than lossless, so the option really reached the enumerator.
        assertTrue(now.out().lines().count() > lossless.out().lines().count());
    }

    @Test
    void shardsWrittenToFilesAddUpToTheWhole(@TempDir Path dir) throws IOException {
        Run whole = run("enumerate", "--dim", "2", "--exclusions", "base", "--count");
        long total = Long.parseLong(whole.out().lines().reduce((a, b) -> b).orElseThrow().replace("total: ", ""));
        long sum = 0;
        for (int i = 0; i < 3; i++) {
            Path f = dir.resolve("s" + i);
            Run r = run("enumerate", "--dim", "2", "--rules", "base", "--shard", i + "/3", "--out", f.toString());
            assertEquals(0, r.exit(), r.err());
            sum += Files.readAllLines(f).size();
        }
        assertEquals(1350, total);
        assertEquals(total, sum);
    }

    @ParameterizedTest
    @ValueSource(strings = {"--dim=5", "--dim=0", "--max-rows=-1", "--min-rows=4 --max-rows=3", "--max-rows=17",
        "--max-cols=25", "--max-entry=0", "--rules=every", "--shard=3/3", "--shard=x"})
    void badBoundsGiveOneLineAndExitTwo(String options) {
        String[] args = ("enumerate --count " + options).split(" ");
        Run r = run(args);
        assertEquals(2, r.exit(), options + ": " + r.out());
        assertEquals(1, r.err().lines().count(), r.err());
        assertTrue(r.err().startsWith("winnow enumerate: "), r.err());
    }
}
