package org.winnow.scorer.stage;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Objects;
import java.util.function.LongSupplier;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.RefinedTupleEstimator;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Proof;
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
    private final Duration proofBudget;
    private final LongSupplier nanoClock;

    public ModelScoring(FrozenModel model) {
        this(model, null, null, System::nanoTime);
    }

    private ModelScoring(FrozenModel model, String file, Duration proofBudget, LongSupplier nanoClock) {
        this.model = Objects.requireNonNull(model, "model");
        this.file = file;
        this.proofBudget = proofBudget;
        this.nanoClock = Objects.requireNonNull(nanoClock, "nanoClock");
    }

    /**
     * The same scoring with the opt-in proof step: the exact backend on each candidate whose verdict rests
     * on an unproved value, for up to {@code budget} (null: off), its time read from {@code nanoClock}.
     */
    public ModelScoring withProofBudget(Duration budget, LongSupplier nanoClock) {
        if (budget != null) {
            Checks.requireArgument(!budget.isNegative() && !budget.isZero(), "the proof budget must be positive: %s", budget);
        }
        return new ModelScoring(model, file, budget, nanoClock);
    }

    @Override
    public Duration proofBudget() {
        return proofBudget;
    }

    /** Loads and verifies a {@code .wnm} file; the exception message is one line naming the file. */
    public static ModelScoring load(Path file) throws IOException {
        return new ModelScoring(FrozenModel.load(file), file.toAbsolutePath().normalize().toString(), null,
                System::nanoTime);
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
        // A scan pays for the Hodge engine only where a verdict hinges on a value the first page leaves open.
        predictor.deferEngine(true);
        int modelDim = model.dimension();
        return new PredictionFunction() {
            private RefinedTupleEstimator prover;

            @Override
            public Prediction predict(Configuration config, ExactInvariants exact) {
                return outsideDimension(predictor.predict(config, exact.chi()), exact);
            }

            @Override
            public boolean lastDeferred() {
                return predictor.lastDeferred();
            }

            @Override
            public Prediction complete(Configuration config, ExactInvariants exact) {
                return outsideDimension(predictor.complete(config, exact.chi()), exact);
            }

            private Prediction outsideDimension(Prediction p, ExactInvariants exact) {
                if (exact.dim() == modelDim) {
                    return p;
                }
                // The model's vote says nothing about another dimension; the candidate's own proofs still hold.
                // Nor is a reference of the model's dimension "near" it: naming one misled readers, so none is named.
                TupleEstimate t = predictor.tuple();
                if (t == null) {
                    return new Prediction(p.h11(), 0, null, null, null, 1.0, "");
                }
                return new Prediction(unvoted(t.h11()), unvoted(t.h21()), unvoted(t.h31()), unvoted(t.h22()), t.product(),
                        1.0, "");
            }

            @Override
            public Prediction prove(Configuration config, ExactInvariants exact, Prediction predicted, Duration budget) {
                int d = config.dimension();
                if (d != 3 && d != 4) {
                    return predicted.withProof(Proof.UNSETTLED);
                }
                if (prover == null) {
                    prover = new RefinedTupleEstimator(nanoClock);
                }
                TupleEstimate t = prover.prove(config, budget);
                return new Prediction(merge(predicted.h11Value(), t.h11()), merge(predicted.h21Value(), t.h21()),
                        merge(predicted.h31Value(), t.h31()), merge(predicted.h22Value(), t.h22()), predicted.product(),
                        predicted.novelty(), predicted.nearestReference(),
                        prover.lastProofTimedOut() ? Proof.OUT_OF_TIME : Proof.UNSETTLED);
            }
        };
    }

    /** A proof replaces the vote; a proved interval clamps it (keeping its confidence within the interval's); otherwise the vote stands. */
    private static PredictedValue merge(PredictedValue voted, KnownValue proved) {
        if (voted == null || proved == null || voted.isProved()) {
            return voted;
        }
        return switch (proved.basis()) {
            case PROVED -> PredictedValue.proved(proved.value());
            case BOUNDED -> PredictedValue.of(proved, voted.value(),
                    Math.min(voted.confidence(), 1.0 / (proved.hi() - proved.lo() + 1)));
            case ESTIMATED -> voted;
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
