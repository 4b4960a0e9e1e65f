package org.winnow.sink;

import io.micrometer.core.instrument.MeterRegistry;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicReference;
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
import org.winnow.pipeline.local.LocalPipeline;
import org.winnow.pipeline.local.PipelineException;

/** A seeded synthetic source, a deterministic fake scorer, and a runner for sink tests. */
final class Fixtures {
    private Fixtures() {}

    /** Shape-valid random configurations with some repeats and some bad lines; the same for a seed. */
    static CandidateSource source(long seed, int count) {
        return new CandidateSource() {
            @Override
            public void run(SourceListener out) throws InterruptedException {
                SplittableRandom rnd = new SplittableRandom(seed);
                List<String> seen = new ArrayList<>();
                for (int line = 1; line <= count; line++) {
                    if (rnd.nextInt(40) == 0) {
                        out.badInput(line, "synthetic bad line");
                        continue;
                    }
                    if (!seen.isEmpty() && rnd.nextInt(20) == 0) {
                        String again = seen.get(rnd.nextInt(seen.size()));
                        out.item(Configuration.parse(again), again);
                        continue;
                    }
                    int m = 1 + rnd.nextInt(3);
                    int k = 1 + rnd.nextInt(3);
                    int[] n = new int[m];
                    int[][] q = new int[m][k];
                    for (int r = 0; r < m; r++) {
                        n[r] = 1 + rnd.nextInt(6);
                        for (int j = 0; j < k; j++) {
                            q[r][j] = rnd.nextInt(4);
                        }
                    }
                    Configuration c = Configuration.of(n, q);
                    seen.add(c.toText());
                    out.item(c, c.toText());
                }
            }

            @Override
            public String description() {
                return "synthetic seed " + seed;
            }
        };
    }

    /** The fake's verdict depends only on the candidate, so every run agrees. */
    static Scored score(Candidate c) {
        int h = c.key().hashCode();
        int pick = Math.floorMod(h, 5);
        Reason r = switch (pick) {
            case 0 -> Reason.KEPT_IN_RANGE;
            case 1 -> Reason.KEPT_AS_NOVEL;
            case 2 -> Reason.EXACT_CHI_OUT_OF_RANGE;
            case 3 -> Reason.PREDICTED_H11_OUT_OF_RANGE;
            default -> Reason.KEPT_LOW_CONFIDENCE;
        };
        double conf = Math.floorMod(h >>> 3, 1000) / 999.0;
        double nov = Math.floorMod(h >>> 13, 1000) / 999.0;
        Integer h21 = pick == 4 ? null : Math.floorMod(h, 90);
        return Scored.of(c, new ExactInvariants(c.config().dimension(), -2L * Math.floorMod(h, 100), c.config().rows(),
                c.config().cols(), 1), Prediction.of(1 + Math.floorMod(h, 9), conf, h21, nov, pick == 1 ? "" : "4:5"), r);
    }

    static final class FakeScorer implements Stage<Candidate, Scored> {
        private final long failAt;
        private StageContext<Scored> ctx;

        FakeScorer(long failAt) {
            this.failAt = failAt;
        }

        @Override
        public void open(StageContext<Scored> ctx) {
            this.ctx = ctx;
        }

        @Override
        public void accept(Candidate c) throws InterruptedException {
            if (c.seq() == failAt) {
                throw new IllegalStateException("abort at seq " + c.seq());
            }
            ctx.forward(score(c));
        }
    }

    /** A clock that advances one second every call, so time-based checkpoints fire too. */
    static Clock tickingClock() {
        return new Clock() {
            private Instant now = Instant.parse("2026-12-01T00:00:00Z");

            @Override
            public synchronized Instant instant() {
                now = now.plus(Duration.ofMillis(7));
                return now;
            }

            @Override
            public java.time.ZoneId getZone() {
                return ZoneOffset.UTC;
            }

            @Override
            public Clock withZone(java.time.ZoneId zone) {
                return this;
            }
        };
    }

    static final ScanInfo INFO = new ScanInfo("test-run-1", "synthetic", null, List.of("keep h11=1..3"), "sha256:fake");

    /** Runs a scan into {@code dir}; throws where the hook or the scorer aborts it. */
    static LocalPipeline.Result run(Path dir, CandidateSource source, SinkOptions options, CrashHook hook, long failAt,
            MeterRegistry registry) throws IOException, PipelineException, InterruptedException {
        AtomicReference<Sequencer> seq = new AtomicReference<>();
        SurvivorSink sink = SurvivorSink.open(dir, INFO, options, tickingClock(), () -> seq.get() == null ? null : seq.get().report(), hook);
        return new LocalPipeline(new LocalPipeline.Options(2, 8, 64), registry)
                .run(source, BadInputPolicy.SKIP, sink.resumeFrom(), i -> new FakeScorer(failAt), sink, seq::set);
    }
}
