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
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.StratifiedSplit;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;

/**
 * Wall time of one full training run with the default options (40 epochs, d = 8) on a stratified 1%
 * of a 7,890-example synthetic set (the size of the three-fold list), with 1 and 2 worker threads.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 3)
@Fork(1)
public class TrainingBench {
    @Param({"1", "2"})
    int threads;

    private List<LabelledExample> train;

    @Setup(Level.Trial)
    public void setUp() {
        train = StratifiedSplit.of(SyntheticScenario.generate(7890, 7), 0.01, 3, 1).train();
    }

    @Benchmark
    public FrozenModel trainOnePercent() {
        return Trainer.train(train, TrainingOptions.defaults(8, 1).withThreads(threads), TrainingProgress.silent());
    }
}
