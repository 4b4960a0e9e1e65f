package org.winnow.pipeline.metrics;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import java.util.EnumMap;
import java.util.Locale;
import java.util.Map;
import org.winnow.pipeline.Reason;

/** Meters of the sink, counted for this process only. */
public final class SinkMetrics {
    /** Records taken in seq order, tagged {@value ScorerMetrics#TAG_VERDICT} and {@value ScorerMetrics#TAG_REASON}. */
    public static final String RECORDS = "winnow.sink.records";
    /** Survivor lines written (committed or about to be). */
    public static final String SURVIVOR_LINES = "winnow.sink.survivor.lines";
    /** Checkpoints made durable. */
    public static final String CHECKPOINTS = "winnow.sink.checkpoints";
    /** Files committed under their final name. */
    public static final String FILES = "winnow.sink.files";

    private final Map<Reason, Counter> records = new EnumMap<>(Reason.class);
    private final Counter survivorLines;
    private final Counter checkpoints;
    private final Counter files;

    public SinkMetrics(MeterRegistry registry) {
        for (Reason r : Reason.values()) {
            records.put(r, Counter.builder(RECORDS).description("records taken by the sink, by verdict and reason")
                    .tag(ScorerMetrics.TAG_VERDICT, r.verdict().name().toLowerCase(Locale.ROOT))
                    .tag(ScorerMetrics.TAG_REASON, r.code())
                    .register(registry));
        }
        survivorLines = Counter.builder(SURVIVOR_LINES).description("survivor lines written").register(registry);
        checkpoints = Counter.builder(CHECKPOINTS).description("checkpoints made durable").register(registry);
        files = Counter.builder(FILES).description("files committed under their final name").register(registry);
    }

    public void record(Reason reason) {
        records.get(reason).increment();
    }

    public void survivorLine() {
        survivorLines.increment();
    }

    public void checkpoint() {
        checkpoints.increment();
    }

    public void file() {
        files.increment();
    }
}
