package org.winnow.pipeline.metrics;

/** The three kinds of cluster stage that publish metric snapshots. */
public enum StageKind {
    PRODUCE("produce"),
    SCORE("score"),
    SINK("sink");

    private final String code;

    StageKind(String code) {
        this.code = code;
    }

    /** The name on the wire and in the dashboard; stable across builds, unlike the ordinal. */
    public String code() {
        return code;
    }

    /** The kind whose code is {@code code}. */
    public static StageKind ofCode(String code) {
        for (StageKind k : values()) {
            if (k.code.equals(code)) {
                return k;
            }
        }
        throw new IllegalArgumentException("unknown stage kind: '" + code + "'");
    }
}
