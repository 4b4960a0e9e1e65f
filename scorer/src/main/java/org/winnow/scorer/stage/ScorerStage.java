package org.winnow.scorer.stage;

import java.util.Objects;
import java.util.function.LongSupplier;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Stage;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.metrics.ScorerMetrics;
import org.winnow.scorer.rules.KeepRules;

/**
 * The scorer as a pipeline stage. The runner makes one instance per worker thread; {@link #open}
 * builds that thread's invariant calculator and predictor, {@link #accept} scores and forwards every
 * candidate, rejected ones included, so that the sink can reconcile every count.
 */
public final class ScorerStage implements Stage<Candidate, Scored> {
    private final ScoringFunctions functions;
    private final KeepRules rules;
    private final LongSupplier ticker;
    private StageContext<Scored> ctx;
    private CandidateScorer scorer;
    private ScorerMetrics metrics;

    /**
     * @param ticker nanosecond time source for the latency timer ({@code System::nanoTime} in production)
     */
    public ScorerStage(ScoringFunctions functions, KeepRules rules, LongSupplier ticker) {
        this.functions = Objects.requireNonNull(functions, "functions");
        this.rules = Objects.requireNonNull(rules, "rules");
        this.ticker = Objects.requireNonNull(ticker, "ticker");
    }

    @Override
    public void open(StageContext<Scored> ctx) {
        this.ctx = ctx;
        this.scorer = CandidateScorer.of(functions, rules);
        this.metrics = new ScorerMetrics(ctx.registry());
    }

    @Override
    public void accept(Candidate candidate) throws InterruptedException {
        long start = ticker.getAsLong();
        Scored s = scorer.score(candidate);
        metrics.scored(s, ticker.getAsLong() - start);
        ctx.forward(s);
    }
}
