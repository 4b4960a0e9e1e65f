package org.winnow.scorer.model;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Arrays;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.RefinedH11Estimator;

/**
 * A trained, immutable similarity model: architecture, weights, input normalisation, the reference
 * set with its embeddings, the calibration and the training metadata. Thread-safe; each worker thread
 * takes its own {@link Predictor} from {@link #newPredictor()}.
 */
public final class FrozenModel {
    private final Architecture architecture;
    private final double[] parameters;
    private final Normalisation normalisation;
    private final ReferenceSet reference;
    private final Calibration calibration;
    private final TrainingMetadata metadata;
    private final NeighbourIndex index;
    private final InferenceNetwork network;
    private final int[] classOf;
    private final int[] residuals;
    private final int[] residualOf;
    private final int dimension;
    private final String checksum;

    /**
     * Assembles a model; the parameter count and the reference embedding width must match the
     * architecture, and the reference must not be empty.
     */
    public FrozenModel(Architecture architecture, double[] parameters, Normalisation normalisation,
            ReferenceSet reference, Calibration calibration, TrainingMetadata metadata) {
        Checks.requireArgument(parameters.length == architecture.parameterCount(),
                "the architecture needs %s parameters, got %s", architecture.parameterCount(), parameters.length);
        Checks.requireArgument(reference.dim() == architecture.dim(),
                "reference embeddings have dimension %s, the network %s", reference.dim(), architecture.dim());
        Checks.requireArgument(reference.size() >= 1, "a model needs at least one reference example");
        this.architecture = architecture;
        this.parameters = parameters.clone();
        this.normalisation = normalisation;
        this.reference = reference;
        this.calibration = calibration;
        this.metadata = metadata;
        this.network = new InferenceNetwork(architecture, this.parameters);
        // Anchored embeddings group by their integer last coordinate, which lets the search skip groups.
        this.index = architecture.anchored() ? new AnchoredIndex(reference.embeddings(), reference.dim())
                : new FlatIndex(reference.embeddings(), reference.dim());
        this.classOf = new int[reference.size()];
        for (int i = 0; i < reference.size(); i++) {
            int c = Arrays.binarySearch(calibration.classes(), reference.h11(i));
            Checks.requireArgument(c >= 0, "reference h11 %s is missing from the calibration's classes",
                    reference.h11(i));
            classOf[i] = c;
        }
        // What each reference point votes for: its exact h11 minus its first-page estimate (anchored), or
        // its h11 itself.
        RefinedH11Estimator estimator = new RefinedH11Estimator();
        int[] residual = new int[reference.size()];
        for (int i = 0; i < reference.size(); i++) {
            int estimate = architecture.anchored()
                    ? estimator.estimate(Configuration.parse(reference.configs()[i])) : 0;
            residual[i] = reference.h11(i) - estimate;
        }
        this.residuals = Arrays.stream(residual).distinct().sorted().toArray();
        this.residualOf = new int[reference.size()];
        for (int i = 0; i < reference.size(); i++) {
            residualOf[i] = Arrays.binarySearch(residuals, residual[i]);
        }
        this.dimension = Configuration.parse(reference.configs()[0]).dimension();
        this.checksum = ModelFile.hex(ModelFile.sha256(ModelFile.payloadBytes(payload())));
    }

    /** Reads and verifies a {@code .wnm} file; every refusal is a one-line {@link ModelFileException}. */
    public static FrozenModel load(Path path) throws IOException {
        ModelFile.Payload p = ModelFile.read(path);
        try {
            return new FrozenModel(p.architecture(), p.parameters(), p.normalisation(), p.reference(),
                    p.calibration(), p.metadata());
        } catch (RuntimeException e) {
            throw new ModelFileException(path + ": inconsistent model (" + e.getMessage() + ")");
        }
    }

    /** Writes this model atomically as a {@code .wnm} file. */
    public void save(Path path) throws IOException {
        ModelFile.write(path, ModelFile.payloadBytes(payload()));
    }

    /** Hex SHA-256 of the payload, the same as in the file header; identifies the model in manifests. */
    public String checksum() {
        return checksum;
    }

    /** A fresh predictor with its own buffers; use one per thread. */
    public Predictor newPredictor() {
        return new Predictor(this);
    }

    /** The embedding of one configuration (allocates; for reports and tests, not the hot loop). */
    public double[] embed(Configuration config, long chi) {
        Workspace ws = new Workspace(architecture);
        FeatureEncoder.encode(config, chi, normalisation, ws);
        network.forward(ws);
        return ws.e.clone();
    }

    /** A copy of this model carrying different metadata (for example with the evaluation filled in). */
    public FrozenModel withMetadata(TrainingMetadata newMetadata) {
        return new FrozenModel(architecture, parameters, normalisation, reference, calibration, newMetadata);
    }

    public Architecture architecture() {
        return architecture;
    }

    public double[] parameters() {
        return parameters.clone();
    }

    public Normalisation normalisation() {
        return normalisation;
    }

    public ReferenceSet reference() {
        return reference;
    }

    public Calibration calibration() {
        return calibration;
    }

    public TrainingMetadata metadata() {
        return metadata;
    }

    /** Complex dimension of the reference configurations (3 for three-folds). */
    public int dimension() {
        return dimension;
    }

    /** The forward pass for scoring, its weights prepared at load. */
    InferenceNetwork network() {
        return network;
    }

    NeighbourIndex index() {
        return index;
    }

    int classOf(int referenceIndex) {
        return classOf[referenceIndex];
    }

    /** Index into {@link #residual} of what reference point {@code referenceIndex} votes for. */
    int residualOf(int referenceIndex) {
        return residualOf[referenceIndex];
    }

    /** The distinct corrections {@code h11 - estimate} of the reference, ascending. */
    int residual(int index) {
        return residuals[index];
    }

    int residualCount() {
        return residuals.length;
    }

    private ModelFile.Payload payload() {
        return new ModelFile.Payload(architecture, parameters, normalisation, reference, calibration, metadata);
    }
}
