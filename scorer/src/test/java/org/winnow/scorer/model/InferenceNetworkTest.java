package org.winnow.scorer.model;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.pipeline.Prediction;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.index.FlatIndex;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceTsv;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.EmbeddingNetwork;
import org.winnow.scorer.network.FeatureEncoder;
import org.winnow.scorer.network.InferenceNetwork;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.network.Workspace;

/** The scoring forward pass against the training forward pass, {@link EmbeddingNetwork#forward}, as the oracle. */
class InferenceNetworkTest {
    private static final Path DEMO = Path.of("..", "demo-data");

    @Test
    void equalsTheTrainingPassOnRandomModelsAndConfigurations() {
        SplittableRandom rng = new SplittableRandom(2027);
        List<LabelledExample> examples = SyntheticScenario.generate(150, 8);
        long compared = 0;
        for (int model = 0; model < 24; model++) {
            boolean anchored = rng.nextBoolean();
            Architecture arch = new Architecture(1 + rng.nextInt(20), model % 4, 1 + rng.nextInt(40),
                    (anchored ? 2 : 1) + rng.nextInt(10), anchored);
            double[] p = Trainer.initialParameters(arch, rng.split());
            for (int i = 0; i < p.length; i++) {
                p[i] += rng.nextGaussian() * 0.3; // biases away from zero, so that ReLUs cut both ways
            }
            Normalisation norm = model % 2 == 0 ? Normalisation.identity()
                    : Normalisation.fit(examples.stream().map(LabelledExample::config).toList(),
                            examples.stream().mapToLong(LabelledExample::chi).toArray());
            InferenceNetwork net = new InferenceNetwork(arch, p);
            Workspace training = new Workspace(arch);
            Workspace scoring = new Workspace(arch);
            for (int c = 0; c < 40; c++) {
                LabelledExample ex = examples.get(rng.nextInt(examples.size()));
                FeatureEncoder.encode(ex.config(), ex.chi(), norm, training);
                EmbeddingNetwork.forward(p, training);
                FeatureEncoder.encode(ex.config(), ex.chi(), norm, scoring);
                net.forward(scoring);
                for (int o = 0; o < arch.dim(); o++) {
                    double want = training.e[o];
                    double got = scoring.e[o];
                    // Same operations in the same order: equal bits, which is stricter than the 1e-12 relative asked.
                    assertEquals(Double.doubleToLongBits(want), Double.doubleToLongBits(got),
                            () -> arch + " on " + ex.config() + ": " + want + " vs " + got);
                    assertTrue(Math.abs(want - got) <= 1e-12 * Math.abs(want));
                    compared++;
                }
            }
        }
        assertTrue(compared > 1000, "too few coordinates compared: " + compared);
    }

    @Test
    void relusCutSomeOutputsOnTheRandomModels() {
        // Guards the comparison above against a degenerate network where every unit is always on or off.
        Architecture arch = new Architecture(12, 0, 24, 9, true);
        double[] p = Trainer.initialParameters(arch, new SplittableRandom(5));
        Workspace ws = new Workspace(arch);
        int zeros = 0;
        int positives = 0;
        for (LabelledExample ex : SyntheticScenario.generate(30, 3)) {
            FeatureEncoder.encode(ex.config(), ex.chi(), Normalisation.identity(), ws);
            new InferenceNetwork(arch, p).forward(ws);
            for (double u : ws.u) {
                zeros += u == 0 ? 1 : 0;
                positives += u > 0 ? 1 : 0;
            }
        }
        assertTrue(zeros > 0 && positives > 0, zeros + " zero and " + positives + " positive readout units");
    }

