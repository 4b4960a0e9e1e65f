package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.local.PipelineException;
import org.winnow.testsupport.Damage;

/**
 * Seeded fuzzing of the checkpoint and manifest readers: a real scan's files (finished and interrupted)
 * edited at random (characters inserted, deleted or replaced, JSON tokens swapped in, cut short). Each
 * input is read back; it must either read as a checkpoint or manifest whose checks hold, or be refused
 * with a {@link ScanDamagedException} whose message is one line naming the file; nothing else may come
 * out. {@code -Dwinnow.fuzz.inputs=N} scales the run: this test reads a fifth of N (2 x 10^4 by default,
 * about 1.5 s; each input is a JSON parse and a SHA-256); the longer run is in {@code docs/scan-pipeline.md}.
 */
class ScanFileReadersFuzzTest {
    private static final String[] TOKENS = {"null", "{}", "[]", "-1", "0", "1e400", "\"\"", "\"x\"", "true", ",", ":",
        "\"nextSeq\"", "\"counts\"", "9223372036854775807", "-9223372036854775808", "NaN", "\u0000", "\uFF15", "\"",
        "{", "}", "[", "]"};

    @Test
    void everyEditedCheckpointOrManifestReadsCheckedOrIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        SinkOptions options = new SinkOptions(37, true, 50, Duration.ofMillis(500));
        Path done = tmp.resolve("done");
        Fixtures.run(done, Fixtures.source(5, 400), options, CrashHook.NONE, -1, new SimpleMeterRegistry());
        Path part = tmp.resolve("part");
        try {
            Fixtures.run(part, Fixtures.source(5, 400), options, CrashHook.NONE, 250, new SimpleMeterRegistry());
        } catch (PipelineException expected) {
            // an interrupted scan: an open part, an incomplete manifest
        }
        String[] seeds = {
            Files.readString(done.resolve(ScanFiles.CHECKPOINT)), Files.readString(done.resolve(ScanFiles.MANIFEST)),
            Files.readString(part.resolve(ScanFiles.CHECKPOINT)), Files.readString(part.resolve(ScanFiles.MANIFEST)),
        };
        int inputs = Integer.getInteger("winnow.fuzz.inputs", 100_000) / 5;
        SplittableRandom rnd = new SplittableRandom(20261205L);
        Path name = tmp.resolve("fuzzed.json");
        int read = 0;
        int refused = 0;
        long start = System.nanoTime();
        for (int i = 0; i < inputs; i++) {
            int which = rnd.nextInt(seeds.length);
            byte[] bytes = edit(seeds[which], rnd).getBytes(java.nio.charset.StandardCharsets.UTF_8);
            try {
                if (which % 2 == 0) {
                    Checkpoint.parse(bytes, name);
                } else {
                    Manifest.parse(bytes, name);
                }
                read++;
            } catch (ScanDamagedException e) {
                String m = e.getMessage();
                assertTrue(m.startsWith(name + ": ") && !m.contains("\n") && m.length() < 500, "input " + i + ": " + m);
                refused++;
            } catch (RuntimeException e) {
                fail("input " + i + " threw " + e);
            }
        }
        assertTrue(refused > inputs * 9 / 10, "refused " + refused + " of " + inputs);
        System.out.printf("checkpoint and manifest reader fuzz: %d inputs, %d read and checked, %d refused, %.1f s%n",
                inputs, read, refused, (System.nanoTime() - start) / 1e9);
    }

    private static String edit(String seed, SplittableRandom rnd) {
        return Damage.text(seed, rnd, TOKENS, 3, 12);
    }
}
