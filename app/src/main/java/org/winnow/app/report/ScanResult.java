package org.winnow.app.report;

import java.nio.file.Path;
import java.util.List;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanDirectory;
import org.winnow.sink.SurvivorLine;

/**
 * A scan output directory as the report needs it: the manifest and every committed survivor line.
 *
 * @param manifest  the scan's manifest
 * @param survivors every line of the committed survivor files, in file order
 */
record ScanResult(Manifest manifest, List<SurvivorLine> survivors) {
    /** A directory that is not a readable scan output; the message names the file and the reason. */
    static final class BadScanDir extends Exception {
        BadScanDir(String message) {
            super(message);
        }
    }

    /** Reads {@code dir} with the sink's reader; see {@link ScanDirectory}. */
    static ScanResult read(Path dir) throws BadScanDir {
        try {
            ScanDirectory.Contents c = ScanDirectory.read(dir);
            return new ScanResult(c.manifest(), c.survivors());
        } catch (ScanDirectory.UnreadableException e) {
            throw new BadScanDir(e.getMessage());
        }
    }
}
