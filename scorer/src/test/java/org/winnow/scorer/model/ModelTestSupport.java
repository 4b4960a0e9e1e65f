package org.winnow.scorer.model;

import java.util.List;
import org.winnow.scorer.model.synthetic.SyntheticScenario;

/** A small model trained on the synthetic scenario, shared by the tests that need a real one. */
final class ModelTestSupport {
    private static FrozenModel small;

    private ModelTestSupport() {}

    static TrainingOptions smallOptions(long seed) {
        return TrainingOptions.defaults(4, seed).withArchitecture(new Architecture(8, 2, 12, 4)).withEpochs(3)
                .withLabelSource("synthetic scenario");
    }

    static synchronized FrozenModel smallModel() {
        if (small == null) {
            List<LabelledExample> train = SyntheticScenario.generate(120, 1);
            small = Trainer.train(train, smallOptions(9), TrainingProgress.silent());
        }
        return small;
    }
}
