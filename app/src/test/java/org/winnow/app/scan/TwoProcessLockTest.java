package org.winnow.app.scan;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.sink.ScanFiles;

/**
 * The directory lock across processes: while one JVM holds a scan directory's lock (taken by the call
 * {@code winnow scan} makes, {@link LockHolder}), a second JVM's {@code winnow scan} and {@code winnow verify}
 * are refused in one line that names the holder's process; after the holder is killed with SIGKILL its lock
 * is gone with it (the file stays, with the dead holder's note), and a {@code winnow scan} into the directory
 * runs to the end, as docs/scan-pipeline.md says ("no stale lock to clean up").
 */
class TwoProcessLockTest {
    private static final List<String> JVM = List.of("-Xmx256m", "-XX:TieredStopAtLevel=1");
    /** Generous: a child JVM starts slowly on a loaded machine, and nothing here waits on a fixed pause. */
    private static final long WAIT_NANOS = TimeUnit.MINUTES.toNanos(3);

    @Test
    void aSecondProcessIsRefusedNamingTheHolderAndADeadHoldersLockIsGone(@TempDir Path tmp) throws Exception {
        Path model = ScanFixtures.saveModel(tmp);
        Path dir = Files.createDirectories(tmp.resolve("scan"));
        Process holder = ChildJvm.java(tmp.resolve("holder.log"), JVM, LockHolder.class.getName(),
                List.of(dir.toString(), "0123456789abcdef")).start();
        Path input = Files.writeString(tmp.resolve("in.txt"), "4:5\n2:3/2:3\n3:4/1:2\n");
        List<String> scan = List.of("scan", "--input", input.toString(), "--model", model.toString(), "--out",
                dir.toString());
        Path log = tmp.resolve("second.log");
        try {
            awaitNote(dir, holder, tmp.resolve("holder.log"));
            int code = ChildJvm.run(log, JVM, scan);
            refusedNamingHolder(code, log, "winnow scan: ", dir, holder, "; wait for it to end, or give another directory");
            code = ChildJvm.run(log, JVM, List.of("verify", dir.toString()));
            refusedNamingHolder(code, log, "winnow verify: ", dir, holder, "; check it when that scan has stopped");
            assertTrue(holder.isAlive(), "the holder held the lock while the others were refused");
        } finally {
            holder.destroyForcibly();
            assertTrue(holder.waitFor(60, TimeUnit.SECONDS), "the holder did not end");
        }
        String dead = Files.readString(dir.resolve(ScanFiles.LOCK));
        assertTrue(dead.contains("process " + holder.pid() + " "), "the file keeps the dead holder's note: " + dead);
        int code = ChildJvm.run(log, JVM, scan);
        assertEquals(0, code, read(log));
        assertTrue(read(log).contains(" complete: 3 candidates"), read(log));
        assertFalse(Files.readString(dir.resolve(ScanFiles.LOCK)).contains("process " + holder.pid() + " "),
                "the scan wrote its own note over the dead holder's");
        assertEquals(0, ChildJvm.run(log, JVM, List.of("verify", dir.toString())), read(log));
    }

    /** Waits until {@code p} has taken the lock and written its note into the lock file. */
    private static void awaitNote(Path dir, Process p, Path log) throws IOException, InterruptedException {
        Path lock = dir.resolve(ScanFiles.LOCK);
        long deadline = System.nanoTime() + WAIT_NANOS;
        while (!(Files.exists(lock) && Files.readString(lock).contains("process " + p.pid() + " "))) {
            assertTrue(p.isAlive(), () -> "the holder ended early: " + read(log));
            assertTrue(System.nanoTime() < deadline, "no lock note of process " + p.pid());
            Thread.sleep(50);
        }
    }

    private static void refusedNamingHolder(int code, Path log, String command, Path dir, Process holder, String end)
            throws IOException {
        List<String> lines = new ArrayList<>(Files.readAllLines(log));
        // The test class path holds two SLF4J providers (the Kafka test kit brings one), and SLF4J says so on
        // standard error; the built jar has one. Those lines are the class path's, not the command's.
        lines.removeIf(l -> l.isBlank() || l.startsWith("SLF4J("));
        assertEquals(1, lines.size(), "one line: " + lines);
        String line = lines.get(0);
        assertTrue(code != 0, line);
        assertTrue(line.startsWith(command + dir + ": in use by winnow scan ") && line.contains("process "
                + holder.pid() + " on ") && line.endsWith(end), line);
        assertFalse(line.contains("Exception"), line);
    }

    private static String read(Path log) {
        try {
            return Files.readString(log);
        } catch (IOException e) {
            return "(no log: " + e.getMessage() + ")";
        }
    }
}
