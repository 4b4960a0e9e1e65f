package org.winnow.producer.source;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Optional;
import java.util.OptionalLong;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.SourceListener;
import org.winnow.pipeline.text.BoundedLineReader;
import org.winnow.pipeline.text.LineTooLongException;

/**
 * Configurations from a text file, one a line ({@code #} comments and text after a tab ignored). A
 * line that does not parse, or is not a Calabi-Yau configuration of a supported dimension, is
 * reported with its line number and skipped; undecodable bytes make a bad line, not a crash. A line
 * longer than {@link BoundedLineReader#MAX_LINE} ends the run with a {@link LineTooLongException}.
 */
public final class InputFileSource implements CandidateSource {
    private final Path file;

    public InputFileSource(Path file) {
        this.file = file;
    }

    @Override
    public void run(SourceListener out) throws IOException, InterruptedException {
        try (BoundedLineReader in = BoundedLineReader.open(file)) {
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                long lineNo = in.lineNumber();
                String body = ConfigurationText.stripComment(line);
                if (body == null) {
                    continue;
                }
                Configuration c;
                try {
                    c = ConfigurationText.parse(body, (int) Math.min(Integer.MAX_VALUE, lineNo));
                } catch (ConfigurationFormatException e) {
                    out.badInput(lineNo, e.getMessage());
                    continue;
                }
                Optional<String> problem = ConfigurationValidator.problemForCalabiYau(c);
                if (problem.isPresent()) {
                    out.badInput(lineNo, problem.get());
                    continue;
                }
                Configuration canonical = c.canonical();
                out.item(canonical, canonical.toText());
            }
        }
    }

    /** The number of non-blank, non-comment lines, counted with one cheap pass, or empty if unreadable. */
    @Override
    public OptionalLong size() {
        try {
            return OptionalLong.of(count());
        } catch (IOException e) {
            return OptionalLong.empty();
        }
    }

    /**
     * The number of non-blank, non-comment lines; a {@link LineTooLongException} says the file is no
     * text file of configurations before any work starts.
     */
    public long count() throws IOException {
        try (BoundedLineReader in = BoundedLineReader.open(file)) {
            long n = 0;
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                if (ConfigurationText.stripComment(line) != null) {
                    n++;
                }
            }
            return n;
        }
    }

    @Override
    public String description() {
        return "input " + file;
    }
}
