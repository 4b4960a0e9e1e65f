package org.winnow.scorer.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Prediction;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.reference.ReferenceSet;
import org.winnow.scorer.training.Trainer;

/** The vote, the derived Hodge numbers and the novelty direction, on hand-built models. */
class PredictorTest {
    /** A one-dimensional "network" is not needed: embeddings are set directly in the reference. */
    private static FrozenModel model(String[] configs, long[] chi, int[][] hodge, double[] emb, int k, int nk) {
        Architecture arch = new Architecture(2, 1, 2, 1);
        int[] labels = new int[hodge.length];
        for (int i = 0; i < labels.length; i++) {
            labels[i] = hodge[i][0];
        }
        Calibration cal = Trainer.calibrate(emb, 1, labels, k, nk);
        return new FrozenModel(arch, new double[arch.parameterCount()], Normalisation.identity(),
                new ReferenceSet(configs, chi, hodge, emb, 1), cal,
                new TrainingMetadata(0, labels.length, cal.classes().length, 0, 0, 0, "hand-built", ""));
    }

    @Test
    void threeFoldH21FollowsFromChiExactly() {
        // All-zero weights embed every candidate at 0; the reference points sit at 0, 0.5 and 2.
        FrozenModel m = model(new String[] {"4:5", "5:3,3", "1:2/3:4"}, new long[] {-200, -144, -168},
                new int[][] {{1, 101}, {1, 73}, {2, 86}}, new double[] {0, 0.5, 2}, 3, 1);
        Predictor predictor = m.newPredictor();
        Prediction p = predictor.predict(Configuration.parse("4:5"), -200);
        assertEquals(1, p.h11());
        // chi = 2 (h11 - h21) for every three-fold ("All the Hodge numbers for all Calabi-Yau complete
        // intersections", Class. Quant. Grav. 6 (1989) 105): h21 = 1 + 100 = 101 for the quintic.
        assertEquals(101, p.h21());
        assertEquals("4:5", p.nearestReference());
        assertEquals(0.0, predictor.nearestDistance(), 0);
        // The rule of succession on the agreeing neighbours keeps an unproved vote below certainty:
        // two of the k = 3 neighbours agree, (2 + 1) / (3 + 2).
        assertEquals(0.6, p.confidence(), 1e-12);
        Prediction odd = m.newPredictor().predict(Configuration.parse("4:5"), -199);
        assertNull(odd.h21(), "an odd chi has no three-fold h21");
    }

    @Test
    void confidenceIsTheDistanceWeightedVoteShare() {
        // Candidate at 0; neighbours at 1 and -1 (class 5), 2 and -4 (class 6). The within-class
        // leave-one-out distances are 2, 2, 6, 6, so the bandwidth is 2 and, with k = 3, the weights
        // exp(-(d^2 - 1) / 8) are 1, 1, e^-3/8.
        FrozenModel m = model(new String[] {"4:5", "5:3,3", "5:2,4", "6:2,2,3"}, new long[] {0, 0, 0, 0},
                new int[][] {{5, 5}, {5, 5}, {6, 6}, {6, 6}}, new double[] {1, -1, 2, -4}, 3, 1);
        Predictor pr = m.newPredictor();
        int h11 = pr.score(Configuration.parse("4:5"), 0);
        assertEquals(5, h11);
        // The kernel weights pick class 5; its confidence is the rule of succession on the agreeing count:
        // (2 + 1) / (3 + 2).
        assertEquals(3.0 / 5.0, pr.confidence(), 1e-12);
        assertEquals(1.0, pr.nearestDistance(), 0);
    }

    @Test
    void anUnanchoredModelDeterminesNoFourFoldTupleAndProvesNothing() {
        // An unanchored network votes on its labels themselves, which need not be h11: nothing it says is
        // proved, and the four-fold values it has no vote for are not determined.
        FrozenModel m = model(new String[] {"6:2,5", "5:6"}, new long[] {2190, 2610},
                new int[][] {{1, 0, 356, 1472}, {1, 0, 426, 1752}}, new double[] {0, 0.1}, 2, 1);
        Prediction p = m.newPredictor().predict(Configuration.parse("5:6"), 2610);
        assertEquals(1, p.h11());
        assertEquals(org.winnow.geometry.hodge.Basis.ESTIMATED, p.h11Value().basis());
        assertTrue(p.confidence() < 1, "an unproved vote is never certain: " + p.confidence());
        assertNull(p.h21());
        assertNull(p.h31());
        assertNull(p.h22());
    }

    @Test
    void noveltyGrowsWithDistanceFromTheReference() {
        // A reference spread over 0..9 in one dimension; the all-zero network puts candidates at 0, so
        // we move the reference instead and compare a point inside it with one far outside.
        double[] inside = new double[10];
        double[] outside = new double[10];
        for (int i = 0; i < 10; i++) {
            inside[i] = i - 4.5;
            outside[i] = 100 + i;
        }
        String[] cfg = new String[10];
        long[] chi = new long[10];
        int[][] hodge = new int[10][];
        for (int i = 0; i < 10; i++) {
            cfg[i] = "4:5";
            hodge[i] = new int[] {1 + i % 2, 0};
        }
        double near = model(cfg, chi, hodge, inside, 3, 1).newPredictor().predict(Configuration.parse("4:5"), 0)
                .novelty();
        double far = model(cfg, chi, hodge, outside, 3, 1).newPredictor().predict(Configuration.parse("4:5"), 0)
                .novelty();
        assertTrue(near < 0.5, "a candidate inside the reference is not novel: " + near);
        assertEquals(1 - 1.0 / 11, far, 1e-12, "farther than every leave-one-out distance");
    }
}
