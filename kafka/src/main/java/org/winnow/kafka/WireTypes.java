package org.winnow.kafka;

import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.geometry.hodge.Basis;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.Verdict;
import org.winnow.pipeline.metrics.MetricSnapshot;

/**
 * The wire ids of every class that crosses a topic. An id, once shipped, is never reused for another
 * class: a reader of an older run must either decode a record correctly or refuse it.
 */
public final class WireTypes {
    public static final int INT_ARRAY = 100;
    public static final int INT_MATRIX = 101;
    public static final int DOUBLE_ARRAY = 102;
    public static final int LONG_ARRAY = 103;
    public static final int STRING_ARRAY = 104;
    public static final int CONFIGURATION = 110;
    public static final int CANDIDATE = 120;
    public static final int EXACT_INVARIANTS = 121;
    /** Retired: the prediction record before novelty and the four-fold numbers joined it; never reuse. */
    public static final int RETIRED_ESTIMATE = 122;
    public static final int SCORED = 123;
    public static final int VERDICT = 124;
    public static final int REASON = 125;
    public static final int SLIM_REJECT = 126;
    /** The prediction of plain values before each carried its basis; retired, never reused. */
    public static final int RETIRED_PREDICTION_PLAIN = 127;
    /** The prediction whose every value carries its basis and confidence. */
    public static final int PREDICTION = 128;
    public static final int PREDICTED_VALUE = 129;
    public static final int BASIS = 132;
    public static final int PROOF = 133;
    public static final int SHARD_PROGRESS = 130;
    public static final int SOURCE_REPORT = 131;
    public static final int METRIC_SNAPSHOT = 140;

    private WireTypes() {
    }

    /** A builder holding the shared base types; stage records are registered on top. */
    public static KryoCodec.Builder base() {
        return KryoCodec.builder()
                .register(int[].class, INT_ARRAY)
                .register(int[][].class, INT_MATRIX)
                .register(double[].class, DOUBLE_ARRAY)
                .register(long[].class, LONG_ARRAY)
                .register(String[].class, STRING_ARRAY)
                .register(Configuration.class, CONFIGURATION, ConfigurationSerializer::new);
    }

    /**
     * The base types plus the records that travel between the stages. Enums go by ordinal: every process
     * of a run is the same build (the run's descriptor and model claim make sure of the rest).
     */
    public static KryoCodec.Builder stages() {
        return base()
                .register(Candidate.class, CANDIDATE)
                .register(ExactInvariants.class, EXACT_INVARIANTS)
                .register(Prediction.class, PREDICTION)
                .register(PredictedValue.class, PREDICTED_VALUE)
                .register(Basis.class, BASIS)
                .register(Proof.class, PROOF)
                .register(Scored.class, SCORED)
                .register(Verdict.class, VERDICT)
                .register(Reason.class, REASON)
                .register(SlimReject.class, SLIM_REJECT, SlimRejectSerializer::new)
                .register(ShardProgress.class, SHARD_PROGRESS)
                .register(SourceReport.class, SOURCE_REPORT, SourceReportSerializer::new);
    }

    /** The base types plus the metric snapshot, the only record of the metrics topic. */
    public static KryoCodec.Builder metrics() {
        return base().register(MetricSnapshot.class, METRIC_SNAPSHOT);
    }
}
