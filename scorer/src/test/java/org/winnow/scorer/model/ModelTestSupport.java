package org.winnow.scorer.model;

import java.util.List;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;

/** A small model trained on the synthetic scenario, shared by the tests that need a real one. */
public final class ModelTestSupport {
    private static FrozenModel small;

    private ModelTestSupport() {}

    public static TrainingOptions smallOptions(long seed) {
        return TrainingOptions.defaults(4, seed).withArchitecture(new Architecture(8, 2, 12, 4)).withEpochs(3)
                .withLabelSource("synthetic scenario");
    }

    public static synchronized FrozenModel smallModel() {
        if (small == null) {
            List<LabelledExample> train = SyntheticScenario.generate(120, 1);
            small = Trainer.train(train, smallOptions(9), TrainingProgress.silent());
        }
        return small;
    }
}
