package org.winnow.sink;

/**
 * Strict reading of the number columns of survivor and reject lines, and the one-line form of a refusal. The
 * JDK's parsers accept more than these files hold: {@code Long.parseLong} reads fullwidth digits and a plus
 * sign, {@code Double.parseDouble} reads {@code NaN}, {@code Infinity} and hexadecimal; each would let a
 * damaged line through as a different number.
 */
final class LineFields {
    /** Longest refusal message; a line may be megabytes long. */
    private static final int MESSAGE = 200;

    private LineFields() {}

    /** An optional minus sign and 1 to 18 ASCII digits, else {@link IllegalArgumentException} naming {@code what}. */
    static long integer(String s, String what) {
        int from = s.startsWith("-") ? 1 : 0;
        if (s.length() == from || s.length() - from > 18 || !digits(s, from, s.length())) {
            throw new IllegalArgumentException(what + " must be a whole number of ASCII digits, got '" + s + "'");
        }
        return Long.parseLong(s);
    }

    /** A decimal {@code D.DDD} (ASCII digits) in [0, 1], else {@link IllegalArgumentException} naming {@code what}. */
    static double share(String s, String what) {
        int dot = s.indexOf('.');
        boolean form = !s.isEmpty() && s.length() <= 24 && (dot < 0 ? digits(s, 0, s.length())
                : dot > 0 && digits(s, 0, dot) && digits(s, dot + 1, s.length()));
        double v = form ? Double.parseDouble(s) : -1;
        if (!(v >= 0 && v <= 1)) {
            throw new IllegalArgumentException(what + " must be a decimal in [0, 1], got '" + s + "'");
        }
        return v;
    }

    private static boolean digits(String s, int from, int to) {
        for (int i = from; i < to; i++) {
            if (s.charAt(i) < '0' || s.charAt(i) > '9') {
                return false;
            }
        }
        return to > from;
    }

    /** {@code message} on one line of printable ASCII, cut after {@value #MESSAGE} characters. */
    static String brief(String message) {
        String m = String.valueOf(message);
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < m.length() && sb.length() < MESSAGE; i++) {
            char c = m.charAt(i);
            sb.append(c >= 0x20 && c < 0x7f ? String.valueOf(c) : String.format("\\u%04X", (int) c));
        }
        return m.length() > MESSAGE ? sb + "... (" + m.length() + " characters)" : sb.toString();
    }
}
