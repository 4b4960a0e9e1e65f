package org.winnow.app.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.File;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.text.BoundedLineReader;
import org.winnow.scorer.rules.RuleException;
import org.winnow.scorer.rules.RulesFile;
import picocli.CommandLine;

/**
 * What a new user and a hostile tester hit: each test is one reproduction, named for the bug, with the
 * command that showed it. Every refusal must be one line on standard error and a non-zero exit.
 */
class HostileInputRegressionTest {
    private record Run(int exit, String out, String err) {
        List<String> errLines() {
            return err.isEmpty() ? List.of() : List.of(err.split("\n"));
        }
    }

    private static Run winnow(String... args) {
        CommandLine cl = WinnowCli.commandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int exit = cl.execute(args);
        return new Run(exit, out.toString(), err.toString());
    }

    /** {@code java ... WinnowCli args} on this test's class path, as the launcher runs it. */
    private static ProcessBuilder child(List<String> args) {
        List<String> cmd = new ArrayList<>();
        cmd.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        cmd.add("-cp");
        cmd.add(System.getProperty("surefire.test.class.path", System.getProperty("java.class.path")));
        cmd.add(WinnowCli.class.getName());
        cmd.addAll(args);
        return new ProcessBuilder(cmd);
    }

    /** {@code winnow hodge 4:5 > /dev/full} used to exit 0 with no message. */
    @Test
    void hodgeToAFullDeviceFailsInOneLine(@TempDir Path tmp) throws Exception {
        File full = new File("/dev/full");
        assumeTrue(full.exists(), "no /dev/full here");
        Path err = tmp.resolve("err");
        int exit = child(List.of("hodge", "4:5")).redirectOutput(full).redirectError(err.toFile()).start().waitFor();
        assertEquals(Exit.STOPPED, exit);
        assertEquals(List.of(CheckedOutput.STDOUT_FAILED), Files.readAllLines(err));
    }

    /**
     * {@code winnow enumerate --dim 3 --max-rows 3 > small-tmpfs/e.txt} used to exit 0 with 143 of 331 lines.
     * On a device that refuses every write the enumeration stops within a few thousand lines.
     */
    @Test
    void enumerateToAFullDeviceStopsAndFailsInOneLine(@TempDir Path tmp) throws Exception {
        File full = new File("/dev/full");
        assumeTrue(full.exists(), "no /dev/full here");
        Path err = tmp.resolve("err");
        int exit = child(List.of("enumerate", "--dim", "3", "--max-rows", "3")).redirectOutput(full)
                .redirectError(err.toFile()).start().waitFor();
        assertEquals(Exit.STOPPED, exit);
        List<String> lines = Files.readAllLines(err);
        assertEquals(1, lines.size(), lines.toString());
        assertTrue(lines.get(0).startsWith("winnow enumerate: cannot write standard output"), lines.get(0));
    }

    /** {@code enumerate --out} on a full disk used to leave a partial file under its final name. */
    @Test
    void aFailedOutFileLeavesTheOldFileAndNoTemporary(@TempDir Path tmp) throws Exception {
        Path target = Files.writeString(tmp.resolve("e.txt"), "old content\n");
        IOException e = assertThrows(IOException.class, () -> CheckedOutput.replace(target, w -> {
            w.write("half of the new content\n".repeat(10_000));
            throw new IOException("No space left on device");
        }));
        assertEquals("No space left on device", e.getMessage());
        assertEquals("old content\n", Files.readString(target));
        try (var s = Files.list(tmp)) {
            assertEquals(List.of(target), s.toList(), "the temporary file is removed");
        }
        Run r = winnow("enumerate", "--dim", "3", "--max-rows", "2", "--out", tmp.resolve("ok.txt").toString());
        assertEquals(0, r.exit(), r.err());
        assertEquals(Files.readAllLines(tmp.resolve("ok.txt")).size(), Integer.parseInt(winnow("enumerate", "--dim",
                "3", "--max-rows", "2", "--count").out().lines().filter(l -> l.startsWith("total: ")).findFirst()
                .orElseThrow().substring(7)));
    }

