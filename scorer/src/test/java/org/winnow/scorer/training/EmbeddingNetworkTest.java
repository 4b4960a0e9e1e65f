package org.winnow.scorer.training;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.RandomConfigurations;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.EmbeddingNetwork;
import org.winnow.scorer.network.FeatureEncoder;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.network.Workspace;

class EmbeddingNetworkTest {
    private static final Architecture ARCH = new Architecture(6, 2, 7, 4);

    @Test
    void embeddingIsInvariantUnderRowAndColumnPermutations() {
        invariantUnderPermutations(ARCH);
    }

    @Test
    void anchoredEmbeddingIsInvariantUnderRowAndColumnPermutations() {
        // The anchor coordinate is the first-page h11 estimate: its search order follows the columns, its
        // value must not.
        invariantUnderPermutations(Architecture.defaults(5));
    }

    private static void invariantUnderPermutations(Architecture arch) {
        SplittableRandom rng = new SplittableRandom(11);
        double[] p = Trainer.initialParameters(arch, rng.split());
        Workspace ws = new Workspace(arch);
        List<LabelledExample> examples = SyntheticScenario.generate(200, 5);
        for (LabelledExample ex : examples) {
            double[] base = embed(p, ex.config(), ex.chi(), ws);
            for (int trial = 0; trial < 3; trial++) {
                Configuration shuffled = permute(ex.config(), rng);
                double[] other = embed(p, shuffled, ex.chi(), ws);
                for (int i = 0; i < base.length; i++) {
                    assertEquals(base[i], other[i], 1e-9, () -> ex.config() + " vs " + shuffled);
                }
            }
        }
    }

    @Test
    void embeddingSeparatesDifferentMatrices() {
        // Guards the invariance test against a network that maps everything to one point.
        double[] p = Trainer.initialParameters(ARCH, new SplittableRandom(3));
        Workspace ws = new Workspace(ARCH);
        double[] a = embed(p, Configuration.parse("4:5"), -200, ws);
        double[] b = embed(p, Configuration.parse("1:2/3:4"), -168, ws);
        double diff = 0;
        for (int i = 0; i < a.length; i++) {
            diff += Math.abs(a[i] - b[i]);
        }
        assertTrue(diff > 1e-3, "embeddings of different matrices coincide");
    }

    /**
     * Central differences of {@code f(p) = sum_o v_o e_o(p)} against the hand-written backward pass, for
     * every parameter, on several random graphs. Common practice, no source.
     */
    @Test
    void backwardMatchesFiniteDifferences() {
        SplittableRandom rng = new SplittableRandom(21);
        Architecture arch = new Architecture(5, 3, 6, 3);
        Normalisation norm = Normalisation.identity();
        for (LabelledExample ex : SyntheticScenario.generate(4, 77)) {
            double[] p = Trainer.initialParameters(arch, rng.split());
            for (int i = 0; i < p.length; i++) {
                p[i] += 0.05 * (rng.nextDouble() - 0.5); // move biases off zero so ReLUs are mixed
            }
            double[] v = new double[arch.dim()];
            for (int i = 0; i < v.length; i++) {
                v[i] = rng.nextDouble() * 2 - 1;
            }
            Workspace ws = new Workspace(arch);
            FeatureEncoder.encode(ex.config(), ex.chi(), norm, ws);
            EmbeddingNetwork.forward(p, ws);
            double[] grad = new double[p.length];
            EmbeddingNetwork.backward(p, ws, v, grad);
            double h = 1e-6;
            int checked = 0;
            double worst = 0;
            for (int i = 0; i < p.length; i++) {
                double keep = p[i];
                p[i] = keep + h;
                double up = dot(v, embedWith(p, ex, norm, ws));
                p[i] = keep - h;
                double down = dot(v, embedWith(p, ex, norm, ws));
                p[i] = keep;
                double numeric = (up - down) / (2 * h);
                double err = Math.abs(numeric - grad[i]) / Math.max(1.0, Math.abs(numeric) + Math.abs(grad[i]));
                worst = Math.max(worst, err);
                checked += grad[i] != 0 ? 1 : 0;
            }
            assertTrue(worst < 1e-6, "worst relative gradient error " + worst + " on " + ex.config());
            assertTrue(checked > p.length / 8, "too few parameters carry gradient: " + checked);
        }
    }

    @Test
    void contrastiveLossGradientMatchesFiniteDifferences() {
        SplittableRandom rng = new SplittableRandom(8);
        double[] grad = new double[5];
        for (int trial = 0; trial < 50; trial++) {
            double[] x = new double[5];
            double[] y = new double[5];
            for (int i = 0; i < 5; i++) {
                x[i] = rng.nextDouble() - 0.5;
                y[i] = rng.nextDouble() - 0.5;
            }
            boolean same = trial % 2 == 0;
            ContrastiveLoss.pair(x, y, same, 1.5, grad);
            for (int i = 0; i < 5; i++) {
                double keep = x[i];
                x[i] = keep + 1e-6;
                double up = ContrastiveLoss.pair(x, y, same, 1.5, new double[5]);
                x[i] = keep - 1e-6;
                double down = ContrastiveLoss.pair(x, y, same, 1.5, new double[5]);
                x[i] = keep;
                assertEquals((up - down) / 2e-6, grad[i], 1e-6);
            }
        }
    }

    private static double[] embedWith(double[] p, LabelledExample ex, Normalisation norm, Workspace ws) {
        FeatureEncoder.encode(ex.config(), ex.chi(), norm, ws);
        EmbeddingNetwork.forward(p, ws);
        return ws.e.clone();
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    private static double[] embed(double[] p, Configuration c, long chi, Workspace ws) {
        FeatureEncoder.encode(c, chi, Normalisation.identity(), ws);
        EmbeddingNetwork.forward(p, ws);
        return ws.e.clone();
    }

    static Configuration permute(Configuration c, SplittableRandom rng) {
        return new RandomConfigurations(rng).permuted(c);
    }
}
