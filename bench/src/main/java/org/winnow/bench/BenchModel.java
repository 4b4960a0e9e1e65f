package org.winnow.bench;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.LabelledExample;
import org.winnow.scorer.model.Trainer;
import org.winnow.scorer.model.TrainingOptions;
import org.winnow.scorer.model.TrainingProgress;
import org.winnow.scorer.model.synthetic.SyntheticScenario;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * Trains the bench's model: the default architecture on {@code reference} examples of the synthetic
 * development scenario. Speed, not accuracy, is what the bench measures, so a few epochs do; the
 * reference size sets the neighbour search's cost and defaults to 7890, the number of matrices in
 * the original three-fold list (from memory), so that the search costs what it would with a real
 * three-fold reference.
 */
@Command(name = "bench-model", mixinStandardHelpOptions = true)
public final class BenchModel implements Callable<Integer> {
    @Option(names = "--reference", defaultValue = "7890", description = "Reference examples (default ${DEFAULT-VALUE}).")
    int reference;

    @Option(names = "--epochs", defaultValue = "4", description = "Training epochs (default ${DEFAULT-VALUE}).")
    int epochs;

    @Option(names = "--seed", defaultValue = "11", description = "Seed (default ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--out", required = true, description = "Where to write the .wnm model.")
    Path out;

    public static void main(String[] args) {
        System.exit(new CommandLine(new BenchModel()).execute(args));
    }

    @Override
    public Integer call() throws IOException {
        List<LabelledExample> examples = SyntheticScenario.generate(reference, seed);
        TrainingOptions options = TrainingOptions.defaults(8, seed).withEpochs(epochs).withThreads(2)
                .withLabelSource("synthetic development scenario (bench)");
        FrozenModel model = Trainer.train(examples, options, TrainingProgress.silent());
        model.save(out);
        return 0;
    }
}
