package org.winnow.pipeline.metrics;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;

class SnapshotTakerTest {
    private static final Configuration QUINTIC = Configuration.parse("4:5");

    /** A clock the test moves by hand. */
    private static final class HandClock extends Clock {
        long millis;

        @Override
        public ZoneOffset getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(java.time.ZoneId zone) {
            return this;
        }

        @Override
        public Instant instant() {
            return Instant.ofEpochMilli(millis);
        }
    }

    @Test
    void scorerSnapshotsCountEveryReasonAndBinEveryNoveltyAsADirectCountDoes() {
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        ScorerMetrics metrics = new ScorerMetrics(registry);
        HandClock clock = new HandClock();
        clock.millis = 1_000;
        SnapshotTaker taker = new SnapshotTaker("r1", StageKind.SCORE, "a", "7@1", registry, clock);
        SplittableRandom random = new SplittableRandom(5L);
        Map<Reason, Long> byReason = new EnumMap<>(Reason.class);
        long[] bins = new long[ScorerMetrics.NOVELTY_BINS];
        int n = 3000;
        for (int i = 0; i < n; i++) {
            Reason r = Reason.values()[random.nextInt(Reason.values().length)];
            // Exact bin edges and the two ends are drawn often on purpose: they are where off-by-one hides.
            double novelty = random.nextInt(4) == 0 ? random.nextInt(11) / 10.0 : random.nextDouble();
            metrics.scored(Scored.of(new Candidate(QUINTIC, "k" + i, 0, i), new ExactInvariants(3, -200, 1, 1, 1), Prediction.of(1, 1.0, 101, novelty, ""), r), 1000);
            byReason.merge(r, 1L, Long::sum);
            // Brute force: the bin whose upper bound is the first one at or above the value.
            int bin = 0;
            while (novelty > (bin + 1) / 10.0) {
                bin++;
            }
            bins[bin]++;
        }
        clock.millis = 3_000;
        MetricSnapshot s = taker.take();
        assertEquals(n, s.candidates());
        for (Reason r : Reason.values()) {
            assertEquals(byReason.getOrDefault(r, 0L), s.count(r), r.code());
        }
        assertArrayEquals(bins, s.noveltyBins());
        assertEquals(n / 2.0, s.candidatesPerSecond(), 1e-9, "3000 candidates in 2 s");
        assertEquals(0, s.seq());
        assertEquals(3_000, s.timestampMillis());

        clock.millis = 4_000;
        MetricSnapshot idle = taker.take();
        assertEquals(1, idle.seq());
        assertEquals(0, idle.candidatesPerSecond(), "nothing scored in the last second");
        assertEquals(n, idle.candidates(), "counts are cumulative");
    }

    @Test
    void producerAndSinkSnapshotsReadTheirOwnMeters() {
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        SourceMetrics source = new SourceMetrics(registry);
        SinkMetrics sink = new SinkMetrics(registry);
        for (int i = 0; i < 7; i++) {
            source.sent();
        }
        source.duplicate();
        sink.record(Reason.KEPT_IN_RANGE);
        sink.record(Reason.EXACT_CHI_OUT_OF_RANGE);
        sink.record(Reason.EXACT_CHI_OUT_OF_RANGE);
        Clock clock = Clock.fixed(Instant.ofEpochMilli(5), ZoneOffset.UTC);
        MetricSnapshot p = new SnapshotTaker("r1", StageKind.PRODUCE, "producer", "1@0", registry, clock).take();
        assertEquals(7, p.candidates());
        assertEquals(0, p.reasons().length);
        assertEquals(0, p.noveltyBins().length);
        MetricSnapshot k = new SnapshotTaker("r1", StageKind.SINK, "sink", "1@0", registry, clock).take();
        assertEquals(3, k.candidates());
        assertEquals(2, k.count(Reason.EXACT_CHI_OUT_OF_RANGE));
        assertEquals(1, k.count(Reason.KEPT_IN_RANGE));
    }
}
