package org.winnow.kafka;

import java.util.Locale;

/**
 * How a run carries rejected candidates on its scored topic, fixed when the run is created and read by
 * every stage from the run's descriptor. Only a sink that writes rejects needs a rejected candidate whole;
 * without one, most of the scored topic would be matrices, invariants and estimates nobody reads.
 */
public enum RejectsOnWire {
    /** Every scored record whole, kept or rejected, so the sink can write rejects. */
    WHOLE,
    /** A rejected candidate is its key, seq and reason only ({@link SlimReject}); kept ones stay whole. */
    SLIM;

    /** The descriptor setting that holds the form. */
    public static final String SETTING = "rejects";

    /** The form as written in the descriptor. */
    public String text() {
        return name().toLowerCase(Locale.ROOT);
    }

    /**
     * The form of {@code run}. A descriptor without the setting comes from a build before it existed,
     * whose scorers always sent whole records.
     *
     * @throws ClusterRefusedException when the setting holds a form this build does not know
     */
    public static RejectsOnWire of(RunDescriptor run) {
        String value = run.settings().get(SETTING);
        if (value == null) {
            return WHOLE;
        }
        for (RejectsOnWire form : values()) {
            if (form.text().equals(value)) {
                return form;
            }
        }
        throw new ClusterRefusedException("run '" + run.runId() + "' carries rejects as '" + value
                + "', which this build does not know (whole, slim)");
    }
}
