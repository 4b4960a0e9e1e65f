package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.SplittableRandom;
import java.util.TreeMap;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.local.PipelineException;

/**
 * Exactly once: a scan aborted at many random points and rerun each time ends with the same files
 * and counts as one that ran through, and at no moment does a final file name hold a partial file.
 */
class ResumptionTest {
    private static final SinkOptions OPTIONS = new SinkOptions(37, true, 50, Duration.ofMillis(500));
    private static final int ITEMS = 2500;

    /** A crash at the k-th durable step of this session. */
    private static final class CrashAt implements CrashHook {
        private final int at;
        private final AtomicInteger calls = new AtomicInteger();

        CrashAt(int at) {
            this.at = at;
        }

        @Override
        public void before(String step) {
            if (calls.incrementAndGet() == at) {
                throw new IllegalStateException("crash before " + step);
            }
        }
    }

    @Test
    void abortedAtRandomPointsAndRerunGivesTheSameFilesAndCounts(@TempDir Path tmp) throws Exception {
        CandidateSource source = Fixtures.source(42, ITEMS);
        Path reference = tmp.resolve("reference");
        AtomicInteger referenceSteps = new AtomicInteger();
        Fixtures.run(reference, source, OPTIONS, step -> referenceSteps.incrementAndGet(), -1, new SimpleMeterRegistry());
        TreeMap<String, byte[]> expected = committedFiles(reference);
        assertTrue(expected.size() > 5, "the reference run should roll over several files: " + expected.keySet());

        Path dir = tmp.resolve("resumed");
        SplittableRandom rnd = new SplittableRandom(20261201L);
        int aborts = 0;
        long total = Manifest.read(reference.resolve(ScanFiles.MANIFEST)).counts().candidates();
        for (int attempt = 0; attempt < 14; attempt++) {
            long done = committedSeq(dir);
            long remaining = total - done;
            // Half the aborts at a durable step (a crash mid-commit), half in the scorer (a crash mid-stream),
            // each at a random point of the work still to do.
            boolean atStep = attempt % 2 == 0;
            int stepsLeft = (int) Math.max(1, referenceSteps.get() * remaining / total);
            CrashHook hook = atStep ? new CrashAt(1 + rnd.nextInt(stepsLeft)) : CrashHook.NONE;
            long failAt = atStep ? -1 : done + rnd.nextLong(Math.max(1, remaining));
            try {
                Fixtures.run(dir, source, OPTIONS, hook, failAt, new SimpleMeterRegistry());
            } catch (PipelineException e) {
                aborts++;
                assertTrue(e.getMessage().startsWith("crash before") || e.getMessage().startsWith("abort at seq"),
                        e.getMessage());
            }
            assertCommittedFilesArePrefixOf(expected, dir);
            assertTrue(!Manifest.read(dir.resolve(ScanFiles.MANIFEST)).complete()
                    || committedFiles(dir).keySet().equals(expected.keySet()));
        }
        assertTrue(aborts >= 10, "only " + aborts + " aborts happened");
        Fixtures.run(dir, source, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());

        TreeMap<String, byte[]> actual = committedFiles(dir);
        assertEquals(expected.keySet(), actual.keySet());
        for (String name : expected.keySet()) {
            assertArrayEquals(expected.get(name), actual.get(name), name);
        }
        Manifest a = Manifest.read(reference.resolve(ScanFiles.MANIFEST));
        Manifest b = Manifest.read(dir.resolve(ScanFiles.MANIFEST));
        assertTrue(a.complete() && b.complete());
        assertEquals(a.counts(), b.counts());
        assertEquals(a.badInputLines(), b.badInputLines());
        assertEquals(a.survivorFiles(), b.survivorFiles());
        // A session that aborted before its first checkpoint left no trace, so fewer sessions than runs are recorded.
        assertTrue(b.timings().sessions() > 1 && a.timings().sessions() == 1, "sessions " + b.timings().sessions());
        try (Stream<Path> s = Files.list(dir)) {
            assertTrue(s.noneMatch(p -> p.getFileName().toString().endsWith(".partial")), "partial left after completion");
        }
    }

    @Test
    void rerunningACompleteScanChangesNothing(@TempDir Path tmp) throws Exception {
        CandidateSource source = Fixtures.source(7, 400);
        Fixtures.run(tmp, source, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
        TreeMap<String, byte[]> before = committedFiles(tmp);
        Manifest m1 = Manifest.read(tmp.resolve(ScanFiles.MANIFEST));
        Fixtures.run(tmp, source, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
        TreeMap<String, byte[]> after = committedFiles(tmp);
        assertEquals(before.keySet(), after.keySet());
        for (String name : before.keySet()) {
            assertArrayEquals(before.get(name), after.get(name), name);
        }
        assertEquals(m1.counts(), Manifest.read(tmp.resolve(ScanFiles.MANIFEST)).counts());
    }

    @Test
    void aDirectoryOfAnotherScanIsRefused(@TempDir Path tmp) throws Exception {
        Fixtures.run(tmp, Fixtures.source(7, 50), OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
        ScanInfo other = new ScanInfo("other-run", "synthetic", null, java.util.List.of(), "sha256:fake");
        IOException e = assertThrows(IOException.class, () -> SurvivorSink.open(tmp, other, OPTIONS,
                Fixtures.tickingClock(), () -> null, CrashHook.NONE));
        assertTrue(e.getMessage().contains("holds scan test-run-1, not other-run"), e.getMessage());
        Path stranger = tmp.resolve("stranger");
        Files.createDirectories(stranger);
        Files.writeString(stranger.resolve("notes.txt"), "x");
        IOException e2 = assertThrows(IOException.class, () -> SurvivorSink.open(stranger, Fixtures.INFO, OPTIONS,
                Fixtures.tickingClock(), () -> null, CrashHook.NONE));
        assertTrue(e2.getMessage().contains("not empty and holds no checkpoint"), e2.getMessage());
    }

    /** Every file under a final name must equal the same-named file of the uninterrupted run. */
    private static void assertCommittedFilesArePrefixOf(TreeMap<String, byte[]> expected, Path dir) throws IOException {
        for (var e : committedFiles(dir).entrySet()) {
            assertTrue(expected.containsKey(e.getKey()), "unexpected committed file " + e.getKey());
            assertArrayEquals(expected.get(e.getKey()), e.getValue(), "committed file differs: " + e.getKey());
        }
    }

    private static long committedSeq(Path dir) throws IOException {
        Path cp = dir.resolve(ScanFiles.CHECKPOINT);
        return Files.exists(cp) ? Checkpoint.read(cp).nextSeq() : 0;
    }

    private static TreeMap<String, byte[]> committedFiles(Path dir) throws IOException {
        TreeMap<String, byte[]> files = new TreeMap<>();
        try (Stream<Path> s = Files.list(dir)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                String name = p.getFileName().toString();
                if (name.matches("(survivors|rejects)-\\d{5}\\.tsv")) {
                    files.put(name, Files.readAllBytes(p));
                }
            }
        }
        return files;
    }
}