    /**
     * {@code winnow hodge --file - <&-} used to read whatever the JVM had opened as descriptor 0, print a
     * million error lines and crash (exit 139).
     */
    @Test
    void hodgeWithStandardInputClosedIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        assumeTrue(new File("/proc/self/fd").isDirectory() && new File("/bin/sh").canExecute(), "Linux only");
        List<String> cmd = new ArrayList<>(List.of("/bin/sh", "-c", "exec \"$@\" <&-", "sh"));
        cmd.addAll(child(List.of("hodge", "--file", "-")).command());
        Path err = tmp.resolve("err");
        Process p = new ProcessBuilder(cmd).redirectOutput(tmp.resolve("out").toFile()).redirectError(err.toFile()).start();
        assertTrue(p.waitFor(60, java.util.concurrent.TimeUnit.SECONDS), "no hang");
        assertEquals(Exit.BAD_INPUT, p.exitValue());
        List<String> lines = Files.readAllLines(err);
        assertEquals(1, lines.size(), lines.size() + " lines, first: " + (lines.isEmpty() ? "" : lines.get(0)));
        assertTrue(lines.get(0).startsWith("winnow hodge: standard input: standard input is closed"), lines.get(0));
    }

    /**
     * One invalid UTF-8 byte used to make {@code invariants --file} refuse the whole file ("Input length = 1",
     * no line number, zero results). Now that line is a bad line with its number and the rest is read.
     */
    @Test
    void anInvalidUtf8ByteIsABadLineWithItsNumber(@TempDir Path tmp) throws Exception {
        Path f = tmp.resolve("in.txt");
        Files.write(f, new byte[] {'4', ':', '5', '\n', (byte) 0xFF, ':', '5', '\n', '2', ':', '3', '/', '2', ':', '3', '\n'});
        for (String command : List.of("invariants", "hodge")) {
            Run r = winnow(command, "--file", f.toString());
            assertEquals(Exit.BAD_INPUT, r.exit(), command);
            assertEquals(2, r.out().lines().count(), command + ": " + r.out());
            assertEquals(1, r.errLines().size(), r.err());
            assertTrue(r.err().contains(f + " line 2") && r.err().contains("not valid UTF-8"), r.err());
        }
    }

    /** A 10 MB bad line used to be echoed whole to standard error. */
    @Test
    void aHugeBadLineIsCutInTheMessage(@TempDir Path tmp) throws Exception {
        Path f = tmp.resolve("in.txt");
        Files.writeString(f, "4:5\n" + "x".repeat(1_000_000) + "\n", StandardCharsets.UTF_8);
        Run r = winnow("invariants", "--file", f.toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(1, r.errLines().size());
        assertTrue(r.err().length() < 400 && r.err().contains("... (1000000 characters)"), r.err());
    }

    /** Fullwidth digits used to be read as numbers ("degree sum 65253"). */
    @Test
    void fullwidthDigitsAreRefused() {
        Run r = winnow("invariants", "4:\uFF15");
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertTrue(r.err().contains("U+FF15") && !r.err().contains("65253"), r.err());
        assertEquals("", r.out());
    }

    /** {@code --threads 100000} used to be accepted and took 46 s and 5.8 GB for two lines. */
    @Test
    void threadsBeyondTheBoundAreRefused() {
        Run r = winnow("hodge", "--threads", "100000", "4:5");
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow hodge: " + Limits.threadsProblem(100_000)), r.errLines());
        assertNotEquals(null, Limits.threadsProblem(Limits.maxThreads() + 1));
        assertEquals(null, Limits.threadsProblem(Limits.maxThreads()));
        // The enumeration's threads had only a lower bound: 100,000 of them took half a minute to start.
        String tooMany = Limits.threadsProblem("--enumerate-threads", 100_000);
        assertTrue(tooMany.startsWith("--enumerate-threads 100000 is more than "), tooMany);
        Run scan = winnow("scan", "--dim", "3", "--max-rows", "1", "--model", DEMO_MODEL.toString(), "--out",
                "never-written", "--enumerate-threads", "100000");
        assertEquals(List.of("winnow scan: " + tooMany), scan.errLines());
        Run label = winnow("label", "--dim", "3", "--max-rows", "1", "--out", "never-written.tsv",
                "--enumerate-threads", "100000");
        assertEquals(List.of("winnow label: " + tooMany), label.errLines());
        Run enumerate = winnow("enumerate", "--dim", "3", "--max-rows", "1", "--threads", "100000");
        assertEquals(List.of("winnow enumerate: " + Limits.threadsProblem(100_000)), enumerate.errLines());
        assertEquals(List.of(Exit.BAD_INPUT, Exit.BAD_INPUT, Exit.BAD_INPUT), List.of(scan.exit(), label.exit(),
                enumerate.exit()));
        assertFalse(Files.exists(Path.of("never-written")) || Files.exists(Path.of("never-written.tsv")));
    }

    /** {@code scan --input adir} used to say only "Is a directory". */
    @Test
    void scanInputThatIsADirectoryIsRefusedSayingSo(@TempDir Path tmp) {
        Run r = winnow("scan", "--model", tmp.resolve("m.wnm").toString(), "--input", tmp.toString(), "--out",
                tmp.resolve("o").toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow scan: --input " + tmp + ": is a directory; give a file of configurations, one a line"),
                r.errLines());
    }

    /** A read-only or occupied output directory used to give only a path ({@code winnow scan: o/isfile}). */
    @Test
    void labelIntoADirectoryFailsInOneLine(@TempDir Path tmp) throws Exception {
        Path in = Files.writeString(tmp.resolve("in.txt"), "4:5\n");
        Path out = Files.createDirectory(tmp.resolve("out.tsv"));
        Run r = winnow("label", "--in", in.toString(), "--out", out.toString());
        assertNotEquals(0, r.exit());
        assertEquals(1, r.errLines().size(), r.err());
        assertTrue(r.err().startsWith("winnow label: " + out + ": "), r.err());
    }

    /** {@code novelty 2} and duplicate rules in a rules file used to lack the file and line. */
    @Test
    void rulesFileErrorsNameFileAndLine(@TempDir Path tmp) throws Exception {
        Path f = Files.writeString(tmp.resolve("rules.txt"), "keep h11=2..5\nnovelty 2\n");
        RuleException e = assertThrows(RuleException.class, () -> RulesFile.read(f));
        assertEquals(f + ":2: rule 'novelty 2': must be in (0, 1]", e.getMessage());
        Files.writeString(f, "keep h11=2..5\n# a comment\nkeep h11=3..4\n");
        e = assertThrows(RuleException.class, () -> RulesFile.read(f));
        assertTrue(e.getMessage().startsWith(f + ":3: rule 'keep h11=3..4': h11 already has a range at " + f + ":1"),
                e.getMessage());
        Files.writeString(f, "min-confidence 0.5\nmin-confidence 0.7\n");
        assertTrue(assertThrows(RuleException.class, () -> RulesFile.read(f)).getMessage().startsWith(f + ":2: "));
        Files.write(f, new byte[] {'k', 'e', 'e', 'p', ' ', 'h', '1', '1', '=', (byte) 0xC3, '\n'});
        assertTrue(assertThrows(RuleException.class, () -> RulesFile.read(f)).getMessage().startsWith(f + ":1: "));
    }

    /** A configuration line and then one line longer than any reader takes: no newline for 8 Mi + 1 characters. */
    private static Path fileWithAnEndlessSecondLine(Path tmp) throws IOException {
        Path f = tmp.resolve("long.txt");
        Files.writeString(f, "4:5\n" + "1".repeat(BoundedLineReader.MAX_LINE + 1) + "\n2:3/2:3\n");
        return f;
    }

    private static final String TOO_LONG = " line 2: longer than 8388608 characters; is it a text file with one entry"
            + " a line?";

    private static final Path DEMO_MODEL = Path.of("../demo-data/threefolds-1pct.wnm");

    /** {@code winnow hodge --file /dev/zero} used to run out of memory with a stack trace. */
    @Test
    void hodgeRefusesALineLongerThanTheLimitNamingFileAndLine(@TempDir Path tmp) throws Exception {
        Path f = fileWithAnEndlessSecondLine(tmp);
        Run r = winnow("hodge", "--file", f.toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow hodge: " + f + TOO_LONG), r.errLines());
        assertTrue(r.out().startsWith("4:5"), r.out());
        Run inv = winnow("invariants", "--file", f.toString());
        assertEquals(Exit.BAD_INPUT, inv.exit());
        assertEquals(List.of("winnow invariants: " + f + TOO_LONG), inv.errLines());
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.isReadable(zero), "no /dev/zero here");
        Run z = winnow("hodge", "--file", zero.toString());
        assertEquals(Exit.BAD_INPUT, z.exit());
        assertEquals(List.of("winnow hodge: /dev/zero line 1: longer than 8388608 characters; is it a text file with"
                + " one entry a line?"), z.errLines());
    }

    /** {@code winnow scan --input /dev/zero} used to hang counting the lines of an endless file. */
    @Test
    void scanRefusesAnEndlessLineAndAnInputThatIsNoRegularFile(@TempDir Path tmp) throws Exception {
        Path f = fileWithAnEndlessSecondLine(tmp);
        Run r = winnow("scan", "--model", DEMO_MODEL.toString(), "--input", f.toString(), "--out",
                tmp.resolve("o").toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow scan: --input " + f + TOO_LONG), r.errLines());
        assertFalse(Files.exists(tmp.resolve("o")), "nothing is written for refused input");
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.isReadable(zero), "no /dev/zero here");
        Run z = winnow("scan", "--model", DEMO_MODEL.toString(), "--input", zero.toString(), "--out",
                tmp.resolve("o").toString());
        assertEquals(Exit.BAD_INPUT, z.exit());
        assertEquals(List.of("winnow scan: --input /dev/zero: not a regular file (a pipe or a device); scan reads its"
                + " input more than once, so give a file of configurations, one a line"), z.errLines());
        Path good = Files.writeString(tmp.resolve("good.txt"), "4:5\n");
        Run m = winnow("scan", "--model", zero.toString(), "--input", good.toString(), "--out",
                tmp.resolve("o").toString());
        assertEquals(Exit.BAD_INPUT, m.exit());
        assertEquals(1, m.errLines().size(), m.err());
        assertTrue(m.err().startsWith("winnow scan: --model /dev/zero: not a regular file"), m.err());
    }

    /** {@code winnow label --in} on a file with an endless line, and on a device, in one line each. */
    @Test
    void labelRefusesAnEndlessLineAndAnInputThatIsNoRegularFile(@TempDir Path tmp) throws Exception {
        Path f = fileWithAnEndlessSecondLine(tmp);
        Path out = tmp.resolve("labels.tsv");
        Run r = winnow("label", "--in", f.toString(), "--out", out.toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow label: " + f + TOO_LONG), r.errLines());
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.isReadable(zero), "no /dev/zero here");
        Run z = winnow("label", "--in", zero.toString(), "--out", out.toString());
        assertEquals(Exit.BAD_INPUT, z.exit());
        assertEquals(1, z.errLines().size(), z.err());
        assertTrue(z.err().startsWith("winnow label: /dev/zero: not a regular file"), z.err());
    }

    /** A rules file over 1 MiB, {@code /dev/zero} and a directory as the rules file: one line each, exit 2. */
    @Test
    void aRulesFileThatIsTooLargeOrADirectoryIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        Path big = tmp.resolve("rules.txt");
        // Valid rules and comments, but more bytes than a rules file may have.
        Files.writeString(big, "keep h11=2..5\n" + "# padding\n".repeat(RulesFile.MAX_BYTES / 10 + 1));
        RuleException e = assertThrows(RuleException.class, () -> RulesFile.read(big));
        assertEquals(big + ": longer than 1048576 bytes (1 MiB), which no rules file needs; is it the right file?",
                e.getMessage());
        Files.writeString(big, "keep h11=2..5\n" + "#".repeat(RulesFile.MAX_BYTES - 15) + "\n");
        assertEquals(RulesFile.MAX_BYTES, Files.size(big));
        assertEquals(List.of("h11=2..5"), RulesFile.read(big).keeps(), "a file of exactly the limit is read");
        Path input = Files.writeString(tmp.resolve("in.txt"), "4:5\n");
        Run dir = winnow("scan", "--model", DEMO_MODEL.toString(), "--input", input.toString(), "--rules-file",
                tmp.toString(), "--out", tmp.resolve("o").toString());
        assertEquals(Exit.BAD_INPUT, dir.exit());
        assertEquals(List.of("winnow scan: " + tmp + ": is a directory; give a text file of rules, one a line"),
                dir.errLines());
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.isReadable(zero), "no /dev/zero here");
        Run z = winnow("scan", "--model", DEMO_MODEL.toString(), "--input", input.toString(), "--rules-file",
                zero.toString(), "--out", tmp.resolve("o").toString());
        assertEquals(Exit.BAD_INPUT, z.exit());
        assertEquals(List.of("winnow scan: /dev/zero: longer than 1048576 bytes (1 MiB), which no rules file needs; "
                + "is it the right file?"), z.errLines());
    }

    /** A reference file with an endless line is refused by its line, as every other bad reference line. */
    @Test
    void aReferenceWithAnEndlessLineIsRefusedByItsLine(@TempDir Path tmp) throws Exception {
        Path f = tmp.resolve("ref.tsv");
        Files.writeString(f, "config\th11\th21\tstatus\tsource\n" + "x".repeat(BoundedLineReader.MAX_LINE + 1));
        Run r = winnow("sample", "--reference", f.toString(), "--fraction", "0.5", "--out",
                tmp.resolve("s.tsv").toString());
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow sample: " + f + ":" + TOO_LONG), r.errLines());
    }

    /** {@code winnow demo --out FILE} on an existing regular file threw a stack trace from creating the directory. */
    @Test
    void demoOutThatIsAFileIsRefusedInOneLineAndTheFileKept(@TempDir Path tmp) throws Exception {
        Path file = Files.writeString(tmp.resolve("notes.txt"), "mine\n");
        Run r = winnow("demo", "--out", file.toString(), "--data", "../demo-data");
        assertEquals(Exit.BAD_INPUT, r.exit());
        assertEquals(List.of("winnow demo: --out " + file + ": exists and is not a directory; the demo writes its scan"
                + " into a directory (" + file.resolve("scan") + "), give another --out DIR"), r.errLines());
        assertEquals("mine\n", Files.readString(file));
        Path below = file.resolve("sub");
        Run r2 = winnow("demo", "--out", below.toString(), "--data", "../demo-data");
        assertEquals(Exit.BAD_INPUT, r2.exit());
        assertEquals(1, r2.errLines().size(), r2.err());
        assertTrue(r2.err().startsWith("winnow demo: --out " + below + ": cannot create the directory ("), r2.err());
        assertEquals("", r.out() + r2.out(), "nothing started");
    }

    /**
     * An option picocli could not take printed its message and then the whole usage screen (30 lines for scan);
     * now one line naming the option and where the options are listed, exit 2, as every other refusal.
     */
    @Test
    void anOptionThatCannotBeParsedIsRefusedInOneLine() {
        Run big = winnow("demo", "--dim", "4", "--max-rows", "99999999999");
        assertEquals(Exit.BAD_INPUT, big.exit());
        assertEquals(List.of("winnow demo: Invalid value for option '--max-rows': '99999999999' is not an int (winnow "
                + "demo --help lists the options)"), big.errLines());
        Run missing = winnow("scan", "--dim", "4");
        assertEquals(Exit.BAD_INPUT, missing.exit());
        assertEquals(List.of("winnow scan: Missing required options: '--model=M', '--out=DIR' (winnow scan --help lists"
                + " the options)"), missing.errLines());
        Run unknown = winnow("labl", "--dim", "4");
        assertEquals(Exit.BAD_INPUT, unknown.exit());
        assertEquals(1, unknown.errLines().size(), unknown.err());
        assertTrue(unknown.err().startsWith("winnow: Unmatched arguments from index 0: 'labl', '--dim', '4'"),
                unknown.err());
        assertTrue(unknown.err().endsWith("(winnow --help lists the commands)\n"), unknown.err());
        Run control = winnow("hodge", "--threads", "2\n3");
        assertEquals(List.of("winnow hodge: Invalid value for option '--threads': '2?3' is not an int (winnow hodge "
                + "--help lists the options)"), control.errLines());
        assertEquals("", big.out() + missing.out() + unknown.out() + control.out());
    }

    /**
     * The demo ends with "compute the survivors exactly with winnow hodge --file SURVIVORS", and that refused the
     * file's header as a bad line with exit 2; a header whose first column is "config" is skipped now.
     */
    @Test
    void aSurvivorsFileIsAFileOfConfigurations(@TempDir Path tmp) throws Exception {
        Path f = Files.writeString(tmp.resolve("survivors-00001.tsv"), "# winnow survivors, format 2\n"
                + "config\tchi\th11\tnovelty\n4:5\t-200\t1\t0.5\n");
        Run r = winnow("hodge", "--file", f.toString());
        assertEquals(0, r.exit(), r.err());
        assertEquals("", r.err());
        assertTrue(r.out().startsWith("4:5 "), r.out());
        assertEquals(1, r.out().lines().count());
    }

    /** An empty input (or one of comments only) gave exit 0 and nothing, and label wrote a header-only file. */
    @Test
    void anInputWithoutAnyConfigurationIsRefused(@TempDir Path tmp) throws Exception {
        Path empty = Files.writeString(tmp.resolve("empty.txt"), "");
        Path comments = Files.writeString(tmp.resolve("comments.txt"), "\n# nothing yet\n\r\n");
        for (Path f : List.of(empty, comments)) {
            Run h = winnow("hodge", "--file", f.toString());
            assertEquals(Exit.BAD_INPUT, h.exit());
            assertEquals(List.of("winnow hodge: " + f + ": no configuration in it (empty, or only blank, comment and "
                    + "header lines)"), h.errLines());
            Run i = winnow("invariants", "4:5", "--file", f.toString());
            assertEquals(Exit.BAD_INPUT, i.exit());
            assertEquals(1, i.errLines().size(), i.err());
            assertTrue(i.out().startsWith("4:5 "), "the argument is still done: " + i.out());
            Path out = tmp.resolve("labels.tsv");
            Run l = winnow("label", "--in", f.toString(), "--out", out.toString());
            assertEquals(Exit.BAD_INPUT, l.exit());
            assertEquals(List.of("winnow label: " + f + ": no configuration in it (empty, or only blank and comment "
                    + "lines); nothing to label"), l.errLines());
            assertFalse(Files.exists(out), "no header-only output");
            Path scan = tmp.resolve("scan");
            Run s = winnow("scan", "--input", f.toString(), "--model", DEMO_MODEL.toString(), "--out", scan.toString());
            assertEquals(Exit.BAD_INPUT, s.exit());
            assertEquals(List.of("winnow scan: --input " + f + ": no configuration in it (empty, or only blank, comment"
                    + " and header lines)"), s.errLines());
            assertFalse(Files.exists(scan), "no scan of nothing");
        }
    }

    /** The checked exit leaves a command's own code and a clean stream alone. */
    @Test
    void aCleanStreamKeepsTheCommandsExitCode() {
        java.io.ByteArrayOutputStream sink = new java.io.ByteArrayOutputStream();
        java.io.PrintStream ok = new java.io.PrintStream(sink, true);
        java.io.ByteArrayOutputStream errBytes = new java.io.ByteArrayOutputStream();
        java.io.PrintStream err = new java.io.PrintStream(errBytes, true);
        assertEquals(2, CheckedOutput.exitCode(2, new PrintWriter(new StringWriter()), ok, err));
        assertEquals(0, CheckedOutput.exitCode(0, new PrintWriter(new StringWriter()), ok, err));
        assertFalse(errBytes.toString().contains("cannot"));
    }
}
