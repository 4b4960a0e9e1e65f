package org.winnow.scorer.training;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.model.Calibration;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.ModelTestSupport;
import org.winnow.scorer.model.Predictor;
import org.winnow.scorer.reference.LabelledExample;

class TrainerTest {
    @Test
    void trainingIsDeterministicForAFixedSeedWhateverTheThreadCount() {
        List<LabelledExample> train = SyntheticScenario.generate(80, 2);
        TrainingOptions o = ModelTestSupport.smallOptions(5).withEpochs(2);
        FrozenModel one = Trainer.train(train, o.withThreads(1), TrainingProgress.silent());
        FrozenModel two = Trainer.train(train, o.withThreads(2), TrainingProgress.silent());
        FrozenModel again = Trainer.train(train, o.withThreads(2), TrainingProgress.silent());
        assertArrayEquals(one.parameters(), two.parameters(), 0);
        assertArrayEquals(two.parameters(), again.parameters(), 0);
        assertEquals(one.checksum(), again.checksum());
        FrozenModel otherSeed = Trainer.train(train, ModelTestSupport.smallOptions(6).withEpochs(2),
                TrainingProgress.silent());
        assertFalse(Arrays.equals(one.parameters(), otherSeed.parameters()));
    }

    @Test
    void lossFallsAndTheModelBeatsTheMajorityClass() {
        List<LabelledExample> all = SyntheticScenario.generate(900, 3);
        List<LabelledExample> train = all.subList(0, 300);
        List<LabelledExample> test = all.subList(300, all.size());
        List<Double> losses = new ArrayList<>();
        FrozenModel model = Trainer.train(train, ModelTestSupport.smallOptions(1).withEpochs(8),
                (e, n, loss) -> losses.add(loss));
        assertEquals(8, losses.size());
        assertTrue(losses.get(losses.size() - 1) < 0.7 * losses.get(0), "loss did not fall: " + losses);
        Predictor p = model.newPredictor();
        int correct = 0;
        int[] counts = new int[64];
        for (LabelledExample ex : test) {
            correct += p.score(ex.config(), ex.chi()) == ex.h11() ? 1 : 0;
            counts[ex.h11()]++;
        }
        int majority = Arrays.stream(counts).max().orElseThrow();
        double accuracy = correct / (double) test.size();
        assertTrue(accuracy > 1.5 * majority / test.size(),
                "accuracy " + accuracy + " vs majority share " + majority / (double) test.size());
    }

    @Test
    void calibrationIsTheSortedWithinClassLeaveOneOutDistance() {
        // Class 1 at 0 and 1, class 2 at 2, 8 and 9, class 3 alone at 20. Within-class nearest distances:
        // 1, 1 | 6, 1, 1 | none. (Across classes the point at 2 would have had 1.)
        Calibration c = Trainer.calibrate(new double[] {0, 1, 2, 8, 9, 20}, 1, new int[] {1, 1, 2, 2, 2, 3}, 3, 1);
        assertArrayEquals(new double[] {1, 1, 1, 1, 6}, c.looDistances(), 0);
        assertArrayEquals(new int[] {1, 2, 3}, c.classes());
        assertEquals(1.0, c.classQuantiles()[0][0], 0);
        assertEquals(6.0, c.classQuantiles()[1][3], 0);
        assertTrue(Double.isNaN(c.classQuantiles()[2][0]), "a class of one has no within-class distance");
        // p = (1 + #{D >= delta}) / (N + 1); novelty = 1 - p.
        assertEquals(0.0, c.novelty(0.5), 1e-15);
        assertEquals(1 - 6.0 / 6, c.novelty(1), 1e-15);
        // Above the 90% quantile u = 1 an exponential tail with the mean excess over u (6 - 1 = 5) as
        // scale, joined at u: p = (1 + #{D > 1}) / 6 * exp(-(delta - 1) / 5).
        assertEquals(1.0, c.tailThreshold(), 0);
        assertEquals(5.0, c.tailScale(), 0);
        assertEquals(1 - 2.0 / 6 * Math.exp(-0.2), c.novelty(2), 1e-15);
        assertEquals(1 - 2.0 / 6 * Math.exp(-1), c.novelty(6), 1e-15);
        assertEquals(1 - 2.0 / 6 * Math.exp(-3), c.novelty(16), 1e-15);
        assertEquals(1.0, c.bandwidth(), 0, "the median leave-one-out distance");
    }

    @Test
    void calibrationFallsBackToAllPointsWhenEveryClassHasOneMember() {
        Calibration c = Trainer.calibrate(new double[] {0, 1, 3}, 1, new int[] {1, 2, 3}, 3, 1);
        assertArrayEquals(new double[] {1, 1, 2}, c.looDistances(), 0);
    }
}
