package org.winnow.app.cluster;

import io.micrometer.core.instrument.MeterRegistry;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.apache.kafka.common.serialization.StringSerializer;
import org.winnow.app.cli.RunIds;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.Sequencer;
import org.winnow.pipeline.SourceReport;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.KryoCodec;
import org.winnow.kafka.KryoSerde;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunDescriptor;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.ShardProgress;
import org.winnow.kafka.TopicLayout;
import org.winnow.kafka.WireHeaders;
import org.winnow.kafka.WireTypes;
import org.winnow.pipeline.metrics.SourceMetrics;

/**
 * The producer of a cluster run over one source (shard 0): the scan's own {@link Sequencer} numbers the
 * candidates, and every chunk of them is committed in one transaction together with the shard's progress
 * on the plan topic. A producer killed mid-way leaves whole chunks only; run again, it reads the last
 * committed progress and resumes after it, so no candidate is lost or sent twice.
 */
public final class ClusterProducer {
    /** The one shard of a run fed from a single source. */
    public static final int SHARD = 0;

    private ClusterProducer() {
    }

    /**
     * Settings of one producer run.
     *
     * @param rejects how the run's scorers send rejected candidates, a setting of the run like its source
     */
    public record Settings(KafkaSettings kafka, RunTopics run, TopicLayout layout, CandidateSource source,
            String sourceIdentity, BadInputPolicy policy, int chunk, RejectsOnWire rejects) {
        public Settings {
            Objects.requireNonNull(kafka, "kafka");
            Objects.requireNonNull(run, "run");
            Objects.requireNonNull(layout, "layout");
            Objects.requireNonNull(source, "source");
            Objects.requireNonNull(sourceIdentity, "sourceIdentity");
            Objects.requireNonNull(policy, "policy");
            Objects.requireNonNull(rejects, "rejects");
            org.winnow.geometry.Checks.requireArgument(chunk >= 1, "chunk must be positive: %s", chunk);
        }
    }

    /**
     * Creates the run if needed and sends the source's candidates that are not committed yet.
     *
     * @return the final report of the source
     * @throws ClusterRefusedException when the broker or the run does not fit
     */
    public static SourceReport run(Settings s, MeterRegistry registry) throws Exception {
        createRun(s);
        KryoCodec codec = WireTypes.stages().build();
        ShardProgress last = lastProgress(s.kafka(), s.run(), codec);
        if (last != null && last.report().done()) {
            return last.report();
        }
        long resumeFrom = last == null ? 0 : last.nextSeq();
        Map<String, Object> p = new HashMap<>(s.kafka().common());
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, "winnow-" + s.run().runId() + "-producer-" + SHARD);
        p.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, true);
        p.put(ProducerConfig.ACKS_CONFIG, "all");
        p.put(ProducerConfig.TRANSACTION_TIMEOUT_CONFIG, 10_000);
        p.putIfAbsent(ProducerConfig.LINGER_MS_CONFIG, 5);
        p.putIfAbsent(ProducerConfig.COMPRESSION_TYPE_CONFIG, "lz4");
        WireHeaders stamps = WireHeaders.forRun(s.run());
        try (KafkaProducer<String, Object> producer = new KafkaProducer<>(p, new StringSerializer(),
                new org.apache.kafka.common.serialization.Serializer<Object>() {
                    @Override
                    public byte[] serialize(String topic, Object data) {
                        return codec.encode(data);
                    }
                })) {
            // Fences any earlier producer of this shard still alive, and settles its open transaction.
            producer.initTransactions();
            List<Candidate> chunk = new ArrayList<>(s.chunk());
            Sequencer[] holder = new Sequencer[1];
            Sequencer sequencer = new Sequencer(resumeFrom, SHARD, s.policy(), c -> {
                chunk.add(c);
                if (chunk.size() >= s.chunk()) {
                    commit(producer, s.run(), stamps, chunk, c.seq() + 1, holder[0].report());
                }
            }, new SourceMetrics(registry));
            holder[0] = sequencer;
            s.source().run(sequencer);
            sequencer.markDone();
            SourceReport done = sequencer.report();
            commit(producer, s.run(), stamps, chunk, done.candidates(), done);
            return done;
        }
    }

    /**
     * How a run fed from the file {@code input} names its source in the descriptor: the file's name and the
     * SHA-256 of its bytes, so that a second producer of the run with another file is refused.
     */
    public static String sourceIdentity(Path input) throws IOException {
        return input.getFileName() + " sha256:" + RunIds.of(List.of(), input);
    }

    /**
     * Creates the run's topics and descriptor if needed; idempotent, and what {@link #run} does first.
     *
     * @throws ClusterRefusedException when the broker does not answer or the run exists with another source
     *     or another form of rejects
     */
    public static void createRun(Settings s) {
        try (RunAdmin admin = RunAdmin.connect(s.kafka())) {
            admin.createRun(s.run(), s.layout(), new RunDescriptor(s.run().runId(),
                    Map.of("source", s.sourceIdentity(), RejectsOnWire.SETTING, s.rejects().text())));
        }
    }

    private static void commit(KafkaProducer<String, Object> producer, RunTopics run, WireHeaders stamps,
            List<Candidate> chunk, long nextSeq, SourceReport report) {
        try {
            producer.beginTransaction();
            for (Candidate c : chunk) {
                ProducerRecord<String, Object> r = new ProducerRecord<>(run.candidates(), c.key(), c);
                stamps.stamp(r.headers());
                producer.send(r);
            }
            ProducerRecord<String, Object> progress = new ProducerRecord<>(run.plan(), SHARD,
                    ShardProgress.key(SHARD), new ShardProgress(SHARD, nextSeq, report));
            stamps.stamp(progress.headers());
            producer.send(progress);
            producer.commitTransaction();
            chunk.clear();
        } catch (KafkaException e) {
            // The transaction's fate is settled by the next producer of this shard; resume from there.
            throw new ClusterRefusedException("producer of run '" + run.runId() + "' stopped: "
                    + e.getMessage() + "; run the same command again to resume", e);
        }
    }

    /** The last committed progress of the shard, or null when nothing was committed yet. */
    static ShardProgress lastProgress(KafkaSettings settings, RunTopics run, KryoCodec codec) {
        Map<String, Object> p = new HashMap<>(settings.common());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, false);
        TopicPartition tp = new TopicPartition(run.plan(), SHARD);
        WireHeaders stamps = WireHeaders.forRun(run);
        ShardProgress last = null;
        try (KafkaConsumer<String, ShardProgress> consumer = new KafkaConsumer<>(p, new StringDeserializer(),
                KryoSerde.of(codec, ShardProgress.class))) {
            consumer.assign(List.of(tp));
            consumer.seekToBeginning(List.of(tp));
            long end = consumer.endOffsets(List.of(tp)).get(tp);
            while (consumer.position(tp) < end) {
                for (ConsumerRecord<String, ShardProgress> r : consumer.poll(Duration.ofMillis(200))) {
                    stamps.check(r.headers(), r.topic() + "-" + r.partition() + "@" + r.offset());
                    if (ShardProgress.key(SHARD).equals(r.key())) {
                        last = r.value();
                    }
                }
            }
        }
        return last;
    }
}
