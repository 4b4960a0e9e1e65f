package org.winnow.app.report;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import org.winnow.app.cli.Limits;
import org.winnow.scorer.model.Evaluation;

/**
 * The machine-readable result of {@code winnow evaluate --out DIR}: {@value #FILE} in that directory,
 * beside the two pictures. Values that are not defined (a recall without members, an AUROC without a
 * held-out class) are JSON {@code null}, never a made-up number.
 *
 * <p>Since format 2 the file carries {@value #CHECKSUM}, the SHA-256 of its own compact JSON without that
 * field, so that a flipped digit that still parses is refused rather than shown in a report; and a reader
 * checks that the numbers agree with each other (the confusion rows add up to the support, shares lie in
 * [0, 1]), so a file edited and re-checksummed by hand cannot make the report draw nonsense either.
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
    static final int FORMAT_VERSION = 2;
    static final String KIND = "winnow-evaluation";
    static final String CHECKSUM = "checksum";

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
    private static final ObjectMapper COMPACT = new ObjectMapper();

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
        ObjectNode tree = JSON.valueToTree(this);
        tree.put(CHECKSUM, checksum(tree));
        Files.write(tmp, JSON.writeValueAsBytes(tree));
        Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        return target;
    }

    /** Reads and checks a file written by {@link #write}; the message of the exception names the file and the reason. */
    static EvaluationFile read(Path file) throws IOException {
        if (!Files.isRegularFile(file)) {
            throw new IOException(file + ": " + (Files.exists(file) ? "not a regular file" : "no such file")
                    + ", expected the " + FILE + " of winnow evaluate --out");
        }
        return parse(Files.readAllBytes(file), file);
    }

    /** {@link #read} on bytes already read; {@code file} names them in messages. */
    static EvaluationFile parse(byte[] bytes, Path file) throws IOException {
        EvaluationFile f;
        try {
            JsonNode tree = JSON.readTree(bytes);
            if (tree == null || !tree.isObject()) {
                throw new IOException(file + ": not a readable evaluation file (not a JSON object)");
            }
            ObjectNode object = (ObjectNode) tree;
            JsonNode kind = object.get("kind");
            JsonNode version = object.get("formatVersion");
            if (kind == null || !KIND.equals(kind.asText()) || version == null || !version.isInt()) {
                throw new IOException(file + ": not a winnow evaluation file (kind " + Limits.excerpt(String.valueOf(kind))
                        + ", expected \"" + KIND + "\")");
            }
            if (version.intValue() != FORMAT_VERSION) {
                throw new IOException(file + ": evaluation file format " + version.intValue() + ", this version reads "
                        + FORMAT_VERSION + "; run winnow evaluate --out again");
            }
            JsonNode recorded = object.remove(CHECKSUM);
            if (recorded == null || !recorded.isTextual()) {
                throw new IOException(file + ": not a readable evaluation file (no " + CHECKSUM + " field)");
            }
            if (!recorded.asText().equals(checksum(object))) {
                throw new IOException(file + ": its content differs from its own " + CHECKSUM
                        + " (edited or damaged after it was written)");
            }
            f = JSON.treeToValue(object, EvaluationFile.class);
        } catch (JsonProcessingException e) {
            String where = e.getLocation() == null ? "" : "line " + e.getLocation().getLineNr() + ": ";
            throw new IOException(file + ": " + where + "not a readable evaluation file ("
                    + Limits.excerpt(String.valueOf(e.getOriginalMessage()).lines().findFirst().orElse("")) + ")", e);
        }
        if (f == null) {
            throw new IOException(file + ": not a readable evaluation file (it holds null)");
        }
        String problem = f.problem();
        if (problem != null) {
            throw new IOException(file + ": " + problem);
        }
        return f;
    }

    /** What is inconsistent in this file, or null. */
    private String problem() {
        if (model == null || modelChecksum == null || testFile == null || summary == null || reliability == null
                || summary.contains(null) || reliability.contains(null)) {
            return "a name, the summary or the reliability table is missing";
        }
        for (String name : new String[] {model, modelChecksum, testFile, embeddingPlot, confusionPlot}) {
            if (name != null && (name.isEmpty() || name.chars().anyMatch(c -> c < 0x20))) {
                return "a file name or checksum is empty or holds a control character: '" + Limits.excerpt(name) + "'";
            }
        }
        int n = classes == null ? -1 : classes.length;
        boolean square = n >= 0 && confusion != null && confusion.length == n;
        for (int r = 0; square && r < n; r++) {
            square = confusion[r] != null && confusion[r].length == n;
        }
        if (!square || support == null || support.length != n || recall == null || recall.length != n
                || precision == null || precision.length != n) {
            return "the per-class arrays and the confusion matrix do not match its " + n + " classes";
        }
        if (modelReference < 0 || testRows < 0 || inModelReference < 0 || boundedSkipped < 0 || examples < 0
                || holdoutExamples < 0 || !(scoringSeconds >= 0) || Double.isInfinite(scoringSeconds)) {
            return "a count or the scoring time is negative";
        }
        long total = 0;
        for (int t = 0; t < n; t++) {
            long row = 0;
            for (int p = 0; p < n; p++) {
                if (confusion[t][p] < 0) {
                    return "a confusion count is negative";
                }
                row += confusion[t][p];
            }
            if (row != support[t]) {
                return "confusion row of class " + classes[t] + " adds up to " + row + ", not to its support " + support[t];
            }
            if (t > 0 && classes[t] <= classes[t - 1]) {
                return "the classes are not ascending";
            }
            if (!share(recall[t]) || !share(precision[t])) {
                return "a recall or precision of class " + classes[t] + " is outside [0, 1]";
            }
            total += row;
        }
        if (total != examples) {
            return "the confusion matrix holds " + total + " examples, not " + examples;
        }
        if ((accuracy == null) != (examples == 0) || !share(accuracy) || !share(noveltyAuroc)) {
            return "the accuracy or the novelty AUROC is missing or outside [0, 1]";
        }
        long binned = 0;
        for (Bin b : reliability) {
            if (!(b.low() >= 0 && b.low() < b.high() && b.high() <= 1) || b.count() < 0 || !share(b.meanConfidence())
                    || !share(b.accuracy())) {
                return "a reliability bin is not a band of [0, 1] with a count and shares in it";
            }
            binned += b.count();
        }
        if (binned != examples) {
            return "the reliability bins hold " + binned + " examples, not " + examples;
        }
        if (testRows != examples + holdoutExamples || (holdoutClass == null && holdoutExamples != 0)) {
            return "test rows " + testRows + " are not the " + examples + " examples and " + holdoutExamples
                    + " held-out ones";
        }
        return null;
    }

    private static boolean share(Double v) {
        return v == null || (v >= 0 && v <= 1);
    }

    private static String checksum(ObjectNode withoutChecksum) throws JsonProcessingException {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                    .digest(COMPACT.writeValueAsBytes(withoutChecksum)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
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