    /**
     * On the shipped demo model, every prediction of the {@link Predictor} equals what the training pass's
     * embedding, a flat scan over the reference and the vote give (the vote written out again here).
     */
    @Test
    void demoModelPredictsWhatTheTrainingPassPredicts() throws IOException {
        Path modelFile = DEMO.resolve("threefolds-1pct.wnm");
        Path labelled = DEMO.resolve("threefolds-exact.tsv");
        assumeTrue(Files.isReadable(modelFile) && Files.isReadable(labelled), "demo data not beside the module");
        FrozenModel model = FrozenModel.load(modelFile);
        Predictor predictor = model.newPredictor();
        Workspace ws = new Workspace(model.architecture());
        double[] params = model.parameters();
        FlatIndex flat = new FlatIndex(model.reference().embeddings(), model.reference().dim());
        Calibration cal = model.calibration();
        int searchK = Math.max(cal.k(), cal.noveltyK());
        InvariantCalculator invariants = new InvariantCalculator();
        List<Configuration> configs = new ArrayList<>();
        for (ReferenceTsv.Row r : ReferenceTsv.read(labelled)) {
            configs.add(r.config());
        }
        int[] nb = new int[searchK];
        double[] dist = new double[searchK];
        for (Configuration c : configs) {
            long chi = invariants.chi(c);
            FeatureEncoder.encode(c, chi, model.normalisation(), ws);
            EmbeddingNetwork.forward(params, ws);
            assertArrayEquals(ws.e, model.embed(c, chi), 0.0, c::toString);
            int found = flat.search(ws.e, searchK, -1, nb, dist);
            Prediction p = predictor.predict(c, chi);
            int k = Math.min(cal.k(), found);
            int[] votes = new int[k];
            for (int i = 0; i < k; i++) {
                votes[i] = ws.h11Estimate + model.residual(model.residualOf(nb[i]));
            }
            assertArrayEquals(votes, predictor.neighbourH11(), c::toString);
            assertEquals(dist[0], predictor.nearestDistance(), 0.0, c::toString);
            assertEquals(model.reference().configs()[nb[0]], p.nearestReference(), c::toString);
            assertEquals(cal.novelty(dist[Math.min(cal.noveltyK(), found) - 1]), p.novelty(), 0.0, c::toString);
            assertEquals(oracleVote(model, ws, nb, dist, k), p.h11(), c::toString);
        }
        assertTrue(configs.size() > 9000, "demo file read only partly: " + configs.size());
    }

    /** The kernel vote on corrections, as {@link Predictor} documents it. */
    private static int oracleVote(FrozenModel model, Workspace ws, int[] nb, double[] dist, int k) {
        if (ws.anchor.h11Proved()) {
            return ws.h11Estimate;
        }
        double bw = model.calibration().bandwidth();
        double[] weight = new double[model.residualCount()];
        for (int i = 0; i < k; i++) {
            double w = bw > 0 ? Math.exp(-(dist[i] * dist[i] - dist[0] * dist[0]) * (0.5 / (bw * bw)))
                    : 1.0 / (dist[i] + 1e-12);
            weight[model.residualOf(nb[i])] += w;
        }
        int best = -1;
        for (int i = 0; i < k; i++) {
            int c = model.residualOf(nb[i]);
            if (best < 0 || weight[c] > weight[best] || (weight[c] == weight[best] && nearerZero(model, c, best))) {
                best = c;
            }
        }
        int voted = (model.architecture().anchored() ? ws.h11Estimate : 0) + model.residual(best);
        org.winnow.geometry.hodge.KnownValue h11 = ws.anchor.tuple() == null ? null : ws.anchor.tuple().h11();
        // A vote outside a proved interval is clamped into it.
        return h11 == null || h11.basis() != org.winnow.geometry.hodge.Basis.BOUNDED ? voted
                : (int) Math.max(h11.lo(), Math.min(h11.hi(), voted));
    }

    private static boolean nearerZero(FrozenModel model, int c, int over) {
        int a = Math.abs(model.residual(c));
        int b = Math.abs(model.residual(over));
        return a < b || (a == b && model.residual(c) < model.residual(over));
    }

    @Test
    void reusesOneWorkspaceAcrossShapes() {
        // Shapes shrink and grow between calls: nothing of a larger earlier graph may leak into a smaller one.
        Architecture arch = new Architecture(7, 1, 9, 4, false);
        double[] p = Trainer.initialParameters(arch, new SplittableRandom(13));
        InferenceNetwork net = new InferenceNetwork(arch, p);
        Workspace shared = new Workspace(arch);
        for (LabelledExample ex : SyntheticScenario.generate(60, 21)) {
            FeatureEncoder.encode(ex.config(), ex.chi(), Normalisation.identity(), shared);
            net.forward(shared);
            Workspace fresh = new Workspace(arch);
            FeatureEncoder.encode(ex.config(), ex.chi(), Normalisation.identity(), fresh);
            EmbeddingNetwork.forward(p, fresh);
            assertArrayEquals(fresh.e, Arrays.copyOf(shared.e, arch.dim()), 0.0, ex.config()::toString);
        }
    }
}
