package org.winnow.scorer.stage;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Objects;
import org.winnow.geometry.hodge.KnownValue;
import org.winnow.geometry.hodge.TupleEstimate;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.Predictor;

/**
 * Scoring with a frozen model: exact invariants from the geometry calculator, predictions from the
 * model's per-thread {@link Predictor}.
 *
 * <p>A candidate of another dimension than the model's reference set is outside what the model knows:
 * its prediction is passed on, but with novelty 1 and no derived h21 (nor h31, h22), so no rule can reject it on the
 * model's word.
 */
public final class ModelScoring implements ScoringFunctions {
    private final FrozenModel model;
    private final String file;

    public ModelScoring(FrozenModel model) {
        this(model, null);
    }

    private ModelScoring(FrozenModel model, String file) {
        this.model = Objects.requireNonNull(model, "model");
        this.file = file;
    }

    /** Loads and verifies a {@code .wnm} file; the exception message is one line naming the file. */
    public static ModelScoring load(Path file) throws IOException {
        return new ModelScoring(FrozenModel.load(file), file.toAbsolutePath().normalize().toString());
    }

    @Override
    public String modelFile() {
        return file;
    }

    @Override
    public InvariantFunction newInvariants() {
        return new CheapInvariantFunction();
    }

    @Override
    public PredictionFunction newPredictions() {
        Predictor predictor = model.newPredictor();
        int modelDim = model.dimension();
        return (config, exact) -> {
            Prediction p = predictor.predict(config, exact.chi());
            if (exact.dim() == modelDim) {
                return p;
            }
            // The model's vote says nothing about another dimension; the candidate's own proofs still hold.
            TupleEstimate t = predictor.tuple();
            if (t == null) {
                return new Prediction(p.h11(), 0, null, null, null, 1.0, p.nearestReference());
            }
            return new Prediction(unvoted(t.h11()), unvoted(t.h21()), unvoted(t.h31()), unvoted(t.h22()), t.product(), 1.0,
                    p.nearestReference());
        };
    }

    /** A value of the candidate's own tuple without the model's vote: proved stays proved, the rest confidence 0. */
    private static PredictedValue unvoted(KnownValue v) {
        return v == null ? null : PredictedValue.of(v, v.value(), 0.0);
    }

    @Override
    public String modelChecksum() {
        return model.checksum();
    }

    /** The dimension of the model's reference set. */
    public int dimension() {
        return model.dimension();
    }
}
