package org.winnow.scorer.training;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.EmbeddingNetwork;
import org.winnow.scorer.network.FeatureEncoder;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.network.Workspace;

/**
 * The embedding depends on a configuration only up to the order of its rows and columns, as the docs
 * promise: for random Calabi-Yau configurations and random weights (anchored and plain networks), a
 * permuted matrix embeds to the same point up to summation rounding. Common practice, no source.
 */
class EmbeddingPropertiesTest {
    @Property(tries = 150)
    void embeddingIgnoresRowAndColumnOrder(@ForAll long seed, @ForAll boolean anchored) {
        SplittableRandom rng = new SplittableRandom(seed);
        Architecture arch = anchored ? Architecture.defaults(5) : new Architecture(6, 2, 7, 4);
        double[] p = Trainer.initialParameters(arch, rng.split());
        Configuration c = new RandomConfigurations(rng.split()).calabiYau(3 + rng.nextInt(2), 4, 3);
        long chi = new InvariantCalculator().chi(c);
        Configuration shuffled = EmbeddingNetworkTest.permute(c, rng);
        Workspace ws = new Workspace(arch);
        double[] base = embed(p, c, chi, ws);
        double[] other = embed(p, shuffled, chi, ws);
        for (int i = 0; i < base.length; i++) {
            assertEquals(base[i], other[i], 1e-9 * Math.max(1, Math.abs(base[i])), () -> c + " vs " + shuffled);
        }
    }

    private static double[] embed(double[] p, Configuration c, long chi, Workspace ws) {
        FeatureEncoder.encode(c, chi, Normalisation.identity(), ws);
        EmbeddingNetwork.forward(p, ws);
        return ws.e.clone();
    }
}
