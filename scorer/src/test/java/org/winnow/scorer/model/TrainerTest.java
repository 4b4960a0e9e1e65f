package org.winnow.scorer.model;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.scorer.model.synthetic.SyntheticScenario;

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
    void calibrationIsTheSortedLeaveOneOutDistance() {
        // Points on a line at 0, 1, 3, 7: nearest other points at 1, 1, 2, 4.
        Calibration c = Trainer.calibrate(new double[] {0, 1, 3, 7}, 1, new int[] {1, 1, 2, 2}, 3, 1);
        assertArrayEquals(new double[] {1, 1, 2, 4}, c.looDistances(), 0);
        assertArrayEquals(new int[] {1, 2}, c.classes());
        assertEquals(1.0, c.classQuantiles()[0][0], 0);
        assertEquals(4.0, c.classQuantiles()[1][3], 0);
        // p = (1 + #{D >= delta}) / (N + 1); novelty = 1 - p.
        assertEquals(1 - 5.0 / 5, c.novelty(0.5), 1e-15);
        assertEquals(1 - 3.0 / 5, c.novelty(1.5), 1e-15);
        assertEquals(1 - 2.0 / 5, c.novelty(4), 1e-15);
        // Beyond the largest distance (4) an exponential tail with the mean excess over the 90%
        // quantile (here 4 - 2 = 2) as scale: p = exp(-(10 - 4) / 2) / 5.
        assertEquals(2.0, c.tailScale(), 0);
        assertEquals(1 - Math.exp(-3) / 5, c.novelty(10), 1e-15);
        assertEquals(1.0, c.bandwidth(), 0, "the median leave-one-out distance");
    }
}
