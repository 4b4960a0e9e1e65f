package org.winnow.app.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/**
 * Checks that an output path does not name the command's own input. {@code sample --out R.tsv --reference
 * R.tsv} replaced the labelled reference by its sample, {@code train} replaced it by a model, {@code
 * export-weights} its model by JSON and {@code report DIR --out DIR/manifest.json} the scan's manifest by a
 * page, each with exit 0: labels that took hours were gone.
 */
public final class OutputPaths {
    private OutputPaths() {}

    /** Null when {@code out} is not the file {@code in}, else the one-line refusal naming both options. */
    public static String sameFileProblem(Path out, String outOption, Path in, String inOption) {
        if (!same(out, in)) {
            return null;
        }
        return outOption + " " + out + " is the " + inOption + " file; writing it would destroy what is read; give "
                + "another name";
    }

    /**
     * Null when {@code out} is not an existing file directly inside {@code dir} other than an HTML page, else
     * the refusal: every other file there (manifest, checkpoint, parts, lock, evaluation, pictures) belongs to
     * the run the report reads.
     */
    public static String insideRunProblem(Path out, Path dir) {
        Path parent = out.toAbsolutePath().normalize().getParent();
        String name = out.getFileName() == null ? "" : out.getFileName().toString().toLowerCase(Locale.ROOT);
        if (parent == null || !Files.exists(out) || name.endsWith(".html") || !same(parent, dir)) {
            return null;
        }
        return "--out " + out + " is a file of the run in " + dir + "; writing it would damage that run; give another "
                + "name";
    }

    private static boolean same(Path a, Path b) {
        try {
            if (Files.exists(a) && Files.exists(b)) {
                return Files.isSameFile(a, b);
            }
        } catch (IOException e) {
            // fall through to comparing the names
        }
        return a.toAbsolutePath().normalize().equals(b.toAbsolutePath().normalize());
    }
}
