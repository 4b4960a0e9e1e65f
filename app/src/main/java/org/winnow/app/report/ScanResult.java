package org.winnow.app.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanCheck;
import org.winnow.sink.ScanFiles;
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

    static ScanResult read(Path dir) throws BadScanDir {
        Path manifestFile = dir.resolve(ScanFiles.MANIFEST);
        if (!Files.isRegularFile(manifestFile)) {
            throw new BadScanDir(manifestFile + ": no manifest; is " + dir + " the --out of a scan?");
        }
        Manifest m;
        try {
            m = Manifest.read(manifestFile);
        } catch (IOException e) {
            throw new BadScanDir(e.getMessage());
        }
        try {
            // The report reads the parts the manifest lists; each must be the one the scan committed.
            ScanCheck.listed(dir, m);
        } catch (IOException e) {
            throw new BadScanDir(e.getMessage());
        }
        List<SurvivorLine> survivors = new ArrayList<>();
        for (String name : m.survivorFiles()) {
            Path f = dir.resolve(name);
            List<String> lines;
            try {
                lines = Files.readAllLines(f);
            } catch (IOException e) {
                throw new BadScanDir(f + ": cannot read (" + e.getMessage() + ")");
            }
            for (int i = 0; i < lines.size(); i++) {
                String line = lines.get(i);
                if (line.isEmpty() || line.startsWith("#") || line.equals(SurvivorLine.COLUMNS)) {
                    continue;
                }
                try {
                    survivors.add(SurvivorLine.parse(line));
                } catch (IllegalArgumentException e) {
                    throw new BadScanDir(f + ":" + (i + 1) + ": " + e.getMessage());
                }
            }
        }
        return new ScanResult(m, List.copyOf(survivors));
    }
}
