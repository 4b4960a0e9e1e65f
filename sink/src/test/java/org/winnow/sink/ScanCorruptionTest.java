package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.SplittableRandom;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.local.PipelineException;

/**
 * The corruption suite: every file a scan writes (parts, hidden partials, checkpoint, manifest, lock),
 * in a finished and in an interrupted scan, damaged in five ways (cut to half its length, one line
 * removed, one byte changed, deleted, replaced by a directory). After each damage, {@link ScanCheck#full}
 * and a rerun of the same scan must either refuse in one line naming the damaged file or end with
 * exactly the files and counts of the undamaged scan; never {@code complete} with other data.
 */
class ScanCorruptionTest {
    private static final SinkOptions OPTIONS = new SinkOptions(37, true, 50, Duration.ofMillis(500));
    private static final CandidateSource SOURCE = Fixtures.source(2026, 700);

    enum Damage { TRUNCATE, CUT_LINE, FLIP_BYTE, DELETE, DIRECTORY }

    @Test
    void everyDamageToAFinishedScanIsRefusedOrHarmless(@TempDir Path tmp) throws Exception {
        Path reference = tmp.resolve("reference");
        Fixtures.run(reference, SOURCE, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
        ScanCheck.full(reference);
        int[] outcomes = suite(tmp, reference, reference);
        System.out.println("finished scan: " + outcomes[0] + " refused, " + outcomes[1] + " harmless");
        assertTrue(outcomes[0] > 40, "refusals " + outcomes[0]);
    }

    @Test
    void everyDamageToAnInterruptedScanIsRefusedOrHarmless(@TempDir Path tmp) throws Exception {
        Path reference = tmp.resolve("reference");
        Fixtures.run(reference, SOURCE, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
        Path interrupted = tmp.resolve("interrupted");
        try {
            Fixtures.run(interrupted, SOURCE, OPTIONS, CrashHook.NONE, 400, new SimpleMeterRegistry());
            fail("the scorer should have aborted the run");
        } catch (PipelineException expected) {
            // The scan stopped mid-stream: sealed parts, an open partial, an incomplete manifest.
        }
        try (Stream<Path> s = Files.list(interrupted)) {
            assertTrue(s.anyMatch(p -> p.getFileName().toString().endsWith(".partial")), "no open partial to damage");
        }
        int[] outcomes = suite(tmp, interrupted, reference);
        System.out.println("interrupted scan: " + outcomes[0] + " refused, " + outcomes[1] + " harmless");
        assertTrue(outcomes[0] > 30 && outcomes[1] > 5, "refusals " + outcomes[0] + ", harmless " + outcomes[1]);
    }

    /** Damages each file of {@code start} in each way; returns {refusals, harmless}. */
    private static int[] suite(Path tmp, Path start, Path reference) throws Exception {
        TreeMap<String, byte[]> expected = parts(reference);
        Manifest expectedManifest = Manifest.read(reference.resolve(ScanFiles.MANIFEST));
        List<String> names;
        try (Stream<Path> s = Files.list(start)) {
            names = s.map(p -> p.getFileName().toString()).sorted().toList();
        }
        assertTrue(names.contains(ScanFiles.CHECKPOINT) && names.contains(ScanFiles.MANIFEST)
                && names.contains(ScanFiles.LOCK) && names.contains("survivors-00001.tsv"), names.toString());
        SplittableRandom rnd = new SplittableRandom(20261205L);
        int refused = 0;
        int harmless = 0;
        int trial = 0;
        for (String name : names) {
            for (Damage damage : Damage.values()) {
                Path dir = tmp.resolve("t" + trial++);
                copy(start, dir);
                if (!apply(dir.resolve(name), damage, rnd)) {
                    continue;
                }
                String what = name + " " + damage;
                boolean checkRefused = false;
                try {
                    ScanCheck.Result r = ScanCheck.full(dir);
                    // Passing the check means the parts are the recorded ones: those of the reference so far.
                    for (SealedPart p : r.manifest().sealedParts()) {
                        assertArrayEquals(expected.get(p.name()), Files.readAllBytes(dir.resolve(p.name())), what);
                    }
                    if (r.manifest().complete()) {
                        assertEquals(expectedManifest.counts(), r.manifest().counts(), what);
                    }
                } catch (IOException e) {
                    assertOneLineNaming(e, name, dir, what);
                    checkRefused = true;
                }
                try {
                    Fixtures.run(dir, SOURCE, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
                } catch (IOException e) {
                    assertOneLineNaming(e, name, dir, what);
                    refused++;
                    continue;
                } catch (PipelineException e) {
                    fail(what + ": the rerun failed mid-run instead of refusing at the start: " + e.getMessage());
                }
                // The rerun finished: it must have given exactly the undamaged scan's result.
                assertSameParts(expected, parts(dir), what + ": the rerun finished with other parts");
                Manifest m = Manifest.read(dir.resolve(ScanFiles.MANIFEST));
                assertTrue(m.complete(), what);
                assertEquals(expectedManifest.counts(), m.counts(), what);
                assertEquals(expectedManifest.sealedParts(), m.sealedParts(), what);
                ScanCheck.full(dir);
                harmless++;
                assertFalse(checkRefused && name.startsWith("survivors-"), what + ": verify refused a damaged part "
                        + "that the rerun accepted");
            }
        }
        return new int[] {refused, harmless};
    }

    private static void assertSameParts(TreeMap<String, byte[]> expected, TreeMap<String, byte[]> actual, String what) {
        assertEquals(expected.keySet(), actual.keySet(), what);
        for (String n : expected.keySet()) {
            assertArrayEquals(expected.get(n), actual.get(n), what + ": " + n);
        }
    }

    private static void assertOneLineNaming(IOException e, String name, Path dir, String what) {
        String msg = e.getMessage();
        assertTrue(msg != null && !msg.contains("\n"), what + ": not one line: " + msg);
        assertTrue(msg.contains(name) || msg.contains(dir.toString()), what + ": names neither file nor dir: " + msg);
        assertTrue(msg.length() < 400, what + ": too long: " + msg);
    }

    /** Applies the damage; false when it does not apply (a line cut from a one-line file). */
    private static boolean apply(Path f, Damage damage, SplittableRandom rnd) throws IOException {
        byte[] b = Files.readAllBytes(f);
        switch (damage) {
            case TRUNCATE -> Files.write(f, java.util.Arrays.copyOf(b, b.length / 2));
            case CUT_LINE -> {
                List<String> lines = new ArrayList<>(Files.readAllLines(f));
                if (lines.size() < 2) {
                    return false;
                }
                lines.remove(lines.size() / 2);
                Files.write(f, lines);
            }
            case FLIP_BYTE -> {
                if (b.length == 0) {
                    return false;
                }
                // The lowest bit: a digit stays a digit ('4' <-> '5'), the nastiest damage for a count.
                b[rnd.nextInt(b.length)] ^= 1;
                Files.write(f, b);
            }
            case DELETE -> Files.delete(f);
            case DIRECTORY -> {
                Files.delete(f);
                Files.createDirectory(f);
            }
        }
        return true;
    }

    /** The part files under final names, by name. */
    private static TreeMap<String, byte[]> parts(Path dir) throws IOException {
        TreeMap<String, byte[]> files = new TreeMap<>();
        try (Stream<Path> s = Files.list(dir)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                String n = p.getFileName().toString();
                if ((n.startsWith("survivors-") || n.startsWith("rejects-")) && Files.isRegularFile(p)) {
                    files.put(n, Files.readAllBytes(p));
                }
            }
        }
        return files;
    }

    private static void copy(Path from, Path to) throws IOException {
        Files.createDirectories(to);
        try (Stream<Path> s = Files.list(from)) {
            for (Path p : s.sorted(Comparator.naturalOrder()).toList()) {
                if (Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS)) {
                    Files.copy(p, to.resolve(p.getFileName()));
                }
            }
        }
    }
}
