package org.winnow.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.WinnowCli;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.producer.ExclusionSet;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;

/**
 * The numpy reference scorer reads the exported weights and must predict exactly what winnow's
 * Predictor predicts, candidate by candidate, with either distance formula. Skipped (not failed) where no python3 with numpy exists.
 */
class NumpyAgreementTest {
    @TempDir
    Path dir;

    @Test
    void numpyScorerPredictsWhatWinnowPredictsOnAThousandCandidates() throws Exception {
        String python = PythonWithNumpy.find();
        assumeTrue(python != null, "no python3 with numpy on this machine");

        TrainingOptions options = TrainingOptions.defaults(8, 5).withArchitecture(Architecture.defaults(8))
                .withEpochs(2).withThreads(1);
        FrozenModel model = Trainer.train(SyntheticScenario.generate(600, 5), options, TrainingProgress.silent());
        Path candidates = dir.resolve("c.tsv");
        GenerateCandidates.write(1000, 99, candidates);
        assertAgreement(python, model, candidates, 1000);
    }

    /**
     * Four-folds of the enumeration: the estimate's search goes deeper there than on three-folds. The
     * {@code base} rules keep the redundant descriptions, whose first pages are often unsettled, so the
     * deferring path is exercised on many candidates.
     */
    @Test
    void numpyScorerPredictsWhatWinnowPredictsOnFourFoldsOfTheEnumeration() throws Exception {
        String python = PythonWithNumpy.find();
        assumeTrue(python != null, "no python3 with numpy on this machine");

        Path candidates = dir.resolve("c4.tsv");
        assertEquals(600, GenerateCandidates.writeEnumerated(600, 5, ExclusionSet.BASE, candidates));
        TrainingOptions options = TrainingOptions.defaults(9, 5).withEpochs(2).withThreads(1);
        FrozenModel model = Trainer.train(BenchModel.fromCandidates(candidates, 300), options,
                TrainingProgress.silent());
        assertAgreement(python, model, candidates, 600);
    }

    private void assertAgreement(String python, FrozenModel model, Path candidates, int count) throws Exception {
        Path modelFile = dir.resolve("m.wnm");
        model.save(modelFile);
        Path weights = dir.resolve("w.json");
        assertEquals(0, WinnowCli.commandLine().execute("export-weights", "--model", modelFile.toString(), "--out",
                weights.toString()));
        List<Integer> expected = new ArrayList<>();
        Predictor p = model.newPredictor();
        int number = 0;
        for (String line : Files.readAllLines(candidates, StandardCharsets.UTF_8)) {
            CandidateLine c = CandidateLine.parse(line, ++number);
            p.score(c.config(), c.chi());
            // Where the anchor is not the plain first page winnow asks its Hodge engine; the numpy port
            // defers (-1). The port reproduces the vote, so it is compared with winnow's vote before a
            // proof replaces it.
            expected.add(p.estimateSource() == RefinedH11Estimator.Source.FIRST_PAGE ? p.votedH11() : -1);
        }

        // A vote that never varies would agree trivially: the candidates must reach several classes.
        assertTrue(new HashSet<>(expected).size() >= 3, "predictions: " + new HashSet<>(expected));
        for (String search : new String[] {"direct", "gemm"}) {
            List<Integer> actual = numpy(python, weights, candidates, search);
            assertEquals(count, actual.size());
            int compared = 0;
            for (int i = 0; i < expected.size(); i++) {
                // winnow's anchor may be a proof where the port reads a settled page that assumes one map has
                // maximal rank: such candidates are not the port's to predict, whatever it answers.
                if (expected.get(i) == -1 && actual.get(i) != -1) {
                    continue;
                }
                assertEquals(expected.get(i), actual.get(i), search + " search, candidate " + (i + 1));
                compared++;
            }
            assertTrue(compared >= count / 2, search + " search: compared only " + compared + " of " + count);
        }
    }

    private List<Integer> numpy(String python, Path weights, Path candidates, String search) throws Exception {
        Path out = dir.resolve("p-" + search + ".txt");
        Path log = dir.resolve("log-" + search + ".txt");
        Process proc = new ProcessBuilder(python, Path.of("numpy_scorer.py").toAbsolutePath().toString(),
                "--weights", weights.toString(), "--candidates", candidates.toString(), "--search", search,
                "--predictions", out.toString()).redirectErrorStream(true).redirectOutput(log.toFile()).start();
        assertTrue(proc.waitFor(120, TimeUnit.SECONDS), "numpy scorer did not finish");
        assertEquals(0, proc.exitValue(), () -> read(log));
        List<Integer> actual = new ArrayList<>();
        for (String line : Files.readAllLines(out, StandardCharsets.UTF_8)) {
            actual.add(Integer.parseInt(line.strip()));
        }
        return actual;
    }

    private static String read(Path p) {
        try {
            return Files.readString(p);
        } catch (IOException e) {
            return e.toString();
        }
    }
}
