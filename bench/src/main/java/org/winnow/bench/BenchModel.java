package org.winnow.bench;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * Trains the bench's model: the default architecture (anchored on the h11 estimate, dimension
 * {@code --dim}) on {@code reference} examples. Speed, not accuracy, is what the bench measures, so a
 * few epochs do; the reference size sets the neighbour search's cost and defaults to 7890, the number
 * of matrices in the original three-fold list (from memory), so that the search costs what it would
 * with a real three-fold reference.
 *
 * <p>The examples are the synthetic development scenario's three-folds, or with {@code --from} distinct
 * lines of a candidate file taken at an even stride (for a four-fold bench: the reference must have the
 * candidates' dimension), labelled with the scenario's toy label and the file's exact chi. Invented
 * labels, good only for timing.
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

    @Option(names = "--from", description = "Take the reference from this candidate file instead of the synthetic scenario.")
    Path from;

    @Option(names = "--dim", defaultValue = "9", description = "Embedding dimension, anchor included (default ${DEFAULT-VALUE}).")
    int dim;

    public static void main(String[] args) {
        System.exit(new CommandLine(new BenchModel()).execute(args));
    }

    @Override
    public Integer call() throws IOException {
        List<LabelledExample> examples = from == null ? SyntheticScenario.generate(reference, seed)
                : fromCandidates(from, reference);
        TrainingOptions options = TrainingOptions.defaults(dim, seed).withEpochs(epochs).withThreads(2)
                .withLabelSource("synthetic development scenario (bench)");
        FrozenModel model = Trainer.train(examples, options, TrainingProgress.silent());
        model.save(out);
        return 0;
    }

    /** Up to {@code count} distinct lines of a candidate file at an even stride, with toy labels. */
    static List<LabelledExample> fromCandidates(Path file, int count) throws IOException {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        Map<String, LabelledExample> distinct = new LinkedHashMap<>();
        long stride = Math.max(1, lines.size() / Math.max(1, count));
        for (int i = 0; i < lines.size() && distinct.size() < count; i += (int) stride) {
            CandidateLine c = CandidateLine.parse(lines.get(i), i + 1);
            distinct.putIfAbsent(lines.get(i).substring(0, lines.get(i).indexOf('\t')),
                    new LabelledExample(c.config(), c.chi(), new int[] {SyntheticScenario.toyLabel(c.config())}));
        }
        return new ArrayList<>(distinct.values());
    }
}
