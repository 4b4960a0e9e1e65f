package org.winnow.pipeline.metrics;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import io.micrometer.core.instrument.Timer;
import java.util.EnumMap;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;

/** Meters of the scorer stage; one instance per worker is fine, the meters are shared by name and tags. */
public final class ScorerMetrics {
    /** Verdicts, tagged {@value #TAG_VERDICT} and {@value #TAG_REASON}. */
    public static final String VERDICTS = "winnow.scorer.verdicts";
    /** Time to score one candidate: invariants, prediction and rules. */
    public static final String LATENCY = "winnow.scorer.latency";
    /**
     * Scored candidates per novelty bin, tagged {@value #TAG_BIN}: {@link #NOVELTY_BINS} equal bins over [0, 1].
     * Plain counters rather than a Micrometer histogram, whose fixed buckets did not bin sub-unit values
     * faithfully in our check (SnapshotTakerTest compares against a direct count).
     */
    public static final String NOVELTY = "winnow.scorer.novelty";
    /** Tag: the upper bound of a novelty bin, "0.1" to "1.0". */
    public static final String TAG_BIN = "bin";
    /** Bins of the novelty histogram; bin i holds novelty in ((i - 1) / N, i / N], bin 0 also holds 0. */
    public static final int NOVELTY_BINS = 10;
    /** Tag: keep or reject. */
    public static final String TAG_VERDICT = "verdict";
    /** Tag: the reason code. */
    public static final String TAG_REASON = "reason";
    /** Proof steps run, tagged {@value #TAG_OUTCOME}: settled, unsettled or out-of-time. */
    public static final String PROOFS = "winnow.scorer.proofs";
    /** Tag: the outcome of a proof step. */
    public static final String TAG_OUTCOME = "outcome";

    private final Map<Reason, Counter> verdicts = new EnumMap<>(Reason.class);
    private final Timer latency;
    private final Counter[] novelty = new Counter[NOVELTY_BINS];
    private final Map<Proof, Counter> proofs = new EnumMap<>(Proof.class);

    public ScorerMetrics(MeterRegistry registry) {
        for (Reason r : Reason.values()) {
            verdicts.put(r, Counter.builder(VERDICTS).description("candidates scored, by verdict and reason")
                    .tag(TAG_VERDICT, r.verdict().name().toLowerCase(java.util.Locale.ROOT))
                    .tag(TAG_REASON, r.code())
                    .register(registry));
        }
        for (Proof p : Proof.values()) {
            if (p != Proof.NOT_ATTEMPTED) {
                proofs.put(p, Counter.builder(PROOFS).description("proof steps run, by outcome")
                        .tag(TAG_OUTCOME, p.code()).register(registry));
            }
        }
        latency = Timer.builder(LATENCY).description("time to score one candidate").register(registry);
        for (int i = 0; i < NOVELTY_BINS; i++) {
            novelty[i] = Counter.builder(NOVELTY).description("candidates scored, by novelty bin")
                    .tag(TAG_BIN, binLabel(i)).register(registry);
        }
    }

    /** Counts one verdict that took {@code nanos} to reach. */
    public void scored(Scored s, long nanos) {
        verdicts.get(s.reason()).increment();
        latency.record(nanos, TimeUnit.NANOSECONDS);
        novelty[bin(s.novelty())].increment();
        Counter proof = s.prediction() == null ? null : proofs.get(s.prediction().proof());
        if (proof != null) {
            proof.increment();
        }
    }

    /** The bin of a novelty in [0, 1]: bin i holds ((i - 1) / N, i / N], bin 0 also holds 0. */
    public static int bin(double novelty) {
        int bin = (int) Math.ceil(novelty * NOVELTY_BINS) - 1;
        // The product can land a hair above an exact edge (0.3 * 10 = 3.0000000000000004).
        if (bin > 0 && novelty <= bin / (double) NOVELTY_BINS) {
            bin--;
        }
        return Math.max(0, Math.min(NOVELTY_BINS - 1, bin));
    }

    /** The {@value #TAG_BIN} tag of bin {@code i}: its upper bound. */
    public static String binLabel(int i) {
        return String.format(java.util.Locale.ROOT, "%.1f", (i + 1) / (double) NOVELTY_BINS);
    }
}
