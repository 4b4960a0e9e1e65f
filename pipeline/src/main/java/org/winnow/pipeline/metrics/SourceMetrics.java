package org.winnow.pipeline.metrics;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;

/** Meters of the candidate source, counted for this process only. */
public final class SourceMetrics {
    /** Distinct candidates sent to the scorers. */
    public static final String SENT = "winnow.source.candidates";
    /** Items dropped because their key was seen before. */
    public static final String DUPLICATES = "winnow.source.duplicates";
    /** Candidates below the resume point, already committed by an earlier run. */
    public static final String SKIPPED = "winnow.source.skipped";
    /** Pieces of input that could not be used. */
    public static final String BAD_INPUT = "winnow.source.bad.input";

    private final Counter sent;
    private final Counter duplicates;
    private final Counter skipped;
    private final Counter badInput;

    public SourceMetrics(MeterRegistry registry) {
        sent = Counter.builder(SENT).description("distinct candidates sent to the scorers").register(registry);
        duplicates = Counter.builder(DUPLICATES).description("items whose key was seen before").register(registry);
        skipped = Counter.builder(SKIPPED).description("candidates committed by an earlier run").register(registry);
        badInput = Counter.builder(BAD_INPUT).description("unusable input lines").register(registry);
    }

    public void sent() {
        sent.increment();
    }

    public void duplicate() {
        duplicates.increment();
    }

    public void skipped() {
        skipped.increment();
    }

    public void badInput() {
        badInput.increment();
    }
}
