package org.winnow.app.scan;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.winnow.geometry.Configuration;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;

/**
 * A small model trained on the project's synthetic development scenario, and input files drawn from
 * the same generator with known bad lines and duplicates. Invented data: it tests the plumbing, not
 * the mathematics.
 */
public final class ScanFixtures {
    private static FrozenModel model;

    private ScanFixtures() {}

    /** The model, trained once per test JVM. */
    public static synchronized FrozenModel model() {
        if (model == null) {
            TrainingOptions o = TrainingOptions.defaults(4, 11).withArchitecture(new Architecture(8, 2, 12, 4))
                    .withEpochs(2).withLabelSource("synthetic scenario");
            model = Trainer.train(SyntheticScenario.generate(150, 5), o, TrainingProgress.silent());
        }
        return model;
    }

    /** Saves the model into {@code dir} and returns its path. */
    public static Path saveModel(Path dir) throws IOException {
        Path p = dir.resolve("test.wnm");
        model().save(p);
        return p;
    }

    /** An input file and the line numbers of its bad lines. */
    public record Input(Path file, List<Long> badLines, int goodLines) {}

    /**
     * {@code count} lines: mostly random three-folds, every 25th line a repeat of an earlier one with its
     * rows reversed (a duplicate after canonical form), and a few unusable lines.
     */
    public static Input input(Path dir, long seed, int count) throws IOException {
        SplittableRandom rnd = new SplittableRandom(seed);
        List<String> lines = new ArrayList<>();
        List<Long> bad = new ArrayList<>();
        List<Configuration> drawn = new ArrayList<>();
        lines.add("# test input");
        String[] broken = {"4:4", "2:3/2:3,1", "hello", "3:2,,2", "0:1"};
        int good = 0;
        for (int i = 0; i < count; i++) {
            if (i % 37 == 36) {
                lines.add(broken[(i / 37) % broken.length]);
                bad.add((long) lines.size());
            } else if (i % 25 == 24 && !drawn.isEmpty()) {
                Configuration c = drawn.get(rnd.nextInt(drawn.size()));
                int m = c.rows();
                int[] n = new int[m];
                int[][] q = new int[m][];
                for (int r = 0; r < m; r++) {
                    n[r] = c.n(m - 1 - r);
                    q[r] = c.degrees()[m - 1 - r];
                }
                lines.add(Configuration.of(n, q).toText() + "\trepeat");
                good++;
            } else {
                Configuration c = SyntheticScenario.draw(rnd);
                drawn.add(c);
                lines.add(c.toText());
                good++;
            }
        }
        Path f = dir.resolve("input-" + seed + ".txt");
        Files.write(f, lines);
        return new Input(f, bad, good);
    }
}
