package org.winnow.app.cluster;

import io.micrometer.core.instrument.MeterRegistry;
import java.util.Objects;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.Verdict;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.ExactlyOnceRelay;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.KryoCodec;
import org.winnow.kafka.KryoSerde;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.ScoredTopicSerde;
import org.winnow.kafka.SlimReject;
import org.winnow.kafka.WireHeaders;
import org.winnow.kafka.WireTypes;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ScorerStage;
import org.winnow.scorer.stage.ScoringFunctions;

/**
 * One scorer of a cluster run: the scan's own {@link ScorerStage}, fed from the run's candidates topic and
 * writing to its scored topic through an {@link ExactlyOnceRelay}, so that a scorer killed at any point
 * neither loses a candidate nor scores one twice. Several scorers of one run share the candidates in the
 * consumer group {@code winnow-<run>-scorers}. A run created with slim rejects ({@link RejectsOnWire}) gets
 * each rejected candidate as a {@link SlimReject}.
 */
public final class ClusterScorer implements AutoCloseable {
    /** The run claim under which the scorers' keep rules are recorded, one rule a line. */
    public static final String RULES_CLAIM = "rules";

    /** The consumer group of a run's scorers. */
    public static String group(RunTopics run) {
        return "winnow-" + run.runId() + "-scorers";
    }

    private final ExactlyOnceRelay<Candidate, Object> relay;

    private ClusterScorer(ExactlyOnceRelay<Candidate, Object> relay) {
        this.relay = relay;
    }

    /**
     * Joins {@code run} as scorer {@code instance}. The run must exist; its model is the first one claimed,
     * and its rules the first ones claimed: a scorer with another model or other rules is refused.
     *
     * @throws ClusterRefusedException when the broker, the run, the model or the rules do not fit
     */
    public static ClusterScorer join(KafkaSettings settings, RunTopics run, String instance,
            ScoringFunctions scoring, KeepRules rules, MeterRegistry registry, ExactlyOnceRelay.Listener listener) {
        RejectsOnWire rejects;
        try (RunAdmin admin = RunAdmin.connect(settings)) {
            rejects = RejectsOnWire.of(admin.requireRun(run));
            admin.claimModel(run, scoring.modelChecksum());
            admin.claim(run, RULES_CLAIM, String.join("\n", rules.describe()));
        }
        KryoCodec codec = WireTypes.stages().build();
        ScorerStage stage = new ScorerStage(scoring, rules, System::nanoTime);
        Forwarder ctx = new Forwarder(rejects);
        try {
            stage.open(StageContext.single("scorer-" + instance, registry, ctx::send));
        } catch (Exception e) {
            throw new IllegalStateException("the scorer stage did not open: " + e.getMessage(), e);
        }
        ExactlyOnceRelay<Candidate, Object> relay = new ExactlyOnceRelay<>(settings,
                ExactlyOnceRelay.Options.of(run.candidates(), run.scored(), group(run), instance),
                KryoSerde.of(codec, Candidate.class), ScoredTopicSerde.of(codec), WireHeaders.forRun(run),
                WireHeaders.forRunAndModel(run, scoring.modelChecksum()),
                (record, out) -> {
                    ctx.out = out;
                    try {
                        stage.accept(record.value());
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                        throw new org.apache.kafka.common.errors.InterruptException(e);
                    } finally {
                        ctx.out = null;
                    }
                }, listener);
        return new ClusterScorer(relay);
    }

    /** Scores until {@link #stop}; see {@link ExactlyOnceRelay#run}. */
    public void run() {
        relay.run();
    }

    /** Stops after the batch in hand; safe from any thread. */
    public void stop() {
        relay.stop();
    }

    @Override
    public void close() {
        relay.close();
    }

    /**
     * The scorer stage's way downstream: into the relay's current transaction, keyed by candidate key, a
     * rejected candidate slim when the run says so.
     */
    private static final class Forwarder {
        private final RejectsOnWire rejects;
        private ExactlyOnceRelay.Emitter<Object> out;

        Forwarder(RejectsOnWire rejects) {
            this.rejects = Objects.requireNonNull(rejects, "rejects");
        }

        void send(Scored record) {
            boolean slim = rejects == RejectsOnWire.SLIM && record.verdict() == Verdict.REJECT;
            out.send(record.candidate().key(), slim ? SlimReject.of(record) : record);
        }
    }
}
