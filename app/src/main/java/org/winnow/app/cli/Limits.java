package org.winnow.app.cli;

/** Bounds on what the user may ask for, and how user text is quoted back in one line. */
public final class Limits {
    /** Longest piece of an input line quoted back in a message. */
    public static final int EXCERPT = 80;

    private Limits() {}

    /**
     * The most worker threads a command accepts: 4 per processor, at least 8. Each thread holds its own
     * scoring or Hodge state; beyond the processors they only add memory and switching ({@code --threads
     * 100000} once took 46 s and 5.8 GB for two lines).
     */
    public static int maxThreads() {
        return Math.max(8, 4 * Runtime.getRuntime().availableProcessors());
    }

    /** Null when {@code threads} is acceptable, else the one-line refusal. */
    public static String threadsProblem(int threads) {
        return threadsProblem("--threads", threads);
    }

    /** {@link #threadsProblem(int)} for a thread count given by {@code option}, named in the message. */
    public static String threadsProblem(String option, int threads) {
        if (threads < 1) {
            return option + " must be at least 1, got " + threads;
        }
        int max = maxThreads();
        if (threads > max) {
            return option + " " + threads + " is more than " + max + " (4 per processor here); more threads than "
                    + "that only add memory and switching";
        }
        return null;
    }

    /**
     * {@code text} as it may be quoted in a one-line message: characters outside printable ASCII as
     * {@code \\uXXXX}, cut after {@value #EXCERPT} characters with the full length said.
     */
    public static String excerpt(String text) {
        StringBuilder sb = new StringBuilder();
        int n = 0;
        for (int i = 0; i < text.length() && n < EXCERPT; i++, n++) {
            char c = text.charAt(i);
            if (c >= 0x20 && c < 0x7f) {
                sb.append(c);
            } else {
                sb.append(String.format("\\u%04X", (int) c));
            }
        }
        if (text.length() > EXCERPT) {
            sb.append("... (").append(text.length()).append(" characters)");
        }
        return sb.toString();
    }
}
