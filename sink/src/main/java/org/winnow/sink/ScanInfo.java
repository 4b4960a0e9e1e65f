package org.winnow.sink;

import java.util.List;
import java.util.Objects;
import org.winnow.geometry.Checks;

/**
 * What a scan is, for the headers and the manifest.
 *
 * @param runId         stable identity of the scan's inputs; a directory holds one scan
 * @param source        one-line description of the bounds or the input file
 * @param bounds        the bounds as a JSON-serialisable value, or null for an input file
 * @param rules         the keep rules in rules-file form
 * @param modelChecksum checksum of the frozen model
 * @param modelFile     where the model was read from (absolute), or null when not from a file; a reader
 *                      may use it only when the file there still has {@code modelChecksum}
 */
public record ScanInfo(String runId, String source, Object bounds, List<String> rules, String modelChecksum,
        String modelFile) {
    /** A scan whose model file is not recorded. */
    public ScanInfo(String runId, String source, Object bounds, List<String> rules, String modelChecksum) {
        this(runId, source, bounds, rules, modelChecksum, null);
    }

    public ScanInfo {
        Objects.requireNonNull(runId, "runId");
        Checks.requireArgument(runId.matches("[0-9a-zA-Z_-]+"), "run id must be letters, digits, '-' or '_': %s", runId);
        Objects.requireNonNull(source, "source");
        rules = List.copyOf(rules);
        Objects.requireNonNull(modelChecksum, "modelChecksum");
    }
}
