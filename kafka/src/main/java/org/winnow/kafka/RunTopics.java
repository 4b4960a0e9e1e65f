package org.winnow.kafka;

import static org.winnow.geometry.Checks.requireArgument;

import java.util.List;
import java.util.Objects;
import java.util.regex.Pattern;

/**
 * The topics of one run: {@code winnow.<run>.candidates}, {@code .scored}, {@code .plan}, {@code .metrics}
 * and {@code .run} (the run's descriptor). A run id is 1 to 64 letters, digits, '-' or '_' (no '.', the
 * separator of the topic names, so two runs can never share a topic).
 */
public record RunTopics(String runId) {
    private static final Pattern RUN_ID = Pattern.compile("[A-Za-z0-9][A-Za-z0-9_-]{0,63}");
    private static final String PREFIX = "winnow.";

    public RunTopics {
        Objects.requireNonNull(runId, "runId");
        requireArgument(RUN_ID.matcher(runId).matches(),
                "run id must be 1 to 64 letters, digits, '-' or '_', starting with a letter or digit: '%s'", runId);
    }

    /** Candidates from the producers, keyed by canonical key. */
    public String candidates() {
        return topic("candidates");
    }

    /** Scored candidates from the scorers, keyed by canonical key. */
    public String scored() {
        return topic("scored");
    }

    /** The shard plan: one record per shard to enumerate, consumed by the producers' group. */
    public String plan() {
        return topic("plan");
    }

    /** Metric snapshots that every stage publishes. */
    public String metrics() {
        return topic("metrics");
    }

    /** The run's descriptor and its model claims; one partition, never compacted. */
    public String descriptor() {
        return topic("run");
    }

    /** Every topic of the run, descriptor first. */
    public List<String> all() {
        return List.of(descriptor(), plan(), candidates(), scored(), metrics());
    }

    private String topic(String kind) {
        return PREFIX + runId + "." + kind;
    }
}
