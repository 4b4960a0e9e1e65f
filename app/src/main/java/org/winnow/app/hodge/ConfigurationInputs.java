package org.winnow.app.hodge;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import me.tongfei.progressbar.ProgressBar;
import org.winnow.app.cli.StandardInput;
import org.winnow.geometry.ConfigurationText;
import org.winnow.pipeline.text.BoundedLineReader;
import org.winnow.pipeline.text.LineTooLongException;
import org.winnow.sink.ScanFiles;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * The configurations a per-configuration command reads: CONFIG arguments, then every {@code --file F}
 * line by line ({@code -} is standard input, {@code #} starts a comment, a tab ends the configuration).
 * A picocli mixin, so {@code invariants} and {@code hodge} read their input the same way.
 */
final class ConfigurationInputs {
    @Option(names = "--file", paramLabel = "F",
            description = "Read configurations from F, one a line ('-' = standard input; '#' starts a comment; "
                    + "anything after a tab is ignored). May be repeated.")
    List<String> files = new ArrayList<>();

    @Parameters(paramLabel = "CONFIG", arity = "0..*",
            description = "Configurations such as 4:5 or 3:3,0,1/3:0,3,1 (rows n:d1,...,dK joined by '/').")
    List<String> configs = new ArrayList<>();

    /** One configuration's text, its line number (1 for an argument) and where it came from. */
    interface Visitor {
        void visit(String text, int lineNumber, String source);
    }

    /** A file that cannot be read: its name and the reason. */
    interface Unreadable {
        void report(String source, String reason);
    }

    boolean isEmpty() {
        return configs.isEmpty() && files.isEmpty();
    }

    /**
     * Visits the arguments, then each file's lines; {@code progress} may give a bar per file name (or
     * null), stepped once a line.
     */
    void forEach(Visitor visitor, Unreadable unreadable, Function<String, ProgressBar> progress) {
        for (int i = 0; i < configs.size(); i++) {
            visitor.visit(configs.get(i), 1, "argument " + (i + 1));
        }
        for (String file : files) {
            String name = "-".equals(file) ? "standard input" : file;
            if ("-".equals(file)) {
                String problem = StandardInput.problem();
                if (problem != null) {
                    unreadable.report(name, problem);
                    continue;
                }
            } else if (Files.isDirectory(Path.of(file))) {
                unreadable.report(name, "is a directory; give a file of configurations, one a line");
                continue;
            }
            // Bytes that are not UTF-8 become U+FFFD, so such a line is refused with its number like any
            // other bad line (as scan --input does), instead of the whole file failing to decode.
            try (BoundedLineReader reader = new BoundedLineReader("-".equals(file) ? System.in
                    : Files.newInputStream(Path.of(file)), name);
                    ProgressBar bar = progress.apply(name)) {
                String line;
                int number = 0;
                long visited = 0;
                while ((line = reader.readLine()) != null) {
                    number++;
                    String body = ConfigurationText.stripComment(line);
                    if (body != null) {
                        visited++;
                        visitor.visit(body, number, name + " line " + number);
                    }
                    if (bar != null) {
                        bar.step();
                    }
                }
                if (visited == 0) {
                    // Nothing printed and exit 0 would look like a run over a file that had nothing to report.
                    unreadable.report(name, "no configuration in it (empty, or only blank, comment and header lines)");
                }
            } catch (LineTooLongException e) {
                unreadable.report(name + " line " + e.line(), e.reason());
            } catch (NoSuchFileException e) {
                unreadable.report(name, "no such file");
            } catch (IOException e) {
                unreadable.report(name, "cannot read: " + ScanFiles.describe(e));
            }
        }
    }
}
