package org.winnow.pipeline.metrics;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import io.micrometer.core.instrument.Timer;
import java.util.EnumMap;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;

/** Meters of the scorer stage; one instance per worker is fine, the meters are shared by name and tags. */
public final class ScorerMetrics {
    /** Verdicts, tagged {@value #TAG_VERDICT} and {@value #TAG_REASON}. */
    public static final String VERDICTS = "winnow.scorer.verdicts";
    /** Time to score one candidate: invariants, prediction and rules. */
    public static final String LATENCY = "winnow.scorer.latency";
    /** Tag: keep or reject. */
    public static final String TAG_VERDICT = "verdict";
    /** Tag: the reason code. */
    public static final String TAG_REASON = "reason";

    private final Map<Reason, Counter> verdicts = new EnumMap<>(Reason.class);
    private final Timer latency;

    public ScorerMetrics(MeterRegistry registry) {
        for (Reason r : Reason.values()) {
            verdicts.put(r, Counter.builder(VERDICTS).description("candidates scored, by verdict and reason")
                    .tag(TAG_VERDICT, r.verdict().name().toLowerCase(java.util.Locale.ROOT))
                    .tag(TAG_REASON, r.code())
                    .register(registry));
        }
        latency = Timer.builder(LATENCY).description("time to score one candidate").register(registry);
    }

    /** Counts one verdict that took {@code nanos} to reach. */
    public void scored(Scored s, long nanos) {
        verdicts.get(s.reason()).increment();
        latency.record(nanos, TimeUnit.NANOSECONDS);
    }
}
