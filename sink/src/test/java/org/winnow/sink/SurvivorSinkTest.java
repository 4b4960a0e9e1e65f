package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.CandidateKeys;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.SourceListener;
import org.winnow.pipeline.Verdict;
import org.winnow.pipeline.metrics.SinkMetrics;
import org.winnow.pipeline.metrics.SourceMetrics;

class SurvivorSinkTest {
    @Test
    void filesParseAndEveryCountReconcilesInTheManifestAndTheMetrics(@TempDir Path dir) throws Exception {
        SimpleMeterRegistry reg = new SimpleMeterRegistry();
        Fixtures.run(dir, Fixtures.source(3, 900), new SinkOptions(100, true, 1000, Duration.ofHours(1)), CrashHook.NONE,
                -1, reg);

        // What the fake scorer says about every distinct item, computed again here directly.
        Map<String, Scored> direct = new HashMap<>();
        AtomicLong items = new AtomicLong();
        List<Long> badLines = new ArrayList<>();
        Fixtures.source(3, 900).run(new SourceListener() {
            long seq;

            @Override
            public void item(Configuration c, String text) {
                items.incrementAndGet();
                if (!direct.containsKey(text)) {
                    direct.put(text, Fixtures.score(new Candidate(c, CandidateKeys.of(text), 0, seq++)));
                }
            }

            @Override
            public void badInput(long line, String problem) {
                badLines.add(line);
            }
        });

        Manifest m = Manifest.read(dir.resolve(ScanFiles.MANIFEST));
        Manifest.Counts c = m.counts();
        assertTrue(m.complete());
        assertEquals(items.get(), c.enumerated());
        assertEquals(c.enumerated(), c.duplicates() + c.candidates());
        assertEquals(direct.size(), c.candidates());
        assertEquals(c.candidates(), c.scored());
        assertEquals(c.scored(), c.rejected() + c.kept());
        assertEquals(c.rejected(), c.rejectedByReason().values().stream().mapToLong(Long::longValue).sum());
        assertEquals(c.kept(), c.keptByReason().values().stream().mapToLong(Long::longValue).sum());
        assertEquals(badLines, m.badInputLines().stream().map(b -> b.line()).toList());
        assertEquals(badLines.size(), c.badInput());

        List<SurvivorLine> survivors = new ArrayList<>();
        List<RejectLine> rejects = new ArrayList<>();
        for (String f : m.survivorFiles()) {
            List<String> lines = Files.readAllLines(dir.resolve(f));
            assertTrue(lines.get(0).startsWith("# winnow survivors, format 2, run test-run-1, part "), lines.get(0));
            assertEquals(SurvivorLine.COLUMNS, lines.get(1));
            lines.subList(2, lines.size()).forEach(l -> survivors.add(SurvivorLine.parse(l)));
        }
        for (String f : m.rejectFiles()) {
            List<String> lines = Files.readAllLines(dir.resolve(f));
            lines.subList(2, lines.size()).forEach(l -> rejects.add(RejectLine.parse(l)));
        }
        assertEquals(c.kept(), survivors.size());
        assertEquals(c.survivorLines(), survivors.size());
        assertEquals(c.rejected(), rejects.size());
        for (SurvivorLine s : survivors) {
            Scored d = direct.get(s.config());
            assertEquals(Verdict.KEEP, d.verdict());
            assertEquals(d.reason(), s.keptBecause());
            assertEquals(d.prediction().h11(), s.h11());
            assertEquals(d.prediction().h21(), s.h21());
            assertEquals(d.invariants().chi(), s.chi());
            assertEquals(d.prediction().confidence(), s.confidence(), 5e-7);
            assertEquals(d.novelty(), s.novelty(), 5e-7);
            assertEquals(d.prediction().nearestReference(), s.nearestReference());
        }
        for (RejectLine r : rejects) {
            assertEquals(direct.get(r.config()).reason(), r.rejectedBecause());
        }
        for (var e : c.keptByReason().entrySet()) {
            assertEquals(e.getValue(), survivors.stream().filter(s -> s.keptBecause().code().equals(e.getKey())).count());
        }

        double sent = reg.get(SourceMetrics.SENT).counter().count();
        double taken = reg.get(SinkMetrics.RECORDS).counters().stream().mapToDouble(Counter::count).sum();
        assertEquals(c.candidates(), (long) sent);
        assertEquals(sent, taken);
        assertEquals(c.survivorLines(), (long) reg.get(SinkMetrics.SURVIVOR_LINES).counter().count());
        assertFalse(Files.exists(dir.resolve("." + ScanFiles.MANIFEST + ".tmp")));
    }
}
