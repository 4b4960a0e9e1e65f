package org.winnow.app.cli;

import java.time.Duration;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** The value of {@code --prove}: a per-candidate time budget written {@code 200ms} or {@code 2s}. */
public final class ProofBudget {
    private static final Pattern FORM = Pattern.compile("(\\d{1,9})(ms|s)");
    /** The longest budget accepted: beyond it a scan would in effect be an exact computation. */
    public static final Duration MAX = Duration.ofMinutes(10);

    private ProofBudget() {}

    /**
     * Parses {@code text}, or returns null for null; {@link IllegalArgumentException} with one line
     * naming the value otherwise.
     */
    public static Duration parse(String text) {
        if (text == null) {
            return null;
        }
        Matcher m = FORM.matcher(text.trim());
        if (!m.matches()) {
            throw new IllegalArgumentException("--prove " + text + ": expected a time such as 200ms or 2s");
        }
        long n = Long.parseLong(m.group(1));
        Duration d = m.group(2).equals("ms") ? Duration.ofMillis(n) : Duration.ofSeconds(n);
        if (d.isZero() || d.compareTo(MAX) > 0) {
            throw new IllegalArgumentException("--prove " + text + ": must be more than 0 and at most " + MAX.toMinutes()
                    + " minutes");
        }
        return d;
    }
}
