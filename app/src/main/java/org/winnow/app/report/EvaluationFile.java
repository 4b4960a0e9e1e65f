package org.winnow.app.report;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import org.winnow.scorer.model.Evaluation;

/**
 * The machine-readable result of {@code winnow evaluate --out DIR}: {@value #FILE} in that directory,
 * beside the two pictures. Values that are not defined (a recall without members, an AUROC without a
 * held-out class) are JSON {@code null}, never a made-up number.
 *
 * @param formatVersion      {@value #FORMAT_VERSION}
 * @param kind               {@value #KIND}, so that a report can tell this file from others
 * @param model              the model file evaluated
 * @param modelChecksum      its checksum
 * @param modelReference     examples in the model's own reference set
 * @param testFile           the labelled file evaluated on
 * @param testRows           its exact rows outside the model's reference (scored)
 * @param inModelReference   its exact rows that are in the model's reference (skipped)
 * @param boundedSkipped     its bounded rows (skipped)
 * @param examples           known-class examples scored
 * @param accuracy           their h11 accuracy
 * @param classes            the h11 classes, ascending; rows and columns of {@code confusion}
 * @param support            true members per class
 * @param recall             per class
 * @param precision          per class
 * @param confusion          {@code confusion[true][predicted]}
 * @param reliability        confidence bins
 * @param holdoutClass       the class held out of training, or null
 * @param holdoutExamples    examples of it scored
 * @param noveltyAuroc       how well novelty flags the held-out class, or null
 * @param summary            the {@code name: value} summary lines the command prints
 * @param embeddingPlot      the embedding picture, relative to this file's directory when inside it
 * @param confusionPlot      the confusion picture, likewise
 * @param scoringSeconds     wall time of the scoring
 */
public record EvaluationFile(int formatVersion, String kind, String model, String modelChecksum, int modelReference,
        String testFile, int testRows, int inModelReference, int boundedSkipped, int examples, Double accuracy,
        int[] classes, int[] support, Double[] recall, Double[] precision, int[][] confusion, List<Bin> reliability,
        Integer holdoutClass, int holdoutExamples, Double noveltyAuroc, List<String> summary, String embeddingPlot,
        String confusionPlot, double scoringSeconds) {
    /** The file name inside the output directory. */
    public static final String FILE = "evaluation.json";
    static final int FORMAT_VERSION = 1;
    static final String KIND = "winnow-evaluation";

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    /**
     * One confidence bin, {@code [low, high)} (the last closed at 1).
     *
     * @param meanConfidence null when the bin is empty
     * @param accuracy       null when the bin is empty
     */
    public record Bin(double low, double high, int count, Double meanConfidence, Double accuracy) {}

    /** What the command knows besides the {@link Evaluation} itself. */
    public record Context(Path model, String modelChecksum, int modelReference, Path testFile, int inModelReference,
            int boundedSkipped, List<String> summary, Path embeddingPlot, Path confusionPlot, double scoringSeconds) {}

    /** The file's contents for an evaluation written into {@code dir}. */
    public static EvaluationFile of(Evaluation e, Context c, Path dir) {
        List<Bin> bins = new ArrayList<>();
        for (Evaluation.Bin b : e.reliability()) {
            bins.add(new Bin(b.low(), b.high(), b.count(), orNull(b.meanConfidence()), orNull(b.accuracy())));
        }
        return new EvaluationFile(FORMAT_VERSION, KIND, c.model().toString(), c.modelChecksum(), c.modelReference(),
                c.testFile().toString(), e.examples() + e.holdoutExamples(), c.inModelReference(), c.boundedSkipped(),
                e.examples(), orNull(e.accuracy()), e.classes().clone(), e.support().clone(), boxed(e.recall()),
                boxed(e.precision()), deepCopy(e.confusion()), List.copyOf(bins), e.holdoutClass(), e.holdoutExamples(),
                orNull(e.noveltyAuroc()), List.copyOf(c.summary()), relative(dir, c.embeddingPlot()),
                relative(dir, c.confusionPlot()), c.scoringSeconds());
    }

    /** Writes {@value #FILE} into {@code dir} (created if needed) through a temporary file, and returns its path. */
    public Path write(Path dir) throws IOException {
        Files.createDirectories(dir);
        Path target = dir.resolve(FILE);
        Path tmp = dir.resolve(FILE + ".tmp");
        JSON.writeValue(tmp.toFile(), this);
        Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        return target;
    }

    /** Reads and checks a file written by {@link #write}; the message of the exception names the file and the reason. */
    static EvaluationFile read(Path file) throws IOException {
        EvaluationFile f;
        try {
            f = JSON.readValue(file.toFile(), EvaluationFile.class);
        } catch (IOException e) {
            throw new IOException(file + ": not a readable evaluation file (" + e.getMessage().lines().findFirst()
                    .orElse("") + ")", e);
        }
        if (!KIND.equals(f.kind()) || f.formatVersion() != FORMAT_VERSION) {
            throw new IOException(file + ": kind " + f.kind() + " version " + f.formatVersion() + ", expected " + KIND
                    + " version " + FORMAT_VERSION);
        }
        int n = f.classes() == null ? -1 : f.classes().length;
        boolean square = n >= 0 && f.confusion() != null && f.confusion().length == n;
        for (int r = 0; square && r < n; r++) {
            square = f.confusion()[r] != null && f.confusion()[r].length == n;
        }
        if (!square || f.support() == null || f.support().length != n || f.recall() == null || f.recall().length != n
                || f.precision() == null || f.precision().length != n || f.reliability() == null || f.summary() == null) {
            throw new IOException(file + ": the per-class arrays and the confusion matrix do not match its " + n
                    + " classes, or a section is missing");
        }
        return f;
    }

    private static Double orNull(double v) {
        return Double.isNaN(v) ? null : v;
    }

    private static Double[] boxed(double[] v) {
        Double[] out = new Double[v.length];
        for (int i = 0; i < v.length; i++) {
            out[i] = orNull(v[i]);
        }
        return out;
    }

    private static int[][] deepCopy(int[][] m) {
        int[][] out = new int[m.length][];
        for (int i = 0; i < m.length; i++) {
            out[i] = m[i].clone();
        }
        return out;
    }

    private static String relative(Path dir, Path file) {
        Path d = dir.toAbsolutePath().normalize();
        Path f = file.toAbsolutePath().normalize();
        return f.startsWith(d) ? d.relativize(f).toString() : f.toString();
    }
}
