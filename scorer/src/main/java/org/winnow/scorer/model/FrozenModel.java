package org.winnow.scorer.model;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Arrays;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.scorer.index.AnchoredIndex;
import org.winnow.scorer.index.FlatIndex;
import org.winnow.scorer.index.NeighbourIndex;
import org.winnow.scorer.network.Anchor;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.network.FeatureEncoder;
import org.winnow.scorer.network.InferenceNetwork;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.network.Workspace;
import org.winnow.scorer.reference.ReferenceSet;

/**
 * A trained, immutable similarity model: architecture, weights, input normalisation, the reference
 * set with its embeddings, the calibration and the training metadata. Thread-safe; each worker thread
 * takes its own {@link Predictor} from {@link #newPredictor()}.
 */
public final class FrozenModel {
    /** Relative difference allowed between a stored reference embedding and the forward pass's. */
    private static final double EMBEDDING_TOLERANCE = 1e-9;
    /** Largest neighbour count accepted beyond the reference size (a search buffer is this long). */
    private static final int MAX_K = 1024;
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
    private final int[] residuals31;
    private final int[] residual31Of;
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
        checkStructure(architecture, parameters, normalisation, reference, calibration);
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
        // What each reference point votes for: its exact h11 minus its anchor h11 (anchored), or its h11
        // itself; on an anchored four-fold model with full labels also its exact h31 minus its tuple's h31.
        this.dimension = Configuration.parse(reference.configs()[0]).dimension();
        Anchor anchor = new Anchor();
        double[] scratch = new double[Architecture.GLOBAL_FEATURES];
        boolean four = architecture.anchored() && dimension == 4 && fullLabels(reference);
        int[] residual = new int[reference.size()];
        int[] residual31 = new int[four ? reference.size() : 0];
        for (int i = 0; i < reference.size(); i++) {
            if (!architecture.anchored()) {
                residual[i] = reference.h11(i);
                continue;
            }
            anchor.compute(Configuration.parse(reference.configs()[i]), reference.chi()[i], scratch, 0);
            residual[i] = reference.h11(i) - anchor.h11();
            if (four) {
                residual31[i] = Math.toIntExact(reference.hodge()[i][2] - anchor.tuple().h31().value());
            }
        }
        this.residuals = Arrays.stream(residual).distinct().sorted().toArray();
        this.residualOf = new int[reference.size()];
        for (int i = 0; i < reference.size(); i++) {
            residualOf[i] = Arrays.binarySearch(residuals, residual[i]);
        }
        this.residuals31 = Arrays.stream(residual31).distinct().sorted().toArray();
        this.residual31Of = new int[residual31.length];
        for (int i = 0; i < residual31.length; i++) {
            residual31Of[i] = Arrays.binarySearch(residuals31, residual31[i]);
        }
        this.checksum = ModelFile.hex(ModelFile.sha256(ModelFile.payloadBytes(payload())));
    }

    /**
     * What a model file's checksum cannot vouch for: a payload written by something else, or edited and
     * re-checksummed, may hold arrays of the right type but the wrong length, or numbers that are not
     * finite, and would load and then fail (or silently mislead) in the middle of a scan. Every array the
     * scorer indexes and every number it computes with is checked here, once, with a message naming the
     * field.
     */
    private static void checkStructure(Architecture architecture, double[] parameters, Normalisation normalisation,
            ReferenceSet reference, Calibration calibration) {
        requireFinite(parameters, "parameters");
        requireFinite(normalisation.rowMean(), "normalisation.rowMean");
        requireFinite(normalisation.colMean(), "normalisation.colMean");
        requireFinite(normalisation.globalMean(), "normalisation.globalMean");
        requirePositive(normalisation.rowScale(), "normalisation.rowScale");
        requirePositive(normalisation.colScale(), "normalisation.colScale");
        requirePositive(normalisation.globalScale(), "normalisation.globalScale");
        requireFinite(reference.embeddings(), "reference.embeddings");
        int dimension = -1;
        for (int i = 0; i < reference.size(); i++) {
            String text = reference.configs()[i];
            Checks.requireArgument(text != null, "reference configuration %s is missing", i + 1);
            int d;
            try {
                d = Configuration.parse(text).dimension();
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("reference configuration " + (i + 1) + " does not parse: "
                        + e.getMessage(), e);
            }
            Checks.requireArgument(dimension < 0 || d == dimension,
                    "reference configuration %s has dimension %s, the first %s", i + 1, d, dimension);
            dimension = d;
            int[] h = reference.hodge()[i];
            Checks.requireArgument(h != null && h.length >= 1, "reference label %s is missing", i + 1);
            for (int v : h) {
                Checks.requireArgument(v >= 0, "reference label %s holds a negative Hodge number %s", i + 1, v);
            }
            if (architecture.anchored()) {
                double anchor = reference.embeddings()[i * reference.dim() + reference.dim() - 1];
                Checks.requireArgument(anchor == Math.rint(anchor),
                        "reference embedding %s has a non-integer anchor coordinate %s", i + 1, anchor);
            }
        }
        Checks.requireArgument(Double.isFinite(calibration.bandwidth()) && Double.isFinite(calibration.tailScale()),
                "calibration bandwidth %s and tail scale %s must be finite", calibration.bandwidth(),
                calibration.tailScale());
        double bw = calibration.bandwidth();
        // The vote divides by bandwidth squared; one so small that its square is 0 or its inverse infinite
        // turns every weight into NaN.
        Checks.requireArgument(bw == 0 || (bw * bw > 0 && Double.isFinite(0.5 / (bw * bw))),
                "calibration bandwidth %s is too small to vote with", bw);
        int kLimit = Math.max(reference.size(), MAX_K);
        Checks.requireArgument(calibration.k() <= kLimit && calibration.noveltyK() <= kLimit,
                "calibration k %s and novelty neighbour %s must be at most %s", calibration.k(), calibration.noveltyK(),
                kLimit);
        double[] loo = calibration.looDistances();
        Checks.requireArgument(loo != null, "calibration.looDistances is missing");
        requireFinite(loo, "calibration.looDistances");
        for (int i = 0; i < loo.length; i++) {
            Checks.requireArgument(loo[i] >= 0 && (i == 0 || loo[i - 1] <= loo[i]),
                    "calibration.looDistances must be non-negative and ascending, index %s is %s", i, loo[i]);
        }
        int[] classes = calibration.classes();
        for (int c = 0; c < classes.length; c++) {
            Checks.requireArgument(c == 0 || classes[c - 1] < classes[c],
                    "calibration.classes must be strictly ascending, index %s is %s", c, classes[c]);
            double[] q = calibration.classQuantiles()[c];
            Checks.requireArgument(q != null && q.length == Calibration.QUANTILES.length,
                    "calibration.classQuantiles row %s needs %s values", c, Calibration.QUANTILES.length);
            // NaN marks a class too small to have the quantile (one member has no leave-one-out distance).
            double last = 0;
            for (int j = 0; j < q.length; j++) {
                if (Double.isNaN(q[j])) {
                    continue;
                }
                Checks.requireArgument(Double.isFinite(q[j]) && q[j] >= last,
                        "calibration.classQuantiles row %s must be finite, non-negative and ascending: %s", c, q[j]);
                last = q[j];
            }
        }
    }

    /**
     * The stored reference embeddings must be what the weights give for the reference configurations
     * (the forward pass reproduces the training pass's embeddings, see {@link InferenceNetwork}). A
     * payload whose weights or embeddings were changed apart, or whose weights overflow on the
     * reference, is refused here instead of producing votes that mean nothing.
     */
    private static void checkReferenceEmbeddings(Architecture architecture, Normalisation normalisation,
            ReferenceSet reference, InferenceNetwork network) {
        Workspace ws = new Workspace(architecture);
        int dim = reference.dim();
        for (int i = 0; i < reference.size(); i++) {
            FeatureEncoder.encode(Configuration.parse(reference.configs()[i]), reference.chi()[i], normalisation, ws);
            network.forward(ws);
            for (int j = 0; j < dim; j++) {
                double stored = reference.embeddings()[i * dim + j];
                double computed = ws.e[j];
                Checks.requireArgument(Math.abs(stored - computed) <= EMBEDDING_TOLERANCE * (1 + Math.abs(stored)),
                        "reference embedding %s, coordinate %s, is %s but the weights give %s", i + 1, j + 1, stored,
                        computed);
            }
        }
    }

    private static void requireFinite(double[] a, String field) {
        Checks.requireArgument(a != null, "%s is missing", field);
        for (int i = 0; i < a.length; i++) {
            Checks.requireArgument(Double.isFinite(a[i]), "%s[%s] is not a finite number: %s", field, i, a[i]);
        }
    }

    private static void requirePositive(double[] a, String field) {
        requireFinite(a, field);
        for (int i = 0; i < a.length; i++) {
            Checks.requireArgument(a[i] > 0, "%s[%s] must be positive: %s", field, i, a[i]);
        }
    }

    /** Reads and verifies a {@code .wnm} file; every refusal is a one-line {@link ModelFileException}. */
    public static FrozenModel load(Path path) throws IOException {
        ModelFile.Payload p = ModelFile.read(path);
        try {
            FrozenModel m = new FrozenModel(p.architecture(), p.parameters(), p.normalisation(), p.reference(),
                    p.calibration(), p.metadata());
            // Only for files: models assembled in code (tests, hand-made references) need not come from training.
            checkReferenceEmbeddings(m.architecture, m.normalisation, m.reference, m.network);
            return m;
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

    /**
     * The neighbour index over the reference embeddings that every predictor searches (read-only and
     * thread-safe; public so that benchmarks can time the search alone).
     */
    public NeighbourIndex index() {
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

    /**
     * The anchor h11 reference point {@code i} was corrected from (its exact h11 minus its correction);
     * 0 for an unanchored model, which votes on h11 itself.
     */
    public int referenceAnchor(int i) {
        return reference.h11(i) - residuals[residualOf[i]];
    }

    /** True iff every reference label holds the four-fold tuple (h11, h21, h31, h22). */
    private static boolean fullLabels(ReferenceSet reference) {
        for (int[] h : reference.hodge()) {
            if (h.length < 4) {
                return false;
            }
        }
        return true;
    }

    /** Index into {@link #residual31} of the h31 correction of reference point {@code referenceIndex}. */
    int residual31Of(int referenceIndex) {
        return residual31Of[referenceIndex];
    }

    /** The distinct h31 corrections ({@code h31} minus the tuple's h31) of a four-fold reference, ascending. */
    int residual31(int index) {
        return residuals31[index];
    }

    /** How many distinct h31 corrections there are; 0 unless the model is an anchored four-fold one with full labels. */
    int residual31Count() {
        return residuals31.length;
    }

    private ModelFile.Payload payload() {
        return new ModelFile.Payload(architecture, parameters, normalisation, reference, calibration, metadata);
    }
}
