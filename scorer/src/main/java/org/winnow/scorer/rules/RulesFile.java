package org.winnow.scorer.rules;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import org.winnow.geometry.ConfigurationText;
import org.winnow.pipeline.Keepable;

/**
 * The file form of the rules, one a line, {@code #} starting a comment:
 * <pre>
 * keep h11=4..6
 * keep chi=-60..0
 * keep chi%24=0
 * min-confidence 0.9
 * novelty 0.99
 * </pre>
 * Every error names the file, the line and the rule.
 */
public final class RulesFile {
    static final String KEEP = "keep";
    static final String MIN_CONFIDENCE = "min-confidence";
    static final String NOVELTY = "novelty";

    /**
     * What a file says; thresholds it does not set are empty, so the command line or the defaults fill them.
     */
    public record Contents(List<String> keeps, OptionalDouble minConfidence, OptionalDouble noveltyGuard) {
        public Contents {
            keeps = List.copyOf(keeps);
        }
    }

    private RulesFile() {}

    /**
     * The largest rules file read, 1 MiB: a few dozen lines is a long one, so anything near this is the wrong
     * file (and {@code /dev/zero} would otherwise be read until the heap is full).
     */
    public static final int MAX_BYTES = 1 << 20;

    /**
     * Reads a rules file; {@link RuleException} for a bad line, a directory or a file over {@link #MAX_BYTES},
     * {@link IOException} for a missing file. A pipe is read once, so {@code --rules-file <(...)} works.
     */
    public static Contents read(Path file) throws IOException {
        if (Files.isDirectory(file)) {
            throw new RuleException(file + ": is a directory; give a text file of rules, one a line");
        }
        byte[] bytes;
        try (InputStream in = Files.newInputStream(file)) {
            bytes = in.readNBytes(MAX_BYTES + 1);
        }
        if (bytes.length > MAX_BYTES) {
            throw new RuleException(file + ": longer than " + MAX_BYTES + " bytes (1 MiB), which no rules file needs;"
                    + " is it the right file?");
        }
        // Bytes that are not UTF-8 become U+FFFD, so the line holding them is refused with its number.
        String text = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPLACE)
                .onUnmappableCharacter(CodingErrorAction.REPLACE).decode(ByteBuffer.wrap(bytes))
                .toString();
        // A byte-order mark from an editor would make the first rule unreadable.
        if (text.startsWith(ConfigurationText.BYTE_ORDER_MARK)) {
            text = text.substring(1);
        }
        return parse(text.lines().toList(), file.toString());
    }

    /** Parses the lines of a rules file named {@code name} in messages. */
    public static Contents parse(List<String> lines, String name) {
        List<String> keeps = new ArrayList<>();
        OptionalDouble minConfidence = OptionalDouble.empty();
        OptionalDouble novelty = OptionalDouble.empty();
        Map<Keepable, String> rangeAt = new HashMap<>();
        Map<Keepable, String> residueAt = new HashMap<>();
        String confidenceAt = null;
        String noveltyAt = null;
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i);
            int hash = line.indexOf('#');
            String body = (hash >= 0 ? line.substring(0, hash) : line).trim();
            if (body.isEmpty()) {
                continue;
            }
            String where = name + ":" + (i + 1);
            String[] parts = body.split("\\s+", 2);
            String value = parts.length > 1 ? parts[1].trim() : "";
            try {
                switch (parts[0]) {
                    case KEEP -> {
                        if (ResidueRule.looksLike(value)) {
                            ResidueRule rule = ResidueRule.parse(value);
                            String before = residueAt.putIfAbsent(rule.invariant(), where);
                            if (before != null) {
                                throw new RuleException(String.format("rule '%s': %s already has a residue at %s; give "
                                        + "one residue per invariant", body, rule.invariant().label(), before));
                            }
                        } else {
                            RangeRule rule = RangeRule.parse(value);
                            String before = rangeAt.putIfAbsent(rule.invariant(), where);
                            if (before != null) {
                                throw new RuleException(String.format("rule '%s': %s already has a range at %s; give one "
                                        + "range per invariant", body, rule.invariant().label(), before));
                            }
                        }
                        keeps.add(value);
                    }
                    case MIN_CONFIDENCE -> {
                        if (confidenceAt != null) {
                            throw new RuleException(String.format("rule '%s': min-confidence is set already at %s",
                                    body, confidenceAt));
                        }
                        double x = number(body, value);
                        if (!(x >= 0 && x <= 1)) {
                            throw new RuleException(String.format("rule '%s': must be in [0, 1]", body));
                        }
                        confidenceAt = where;
                        minConfidence = OptionalDouble.of(x);
                    }
                    case NOVELTY -> {
                        if (noveltyAt != null) {
                            throw new RuleException(String.format("rule '%s': novelty is set already at %s", body,
                                    noveltyAt));
                        }
                        double x = number(body, value);
                        if (!(x > 0 && x <= 1)) {
                            throw new RuleException(String.format("rule '%s': must be in (0, 1]", body));
                        }
                        noveltyAt = where;
                        novelty = OptionalDouble.of(x);
                    }
                    default -> throw new RuleException(String.format("rule '%s': expected '%s INVARIANT=LO..HI', '%s chi%%M=R', "
                            + "'%s X' or '%s X'", body, KEEP, KEEP, MIN_CONFIDENCE, NOVELTY));
                }
            } catch (RuleException e) {
                throw new RuleException(where + ": " + e.getMessage());
            }
        }
        return new Contents(keeps, minConfidence, novelty);
    }

    private static double number(String rule, String value) {
        try {
            return Double.parseDouble(value);
        } catch (NumberFormatException e) {
            throw new RuleException(String.format("rule '%s': '%s' is not a number", rule, value));
        }
    }
}
