package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.node.ObjectNode;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.local.PipelineException;

/** Regressions of scan directories that a rerun or a reader used to believe; each one-line refusal is asserted. */
class ScanDirectoryRegressionTest {
    private static final SinkOptions OPTIONS = new SinkOptions(37, true, 50, Duration.ofMillis(500));
    private static final CandidateSource SOURCE = Fixtures.source(11, 500);

    private static Path finished(Path dir) throws Exception {
        Fixtures.run(dir, SOURCE, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry());
        return dir;
    }

    private static IOException rerunRefused(Path dir) {
        IOException e = assertThrows(IOException.class,
                () -> Fixtures.run(dir, SOURCE, OPTIONS, CrashHook.NONE, -1, new SimpleMeterRegistry()));
        assertTrue(!e.getMessage().contains("\n"), "not one line: " + e.getMessage());
        return e;
    }

    /** Rewrites {@code checkpoint.json} with one field changed and a valid self checksum: a deliberate edit. */
    private static void editCheckpoint(Path dir, java.util.function.Consumer<ObjectNode> edit) throws IOException {
        Path cp = dir.resolve(ScanFiles.CHECKPOINT);
        ObjectNode tree = (ObjectNode) ScanFiles.JSON.readTree(cp.toFile());
        tree.remove(ScanFiles.CHECKSUM_FIELD);
        edit.accept(tree);
        Files.write(cp, ScanFiles.toSealedJson(tree));
    }

    /**
     * Truncating {@code survivors-00002.tsv} of a finished scan and rerunning the same scan used to exit 0
     * with {@code complete: true} and a {@code survivorLines} count the files no longer held.
     */
    @Test
    void truncatedSealedPartIsRefusedOnRerun(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Path part = dir.resolve("survivors-00002.tsv");
        byte[] b = Files.readAllBytes(part);
        Files.write(part, java.util.Arrays.copyOf(b, b.length - 30));
        IOException e = rerunRefused(dir);
        assertTrue(e.getMessage().startsWith(part + ": " + (b.length - 30) + " bytes, but the checkpoint records "
                + b.length), e.getMessage());
        assertTrue(assertThrows(ScanDamagedException.class, () -> ScanCheck.full(dir)).getMessage().startsWith(part.toString()));
    }

    /** Deleting one line of a sealed part: same length check fails; same refusal. */
    @Test
    void sealedPartWithOneLineDeletedIsRefusedOnRerun(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Path part = dir.resolve("survivors-00001.tsv");
        List<String> lines = new ArrayList<>(Files.readAllLines(part));
        lines.remove(5);
        Files.write(part, lines);
        assertTrue(rerunRefused(dir).getMessage().startsWith(part.toString()));
    }

    /** A sealed part replaced by a directory. */
    @Test
    void sealedPartReplacedByADirectoryIsRefusedOnRerun(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Path part = dir.resolve("rejects-00003.tsv");
        Files.delete(part);
        Files.createDirectory(part);
        assertTrue(rerunRefused(dir).getMessage().startsWith(part + ": not a regular file"));
    }

    /** Same length, one character changed: only the digest can tell. */
    @Test
    void sealedPartWithOneCharacterChangedIsRefusedOnRerun(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Path part = dir.resolve("survivors-00003.tsv");
        String s = Files.readString(part);
        int tab = s.lastIndexOf('\t');
        char c = s.charAt(tab + 1);
        Files.writeString(part, s.substring(0, tab + 1) + (char) (c ^ 1) + s.substring(tab + 2));
        assertTrue(rerunRefused(dir).getMessage().contains("differs from the SHA-256"));
    }

    /**
     * Hand-editing the checkpoint's byte offset of the open part (to a point inside a line) used to give
     * {@code complete: true} with two records spliced into one line. The edit here even keeps the
     * checkpoint's own checksum valid, so the open part's prefix digest is what refuses it.
     */
    @Test
    void editedOpenPartOffsetIsRefusedOnRerun(@TempDir Path tmp) throws Exception {
        Path dir = tmp.resolve("scan");
        assertThrows(PipelineException.class,
                () -> Fixtures.run(dir, SOURCE, OPTIONS, CrashHook.NONE, 300, new SimpleMeterRegistry()));
        Checkpoint before = Checkpoint.read(dir.resolve(ScanFiles.CHECKPOINT));
        String series = before.survivors().openBytes() > 20 ? "survivors" : "rejects";
        long open = series.equals("survivors") ? before.survivors().openBytes() : before.rejects().openBytes();
        assertTrue(open > 20, "the interrupted scan should have an open part");
        editCheckpoint(dir, t -> ((ObjectNode) t.get(series)).put("openBytes", open - 7));
        assertTrue(rerunRefused(dir).getMessage().contains("differ from the SHA-256 the checkpoint records"));
    }

