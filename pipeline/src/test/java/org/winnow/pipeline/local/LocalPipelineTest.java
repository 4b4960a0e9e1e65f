package org.winnow.pipeline.local;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Sequencer;
import org.winnow.pipeline.SourceListener;
import org.winnow.pipeline.Stage;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.metrics.ChannelMetrics;

class LocalPipelineTest {
    /** Shape-valid configurations with distinct texts, one per i. */
    static CandidateSource source(int count) {
        return new CandidateSource() {
            @Override
            public void run(SourceListener out) throws InterruptedException {
                for (int i = 1; i <= count; i++) {
                    Configuration c = Configuration.of(new int[] {1 + i % 31, 1 + (i / 31) % 31, 1 + i / 961},
                            new int[][] {{i % 7}, {1}, {2}});
                    out.item(c, c.toText());
                }
            }

            @Override
            public String description() {
                return "test source";
            }
        };
    }

    /** Scores with a seeded random delay, so that workers finish out of order. */
    static class JitteryScorer implements Stage<Candidate, Scored> {
        private final SplittableRandom rnd;
        private final long failAt;
        private StageContext<Scored> ctx;

        JitteryScorer(long seed, long failAt) {
            this.rnd = new SplittableRandom(seed);
            this.failAt = failAt;
        }

        @Override
        public void open(StageContext<Scored> ctx) {
            this.ctx = ctx;
        }

        @Override
        public void accept(Candidate c) throws InterruptedException {
            if (c.seq() == failAt) {
                throw new IllegalStateException("scorer failed at " + c.seq());
            }
            if (rnd.nextInt(50) == 0) {
                Thread.sleep(1);
            }
            Reason r = c.seq() % 3 == 0 ? Reason.KEPT_IN_RANGE : Reason.EXACT_CHI_OUT_OF_RANGE;
            ctx.forward(Scored.of(c, new ExactInvariants(3, 0, 2, 1, 1), Prediction.of(1, 1.0, 1, 0.5, ""), r));
        }
    }

    static class RecordingSink implements Stage<Scored, Void> {
        final List<Long> seqs = new ArrayList<>();
        final AtomicInteger finished = new AtomicInteger();
        final AtomicInteger closed = new AtomicInteger();
        final int slowFor;

        RecordingSink(int slowFor) {
            this.slowFor = slowFor;
        }

        @Override
        public void accept(Scored s) throws InterruptedException {
            if (seqs.size() < slowFor) {
                Thread.sleep(1);
            }
            seqs.add(s.seq());
        }

        @Override
        public void finish() {
            finished.incrementAndGet();
        }

        @Override
        public void close() {
            closed.incrementAndGet();
        }
    }

    @Test
    void sinkSeesEverySeqInOrderWhateverOrderTheWorkersFinishIn() throws Exception {
        RecordingSink sink = new RecordingSink(0);
        LocalPipeline p = new LocalPipeline(new LocalPipeline.Options(3, 16, 64), new SimpleMeterRegistry());
        LocalPipeline.Result r = p.run(source(5000), BadInputPolicy.SKIP, 0, i -> new JitteryScorer(i, -1), sink, s -> {});
        assertEquals(5000, sink.seqs.size());
        for (int i = 0; i < sink.seqs.size(); i++) {
            assertEquals(i, sink.seqs.get(i));
        }
        assertEquals(1, sink.finished.get());
        assertEquals(1, sink.closed.get());
        assertEquals(5000, r.source().candidates());
        assertTrue(r.maxReorderDepth() <= 64, "reorder depth " + r.maxReorderDepth());
    }

    @Test
    void resumedRunStartsAtTheResumePoint() throws Exception {
        RecordingSink sink = new RecordingSink(0);
        LocalPipeline p = new LocalPipeline(new LocalPipeline.Options(2, 8, 32), new SimpleMeterRegistry());
        p.run(source(300), BadInputPolicy.SKIP, 120, i -> new JitteryScorer(i, -1), sink, s -> {});
        assertEquals(180, sink.seqs.size());
        assertEquals(120L, sink.seqs.get(0));
        assertEquals(299L, sink.seqs.get(179));
    }

    @Test
    void aFailingWorkerStopsTheRunClosesEveryStageAndFinishesNone() {
        RecordingSink sink = new RecordingSink(0);
        List<JitteryScorer> scorers = new ArrayList<>();
        AtomicInteger closedScorers = new AtomicInteger();
        LocalPipeline p = new LocalPipeline(new LocalPipeline.Options(2, 8, 32), new SimpleMeterRegistry());
        PipelineException e = assertThrows(PipelineException.class, () -> p.run(source(5000), BadInputPolicy.SKIP, 0, i -> {
            JitteryScorer s = new JitteryScorer(i, 777) {
                @Override
                public void close() {
                    closedScorers.incrementAndGet();
                }
            };
            scorers.add(s);
            return s;
        }, sink, s -> {}));
        assertTrue(e.getCause() instanceof IllegalStateException, e.toString());
        assertEquals("scorer failed at 777", e.getCause().getMessage());
        assertEquals(0, sink.finished.get());
        assertEquals(1, sink.closed.get());
        assertEquals(2, closedScorers.get());
        assertTrue(sink.seqs.size() <= 777);
    }

    @Test
    void withASlowSinkTheSourceStaysWithinTheWindowAndChannelsWithinCapacity() throws Exception {
        int capacity = 8;
        int window = 40;
        AtomicLong worstLead = new AtomicLong();
        AtomicReference<Sequencer> seqRef = new AtomicReference<>();
        RecordingSink sink = new RecordingSink(400) {
            @Override
            public void accept(Scored s) throws InterruptedException {
                super.accept(s);
                long lead = seqRef.get().report().candidates() - seqs.size();
                worstLead.accumulateAndGet(lead, Math::max);
            }
        };
        SimpleMeterRegistry reg = new SimpleMeterRegistry();
        LocalPipeline p = new LocalPipeline(new LocalPipeline.Options(2, capacity, window), reg);
        LocalPipeline.Result r = p.run(source(2000), BadInputPolicy.SKIP, 0, i -> new JitteryScorer(i, -1), sink, seqRef::set);
        assertEquals(2000, sink.seqs.size());
        assertTrue(r.maxCandidateDepth() <= capacity && r.maxScoredDepth() <= capacity,
                r.maxCandidateDepth() + " / " + r.maxScoredDepth());
        assertTrue(r.maxCandidateDepth() >= capacity - 1, "the slow sink never filled the channel: " + r.maxCandidateDepth());
        // The source may have numbered one seq it is still waiting to admit.
        assertTrue(worstLead.get() <= window + 1, "source ran " + worstLead.get() + " ahead of the sink");
        assertFalse(reg.find(ChannelMetrics.DEPTH).tag(ChannelMetrics.TAG_CHANNEL, "candidates").gauges().isEmpty());
    }
}
