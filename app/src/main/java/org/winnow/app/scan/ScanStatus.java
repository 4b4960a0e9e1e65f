package org.winnow.app.scan;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import java.util.Locale;
import java.util.OptionalLong;
import java.util.function.Supplier;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.Verdict;
import org.winnow.pipeline.metrics.ScorerMetrics;

/**
 * The live status line of a scan, read from the same meters the Prometheus endpoint shows: candidates
 * per second, rejected share by reason, kept as novel, and an ETA when the size of the source is known.
 * {@link #line(long)} is called from one thread (the status printer).
 */
public final class ScanStatus {
    private final MeterRegistry registry;
    private final Supplier<SourceReport> source;
    private final OptionalLong size;
    private long lastNanos = -1;
    private double lastScored;
    private double rate;
    /** Whether {@link #rate} rests on an interval yet; before that the line shows "--/s", not a made-up 0. */
    private boolean measured;

    /**
     * @param source the source's counts so far (null before the run has started)
     * @param size   how many input items the source holds, when known
     */
    public ScanStatus(MeterRegistry registry, Supplier<SourceReport> source, OptionalLong size) {
        this.registry = registry;
        this.source = source;
        this.size = size;
    }

    /** How many input items the source holds, when known. */
    public OptionalLong size() {
        return size;
    }

    private double count(Reason r) {
        Counter c = registry.find(ScorerMetrics.VERDICTS).tag(ScorerMetrics.TAG_REASON, r.code()).counter();
        return c == null ? 0 : c.count();
    }

    /** Candidates scored by this process so far. */
    public long scored() {
        double s = 0;
        for (Reason r : Reason.values()) {
            s += count(r);
        }
        return (long) s;
    }

    /** Work done out of the source's items (scored, skipped as committed, duplicates, bad lines). */
    public long processed() {
        SourceReport rep = source.get();
        return rep == null ? 0 : scored() + rep.skipped() + rep.duplicates() + rep.badInputs();
    }

    /**
     * Takes the first sample of the rate at {@code nowNanos} without a line, so that the first line shown (a
     * plain one comes a whole period later) already has a measured rate instead of "--/s".
     */
    public void start(long nowNanos) {
        line(nowNanos);
    }

    /** The status at time {@code nowNanos} (any monotonic origin). */
    public String line(long nowNanos) {
        double scored = 0;
        double rejected = 0;
        StringBuilder reasons = new StringBuilder();
        double[] byReason = new double[Reason.values().length];
        for (Reason r : Reason.values()) {
            byReason[r.ordinal()] = count(r);
            scored += byReason[r.ordinal()];
            if (r.verdict() == Verdict.REJECT) {
                rejected += byReason[r.ordinal()];
            }
        }
        if (lastNanos >= 0 && nowNanos > lastNanos) {
            double instant = (scored - lastScored) / ((nowNanos - lastNanos) / 1e9);
            rate = measured ? 0.7 * rate + 0.3 * instant : instant;
            measured = true;
        }
        lastNanos = nowNanos;
        lastScored = scored;
        for (Reason r : Reason.withVerdict(Verdict.REJECT)) {
            double n = byReason[r.ordinal()];
            if (n > 0) {
                reasons.append(reasons.length() == 0 ? "" : ", ").append(r.code()).append(' ')
                        .append(percent(n, scored));
            }
        }
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "%,d scored, %s/s, rejected %s", (long) scored,
                measured ? String.format(Locale.ROOT, "%,.0f", rate) : "--", percent(rejected, scored)));
        if (reasons.length() > 0) {
            sb.append(" (").append(reasons).append(')');
        }
        sb.append(String.format(Locale.ROOT, ", kept as novel %,d", (long) byReason[Reason.KEPT_AS_NOVEL.ordinal()]));
        if (size.isPresent() && rate > 0) {
            long left = Math.max(0, size.getAsLong() - processed());
            long secs = (long) Math.ceil(left / rate);
            sb.append(String.format(Locale.ROOT, ", ETA %d:%02d:%02d", secs / 3600, secs / 60 % 60, secs % 60));
        }
        return sb.toString();
    }

    private static String percent(double part, double whole) {
        return whole == 0 ? "0.0%" : String.format(Locale.ROOT, "%.1f%%", 100 * part / whole);
    }
}