    /** A byte changed in the checkpoint (a count) without fixing its checksum. */
    @Test
    void checkpointChangedByHandIsRefused(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Path cp = dir.resolve(ScanFiles.CHECKPOINT);
        String s = Files.readString(cp);
        Files.writeString(cp, s.replaceFirst("\"nextSeq\" : (\\d)", "\"nextSeq\" : 9$1"));
        assertTrue(rerunRefused(dir).getMessage().contains("differs from its own checksum"));
    }

    /** A checkpoint holding {@code null} used to end in a NullPointerException's stack trace. */
    @Test
    void checkpointHoldingNullIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Files.writeString(dir.resolve(ScanFiles.CHECKPOINT), "null");
        assertTrue(rerunRefused(dir).getMessage().startsWith(dir.resolve(ScanFiles.CHECKPOINT) + ": unreadable checkpoint"));
    }

    /** A negative sequence (with a valid checksum) used to end in a stack trace. */
    @Test
    void checkpointWithNegativeSequenceIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        editCheckpoint(dir, t -> t.put("nextSeq", -5));
        assertEquals(dir.resolve(ScanFiles.CHECKPOINT) + ": nextSeq must be at least 0, found -5",
                rerunRefused(dir).getMessage());
        editCheckpoint(dir, t -> {
            t.put("nextSeq", 0);
            t.putNull("counts");
        });
        assertTrue(rerunRefused(dir).getMessage().contains("counts is missing"));
        editCheckpoint(dir, t -> {
            t.put("nextSeq", 0);
            t.remove("counts");
        });
        assertTrue(rerunRefused(dir).getMessage().contains("unreadable checkpoint"));
    }

    /** A manifest holding {@code null} or {@code {}} used to end in a stack trace in {@code report}. */
    @Test
    void manifestHoldingNullOrAnEmptyObjectIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        Path m = dir.resolve(ScanFiles.MANIFEST);
        for (String content : List.of("null", "{}", "[]", "", "{\"formatVersion\": 2}")) {
            Files.writeString(m, content, StandardCharsets.UTF_8);
            IOException e = assertThrows(IOException.class, () -> Manifest.read(m), content);
            assertTrue(e.getMessage().startsWith(m + ": ") && !e.getMessage().contains("\n"), e.getMessage());
        }
    }

    /**
     * Two scans started into one directory used to race for the same files and die with a stack trace,
     * leaving a stray file. The second is refused at once, naming the holder.
     */
    @Test
    void secondScanIntoTheSameDirectoryIsRefusedNamingTheHolder(@TempDir Path tmp) throws Exception {
        SurvivorSink first = SurvivorSink.open(tmp, Fixtures.INFO, OPTIONS, Fixtures.tickingClock(), () -> null,
                CrashHook.NONE);
        try {
            IOException e = assertThrows(IOException.class, () -> SurvivorSink.open(tmp, Fixtures.INFO, OPTIONS,
                    Fixtures.tickingClock(), () -> null, CrashHook.NONE));
            assertTrue(e.getMessage().startsWith(tmp + ": in use by winnow scan test-run-1, process "
                    + ProcessHandle.current().pid()), e.getMessage());
            String refusal = assertThrows(ScanDamagedException.class, () -> ScanCheck.full(tmp)).getMessage();
            assertTrue(refusal.startsWith(tmp + ": in use by winnow scan test-run-1, process "
                    + ProcessHandle.current().pid()) && refusal.endsWith("; check it when that scan has stopped"), refusal);
        } finally {
            first.close();
        }
        // Released: the same scan can continue in it.
        SurvivorSink.open(tmp, Fixtures.INFO, OPTIONS, Fixtures.tickingClock(), () -> null, CrashHook.NONE).close();
    }

    /** An output path that is a file used to give only the path as the message. */
    @Test
    void outputPathThatIsAFileIsRefusedSayingSo(@TempDir Path tmp) throws Exception {
        Path file = Files.writeString(tmp.resolve("isfile"), "x");
        IOException e = assertThrows(IOException.class, () -> SurvivorSink.open(file, Fixtures.INFO, OPTIONS,
                Fixtures.tickingClock(), () -> null, CrashHook.NONE));
        assertEquals(file + ": exists and is not a directory; give a new or empty directory", e.getMessage());
    }

    /** The full check passes on an untouched finished scan and reads every part. */
    @Test
    void fullCheckOfAnUntouchedScanReadsEveryPart(@TempDir Path tmp) throws Exception {
        Path dir = finished(tmp);
        ScanCheck.Result r = ScanCheck.full(dir);
        Manifest m = Manifest.read(dir.resolve(ScanFiles.MANIFEST));
        assertEquals(m.survivorFiles().size() + m.rejectFiles().size(), r.parts());
        assertEquals(m.counts().scored(), r.lines(), "survivor and reject lines together are every scored record");
        long bytes = 0;
        for (SealedPart p : m.sealedParts()) {
            bytes += Files.size(dir.resolve(p.name()));
        }
        assertEquals(bytes, r.bytes());
    }
}
