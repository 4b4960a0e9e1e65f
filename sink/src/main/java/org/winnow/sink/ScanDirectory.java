package org.winnow.sink;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * The one reader of a scan directory: the manifest, then the survivor files it lists, in its order.
 * Files the manifest does not name (a part still being written, a stray file) are never read, so what
 * the reader returns is exactly what the sink committed, and each listed part is checked against the length
 * and SHA-256 the manifest recorded for it before it is read.
 */
public final class ScanDirectory {
    /**
     * What a scan directory holds.
     *
     * @param manifest  the manifest
     * @param survivors every survivor line of the committed survivor files, in file and line order
     */
    public record Contents(Manifest manifest, List<SurvivorLine> survivors) {
        public Contents {
            survivors = List.copyOf(survivors);
        }
    }

    /** A directory that is not a readable scan output; the message names the file and the reason. */
    public static final class UnreadableException extends Exception {
        private static final long serialVersionUID = 1L;

        UnreadableException(String message) {
            super(message);
        }
    }

    private ScanDirectory() {}

    /** Reads the manifest of {@code dir} and the survivor files it lists. */
    public static Contents read(Path dir) throws UnreadableException {
        Path manifestFile = dir.resolve(ScanFiles.MANIFEST);
        if (!Files.isRegularFile(manifestFile)) {
            throw new UnreadableException(manifestFile + ": no manifest; is " + dir + " the --out of a scan?");
        }
        Manifest m;
        try {
            m = Manifest.read(manifestFile);
        } catch (IOException e) {
            throw new UnreadableException(e.getMessage());
        }
        try {
            // Only the parts the scan committed are read: each must still have its recorded length and digest.
            ScanCheck.listed(dir, m);
        } catch (IOException e) {
            throw new UnreadableException(e.getMessage());
        }
        List<SurvivorLine> survivors = new ArrayList<>();
        for (String name : m.survivorFiles()) {
            Path f = dir.resolve(name);
            List<String> lines;
            try {
                lines = Files.readAllLines(f, StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new UnreadableException(f + ": cannot read (" + e.getMessage() + ")");
            }
            for (int i = 0; i < lines.size(); i++) {
                String line = lines.get(i);
                if (line.isEmpty() || line.startsWith("#") || line.equals(SurvivorLine.COLUMNS)) {
                    continue;
                }
                try {
                    survivors.add(SurvivorLine.parse(line));
                } catch (IllegalArgumentException e) {
                    throw new UnreadableException(f + ":" + (i + 1) + ": " + e.getMessage());
                }
            }
        }
        return new Contents(m, survivors);
    }
}
