package org.winnow.kafka;

import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.util.Map;
import java.util.Objects;
import java.util.Properties;
import java.util.TreeMap;

/**
 * What defines a run, written once to its descriptor topic: the run id and the settings every stage of the
 * run must share (bounds, rules, partitions). Every stage that joins the run compares its own settings with
 * the first descriptor on the topic and refuses on any difference.
 *
 * <p>The value is plain {@code key=value} text, so an operator can read it with any console consumer.
 */
public record RunDescriptor(String runId, Map<String, String> settings) {
    public RunDescriptor {
        new RunTopics(runId);
        Objects.requireNonNull(settings, "settings");
        settings = Map.copyOf(new TreeMap<>(settings));
    }

    /** The descriptor as the text stored on the topic, keys sorted. */
    public String toText() {
        StringBuilder sb = new StringBuilder();
        sb.append("run=").append(escape(runId)).append('\n');
        new TreeMap<>(settings).forEach((k, v) -> sb.append("setting.").append(escape(k)).append('=')
                .append(escape(v)).append('\n'));
        return sb.toString();
    }

    /** Reads {@link #toText} output; text without a run id is refused. */
    public static RunDescriptor parse(String text) {
        Properties p = new Properties();
        try {
            p.load(new StringReader(text));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (IllegalArgumentException e) {
            throw new WireFormatException("run descriptor is not key=value text: " + e.getMessage(), e);
        }
        String run = p.getProperty("run");
        if (run == null) {
            throw new WireFormatException("run descriptor names no run");
        }
        Map<String, String> settings = new TreeMap<>();
        for (String key : p.stringPropertyNames()) {
            if (key.startsWith("setting.")) {
                settings.put(key.substring("setting.".length()), p.getProperty(key));
            }
        }
        return new RunDescriptor(run, settings);
    }

    /**
     * The first setting in which {@code other} differs from this, as {@code key: 'mine' vs 'theirs'}, or
     * null when the two agree.
     */
    public String firstDifference(RunDescriptor other) {
        if (!runId.equals(other.runId)) {
            return "run: '" + runId + "' vs '" + other.runId + "'";
        }
        TreeMap<String, String> keys = new TreeMap<>(settings);
        other.settings.forEach(keys::putIfAbsent);
        for (String key : keys.keySet()) {
            String a = settings.get(key);
            String b = other.settings.get(key);
            if (!Objects.equals(a, b)) {
                return key + ": " + quote(a) + " vs " + quote(b);
            }
        }
        return null;
    }

    private static String quote(String s) {
        return s == null ? "(unset)" : "'" + s + "'";
    }

    private static String escape(String s) {
        StringBuilder sb = new StringBuilder();
        for (char c : s.toCharArray()) {
            switch (c) {
                case '\\' -> sb.append("\\\\");
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '=', ':', '#', '!', ' ' -> sb.append('\\').append(c);
                default -> sb.append(c);
            }
        }
        return sb.toString();
    }
}
