package org.winnow.producer.source;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import java.util.OptionalLong;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.SourceListener;

/**
 * Configurations from a text file, one a line ({@code #} comments and text after a tab ignored). A
 * line that does not parse, or is not a Calabi-Yau configuration of a supported dimension, is
 * reported with its line number and skipped; undecodable bytes make a bad line, not a crash.
 */
public final class InputFileSource implements CandidateSource {
    private final Path file;

    public InputFileSource(Path file) {
        this.file = file;
    }

    @Override
    public void run(SourceListener out) throws IOException, InterruptedException {
        try (BufferedReader in = reader()) {
            long lineNo = 0;
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                lineNo++;
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

    /** The number of non-blank, non-comment lines, counted with one cheap pass. */
    @Override
    public OptionalLong size() {
        try (BufferedReader in = reader()) {
            long n = 0;
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                if (ConfigurationText.stripComment(line) != null) {
                    n++;
                }
            }
            return OptionalLong.of(n);
        } catch (IOException e) {
            return OptionalLong.empty();
        }
    }

    @Override
    public String description() {
        return "input " + file;
    }

    private BufferedReader reader() throws IOException {
        return new BufferedReader(new InputStreamReader(Files.newInputStream(file), StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPLACE).onUnmappableCharacter(CodingErrorAction.REPLACE)), 1 << 16);
    }
}
