package org.winnow.app.scan;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;

/**
 * {@code winnow scan} as a separate JVM, killed with SIGKILL at seeded random moments and rerun: the
 * files a rerun completes equal those of an uninterrupted run, and nothing under a committed name is
 * ever partial.
 */
class ScanKillTest {
    private static final List<String> JVM = List.of("-Xmx256m", "-XX:TieredStopAtLevel=1");

    @Test
    void killedAtRandomMomentsAndRerunGivesTheUninterruptedFiles(@TempDir Path dir) throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        ScanFixtures.Input in = ScanFixtures.input(dir, 33, 1500);
        Path ref = dir.resolve("ref");
        Path killed = dir.resolve("killed");
        Path log = dir.resolve("child.log");

        assertEquals(0, ChildJvm.run(log, JVM, args(model, in.file(), ref)), () -> read(log));
        Manifest reference = Manifest.read(ref.resolve(ScanFiles.MANIFEST));
        assertTrue(reference.complete());
        assertTrue(reference.survivorFiles().size() >= 5, "too few parts to test the roll-over");

        // Kill points: seeded positions in the scan, in increasing order; each child runs until its
        // committed point reaches the next one, then lives a random few milliseconds more and is killed,
        // so the kills fall between (or inside) the sink's durable steps wherever the scan stands.
        SplittableRandom rnd = new SplittableRandom(2026);
        long total = reference.counts().candidates();
        long[] targets = rnd.longs(6, total / 20, total * 9 / 10).sorted().toArray();
        int kills = 0;
        java.util.Set<Long> midScan = new java.util.TreeSet<>();
        for (long target : targets) {
            Process p = ChildJvm.winnow(log, JVM, args(model, in.file(), killed)).start();
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
            while (p.isAlive() && committed(killed) < target && System.nanoTime() < deadline) {
                Thread.sleep(5);
            }
            Thread.sleep(rnd.nextInt(30));
            if (p.isAlive()) {
                p.destroyForcibly();
                kills++;
            }
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "the child did not end");
            if (p.exitValue() == 0) {
                assertTrue(Manifest.read(killed.resolve(ScanFiles.MANIFEST)).complete());
            }
            committedFilesAreFinal(killed, ref);
            long next = committed(killed);
            if (next > 0 && next < total) {
                midScan.add(next);
            }
        }
        assertEquals(0, ChildJvm.run(log, JVM, args(model, in.file(), killed)), () -> read(log));
        assertTrue(kills >= 4, "only " + kills + " of 6 children were still running when killed");
        assertTrue(midScan.size() >= 2, "kills left committed points " + midScan + ", too few inside the scan");

        Manifest done = Manifest.read(killed.resolve(ScanFiles.MANIFEST));
        assertTrue(done.complete());
        assertEquals(reference.runId(), done.runId());
        assertEquals(reference.counts(), done.counts());
        assertEquals(reference.survivorFiles(), done.survivorFiles());
        assertEquals(reference.rejectFiles(), done.rejectFiles());
        for (String f : concat(reference.survivorFiles(), reference.rejectFiles())) {
            assertArrayEquals(Files.readAllBytes(ref.resolve(f)), Files.readAllBytes(killed.resolve(f)), f);
        }
        try (Stream<Path> s = Files.list(killed)) {
            assertEquals(List.of(), s.map(p -> p.getFileName().toString()).filter(n -> n.endsWith(".partial")).toList(),
                    "partial files left after the scan completed");
        }
    }

    /**
     * Whatever a killed run left: every file under a final name, and every file the manifest names,
     * equals the uninterrupted run's file of that name, byte for byte.
     */
    private static void committedFilesAreFinal(Path killed, Path ref) throws Exception {
        if (!Files.isDirectory(killed)) {
            return;
        }
        List<String> finalNames;
        try (Stream<Path> s = Files.list(killed)) {
            finalNames = s.map(p -> p.getFileName().toString())
                    .filter(n -> !n.startsWith(".") && (n.startsWith(ScanFiles.SURVIVORS) || n.startsWith(ScanFiles.REJECTS)))
                    .toList();
        }
        for (String n : finalNames) {
            assertFalse(n.endsWith(".partial"), n);
            assertArrayEquals(Files.readAllBytes(ref.resolve(n)), Files.readAllBytes(killed.resolve(n)), n);
        }
        Path manifest = killed.resolve(ScanFiles.MANIFEST);
        if (Files.exists(manifest)) {
            Manifest m = Manifest.read(manifest);
            for (String f : concat(m.survivorFiles(), m.rejectFiles())) {
                assertTrue(finalNames.contains(f), "the manifest names " + f + ", which is not there under its final name");
            }
        }
    }

    /** The checkpoint's next seq, or 0 before the first checkpoint (or while it is being replaced). */
    private static long committed(Path dir) {
        try {
            return new com.fasterxml.jackson.databind.ObjectMapper().readTree(dir.resolve("checkpoint.json").toFile())
                    .get("nextSeq").asLong();
        } catch (java.io.IOException | RuntimeException e) {
            return 0;
        }
    }

    private static List<String> args(Path model, Path input, Path out) {
        return List.of("scan", "--model", model.toString(), "--input", input.toString(), "--keep", "h11=2..5", "--keep",
                "chi=-150..0", "--min-confidence", "0.5", "--novelty", "0.9", "--threads", "1", "--rejects",
                "--lines-per-file", "20", "--queue", "4", "--out", out.toString());
    }

    private static List<String> concat(List<String> a, List<String> b) {
        List<String> all = new ArrayList<>(a);
        all.addAll(b);
        return all;
    }

    private static String read(Path log) {
        try {
            return Files.readString(log, StandardCharsets.UTF_8);
        } catch (java.io.IOException e) {
            return "(no log: " + e + ")";
        }
    }
}
