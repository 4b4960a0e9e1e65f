package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.MeterRegistry;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.CandidateKeys;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.Verdict;

/**
 * A rejected candidate counted by seq and reason alone leaves the same survivors and counts as the whole
 * record; a sink that writes rejects refuses it, since it would have nothing to write.
 */
class CountedRejectsTest {
    private static final SinkOptions NO_REJECTS = new SinkOptions(50, false, 30, Duration.ofHours(1));

    @TempDir
    Path dir;

    @Test
    void countingRejectsByReasonAloneLeavesTheSameFilesAndCounts() throws Exception {
        List<Scored> scored = scored();
        assertTrue(scored.stream().anyMatch(s -> s.verdict() == Verdict.REJECT)
                && scored.stream().anyMatch(s -> s.verdict() == Verdict.KEEP));
        SourceReport done = new SourceReport(scored.size(), 0, scored.size(), 0, 0, List.of(), true);
        Manifest whole = write(dir.resolve("whole"), scored, done, false);
        Manifest counted = write(dir.resolve("counted"), scored, done, true);
        assertEquals(whole.counts(), counted.counts());
        assertEquals(whole.survivorFiles(), counted.survivorFiles());
        for (String f : whole.survivorFiles()) {
            assertEquals(Files.readAllLines(dir.resolve("whole").resolve(f)),
                    Files.readAllLines(dir.resolve("counted").resolve(f)), f);
        }
    }

    @Test
    void aSinkThatWritesRejectsOrAKeptReasonIsRefused() throws Exception {
        SurvivorSink writing = SurvivorSink.open(dir.resolve("w"), Fixtures.INFO,
                new SinkOptions(50, true, 30, Duration.ofHours(1)), Fixtures.tickingClock(), () -> null, CrashHook.NONE);
        writing.open(context(new SimpleMeterRegistry()));
        var e = assertThrows(IllegalStateException.class,
                () -> writing.acceptRejected(0, Reason.PREDICTED_H11_OUT_OF_RANGE));
        assertTrue(e.getMessage().contains("seq 0"), e.getMessage());
        writing.close();
        SurvivorSink counting = SurvivorSink.open(dir.resolve("c"), Fixtures.INFO, NO_REJECTS, Fixtures.tickingClock(),
                () -> null, CrashHook.NONE);
        counting.open(context(new SimpleMeterRegistry()));
        assertThrows(IllegalArgumentException.class, () -> counting.acceptRejected(0, Reason.KEPT_AS_NOVEL));
        assertThrows(IllegalStateException.class, () -> counting.acceptRejected(1, Reason.EXACT_CHI_OUT_OF_RANGE));
        counting.close();
    }

    private static Manifest write(Path out, List<Scored> scored, SourceReport done, boolean countRejects)
            throws Exception {
        SurvivorSink sink = SurvivorSink.open(out, Fixtures.INFO, NO_REJECTS, Fixtures.tickingClock(), () -> done,
                CrashHook.NONE);
        sink.open(context(new SimpleMeterRegistry()));
        for (Scored s : scored) {
            if (countRejects && s.verdict() == Verdict.REJECT) {
                sink.acceptRejected(s.seq(), s.reason());
            } else {
                sink.accept(s);
            }
        }
        sink.finish();
        sink.close();
        return Manifest.read(out.resolve(ScanFiles.MANIFEST));
    }

    /** The fixtures' fake verdicts for a few hundred small matrices. */
    private static List<Scored> scored() {
        List<Scored> out = new ArrayList<>();
        for (int a = 0; a <= 5 && out.size() < 200; a++) {
            for (int b = 0; b <= 5 && out.size() < 200; b++) {
                for (int n = 1; n <= 8 && out.size() < 200; n++) {
                    if (a + b < 1) {
                        continue;
                    }
                    Configuration c = Configuration.of(new int[] {n}, new int[][] {{a, b}});
                    out.add(Fixtures.score(new Candidate(c, CandidateKeys.of(c.toText()), 0, out.size())));
                }
            }
        }
        return out;
    }

    private static StageContext<Void> context(MeterRegistry registry) {
        return StageContext.terminal("sink", registry);
    }
}
