package org.winnow.bench.model;

import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;
import org.winnow.geometry.Configuration;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;

/**
 * Candidates scored per second on one thread: embed + k nearest reference points + vote + novelty,
 * cycling over 4,096 synthetic candidates. {@code score} is the allocation-free path the scan uses;
 * {@code predict} adds the result record. Run with {@code -prof gc} to see bytes per operation.
 * Speed does not depend on the trained weights' quality, so the model is trained for one epoch.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class ScoringBench {
    /** Reference set size: 80 is 1% of the three-fold list; 8,000 is all of it. */
    @Param({"80", "800", "8000"})
    int referenceSize;

    @Param({"8"})
    int dim;

    private Configuration[] candidates;
    private long[] chis;
    private Predictor predictor;
    private int next;

    @Setup(Level.Trial)
    public void setUp() {
        List<LabelledExample> ref = SyntheticScenario.generate(referenceSize, 1);
        FrozenModel model = Trainer.train(ref, TrainingOptions.defaults(dim, 1).withEpochs(1), TrainingProgress.silent());
        predictor = model.newPredictor();
        List<LabelledExample> cand = SyntheticScenario.generate(4096, 2);
        candidates = new Configuration[cand.size()];
        chis = new long[cand.size()];
        for (int i = 0; i < candidates.length; i++) {
            candidates[i] = cand.get(i).config();
            chis[i] = cand.get(i).chi();
        }
    }

    @Benchmark
    public int score() {
        int i = next++ & 4095;
        return predictor.score(candidates[i], chis[i]);
    }

    @Benchmark
    public void predict(Blackhole bh) {
        int i = next++ & 4095;
        bh.consume(predictor.predict(candidates[i], chis[i]));
    }
}
