package org.winnow.pipeline.local;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.SourceListener;
import org.winnow.pipeline.Stage;
import org.winnow.pipeline.StageContext;

/**
 * Child-JVM program for {@link BoundedMemoryTest}: a fast source, a fast scorer and a deliberately
 * slow sink, with the queue capacity and window given on the command line. Prints the high-water
 * marks and exits 0 when the run completes.
 */
public final class BoundedMemoryMain {
    private BoundedMemoryMain() {}

    public static void main(String[] args) throws Exception {
        int count = Integer.parseInt(args[0]);
        int capacity = Integer.parseInt(args[1]);
        int window = Integer.parseInt(args[2]);
        CandidateSource source = new CandidateSource() {
            @Override
            public void run(SourceListener out) throws InterruptedException {
                for (int i = 0; i < count; i++) {
                    // Large matrices, so that an unbounded backlog would fill a small heap quickly.
                    int[] n = new int[12];
                    int[][] q = new int[12][16];
                    for (int r = 0; r < 12; r++) {
                        n[r] = 1 + (i >> r) % 3;
                        q[r][r] = 1 + (i >> (r + 1)) % 2;
                    }
                    Configuration c = Configuration.of(n, q);
                    out.item(c, i + ":" + c.toText());
                }
            }

            @Override
            public boolean distinct() {
                return true;
            }

            @Override
            public String description() {
                return "fast source";
            }
        };
        Stage<Scored, Void> slowSink = new Stage<>() {
            private long seen;

            @Override
            public void accept(Scored s) throws InterruptedException {
                // Stalls long enough for an unbounded source to push everything, then keeps lagging.
                if (seen++ == 0) {
                    Thread.sleep(3000);
                } else if (seen % 500 == 0) {
                    Thread.sleep(1);
                }
            }
        };
        LocalPipeline.Result r = new LocalPipeline(new LocalPipeline.Options(2, capacity, window), new SimpleMeterRegistry())
                .run(source, BadInputPolicy.SKIP, 0, i -> new Stage<Candidate, Scored>() {
                    private StageContext<Scored> ctx;

                    @Override
                    public void open(StageContext<Scored> ctx) {
                        this.ctx = ctx;
                    }

                    @Override
                    public void accept(Candidate c) throws InterruptedException {
                        ctx.forward(Scored.of(c, new ExactInvariants(3, 0, 12, 16, 1), Prediction.of(1, 1, 1, 0, ""), Reason.KEPT_IN_RANGE));
                    }
                }, slowSink, s -> {});
        System.out.println("done " + r.source().candidates() + " " + r.maxCandidateDepth() + " " + r.maxScoredDepth() + " "
                + r.maxReorderDepth());
    }
}
