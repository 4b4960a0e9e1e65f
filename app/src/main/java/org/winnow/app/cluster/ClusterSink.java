package org.winnow.app.cluster;

import io.micrometer.core.instrument.MeterRegistry;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicReference;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.StageContext;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.KryoCodec;
import org.winnow.kafka.KryoSerde;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunDescriptor;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.ScoredTopicSerde;
import org.winnow.kafka.ShardProgress;
import org.winnow.kafka.SlimReject;
import org.winnow.kafka.WireHeaders;
import org.winnow.kafka.WireTypes;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.ScanInfo;
import org.winnow.sink.SinkOptions;
import org.winnow.sink.SurvivorSink;

/**
 * The sink of a cluster run: the scan's own {@link SurvivorSink}, fed with the run's committed scored
 * records in seq order. Scored records arrive from several partitions in any order, so they wait in a
 * reorder buffer until their seq is next.
 *
 * <p>Exactly once without a Kafka transaction: the offsets to resume from are written beside the files
 * ({@link OffsetLog}) just before each checkpoint, and are the lowest offset, per partition, of a record
 * not yet written. On restart the sink seeks there and drops what the checkpoint already holds (seq below
 * its {@code nextSeq}); the scored topic itself holds each candidate once, because the scorers write it
 * transactionally.
 *
 * <p>A run with slim rejects ({@link RejectsOnWire#SLIM}) has no rejected candidate to write, so a sink
 * asked to write rejects is refused before it touches its directory.
 */
public final class ClusterSink {
    /** How often the sink reports its position to {@link #group}. */
    private static final Duration REPORT_EVERY = Duration.ofSeconds(1);

    private ClusterSink() {
    }

    /**
     * The consumer group under which the sink reports how far it has written, for lag monitoring only: the
     * sink resumes from the offsets beside its files, never from this group.
     */
    public static String group(RunTopics run) {
        return "winnow-" + run.runId() + "-sink";
    }

    /**
     * Writes the run's survivors to {@code out} until the producer's report is done and every candidate
     * it counted has been written, then writes the complete manifest.
     *
     * @param running polled between batches; when it turns false the sink stops with what it committed
     * @return the complete manifest, or null when stopped before the end
     * @throws ClusterRefusedException when the run does not fit: missing, or slim rejects for a sink that
     *     writes rejects
     */
    public static Manifest run(KafkaSettings settings, RunTopics run, Path out, SinkOptions options, Clock clock,
            MeterRegistry registry, AtomicBoolean running) throws IOException {
        RunDescriptor descriptor;
        String model;
        String rules;
        try (RunAdmin admin = RunAdmin.connect(settings)) {
            descriptor = admin.requireRun(run);
            if (options.writeRejects() && RejectsOnWire.of(descriptor) == RejectsOnWire.SLIM) {
                throw new ClusterRefusedException("run '" + run.runId() + "' carries rejected candidates slim, "
                        + "so there are no rejects to write; drop --rejects, or create the run with "
                        + "winnow produce --rejects");
            }
            model = admin.claimedModel(run);
            rules = admin.claimed(run, ClusterScorer.RULES_CLAIM);
            while ((model == null || rules == null) && running.get()) {
                sleep(Duration.ofMillis(500));
                model = admin.claimedModel(run);
                rules = admin.claimed(run, ClusterScorer.RULES_CLAIM);
            }
        }
        if (model == null || rules == null) {
            return null;
        }
        ScanInfo info = new ScanInfo(run.runId(), descriptor.settings().getOrDefault("source", "cluster run"), null,
                List.of(rules.split("\n")), model);
        KryoCodec codec = WireTypes.stages().build();
        AtomicReference<SourceReport> report = new AtomicReference<>();
        OffsetLog log = new OffsetLog(out);
        Position position = new Position();
        SurvivorSink sink = SurvivorSink.open(out, info, options, clock, report::get, step -> {
            if (step.equals("checkpoint")) {
                try {
                    log.append(position.nextSeq, position.resumeOffsets());
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            }
        });
        try {
            position.nextSeq = sink.resumeFrom();
            Map<Integer, Long> resume = sink.resumeFrom() == 0 ? Map.of() : log.lookup(sink.resumeFrom());
            if (resume == null) {
                throw new ClusterRefusedException(out + ": checkpoint at " + sink.resumeFrom()
                        + " has no Kafka offsets in " + OffsetLog.FILE + "; was it written by winnow sink?");
            }
            sink.open(context(registry));
            return consume(settings, run, out, codec, model, sink, position, resume, report, running,
                    options.writeRejects());
        } finally {
            try {
                sink.close();
            } catch (Exception e) {
                throw new IOException("closing the sink: " + e.getMessage(), e);
            }
        }
    }

    private static Manifest consume(KafkaSettings settings, RunTopics run, Path out, KryoCodec codec, String model,
            SurvivorSink sink, Position position, Map<Integer, Long> resume, AtomicReference<SourceReport> report,
            AtomicBoolean running, boolean writeRejects) throws IOException {
        Map<String, Object> p = new HashMap<>(settings.common());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, false);
        p.put(ConsumerConfig.MAX_POLL_RECORDS_CONFIG, 5000);
        WireHeaders scoredStamps = WireHeaders.forRunAndModel(run, model);
        WireHeaders planStamps = WireHeaders.forRun(run);
        Map<String, Object> withGroup = new HashMap<>(p);
        withGroup.put(ConsumerConfig.GROUP_ID_CONFIG, group(run));
        try (KafkaConsumer<String, Object> scored = new KafkaConsumer<>(withGroup, new StringDeserializer(),
                ScoredTopicSerde.of(codec));
                KafkaConsumer<String, ShardProgress> plan = new KafkaConsumer<>(p, new StringDeserializer(),
                        KryoSerde.of(codec, ShardProgress.class))) {
            List<TopicPartition> tps = new ArrayList<>();
            for (int i = 0; i < scored.partitionsFor(run.scored()).size(); i++) {
                tps.add(new TopicPartition(run.scored(), i));
            }
            scored.assign(tps);
            for (TopicPartition tp : tps) {
                Long at = resume.get(tp.partition());
                if (at == null) {
                    scored.seekToBeginning(List.of(tp));
                } else {
                    scored.seek(tp, at);
                }
            }
            TopicPartition planTp = new TopicPartition(run.plan(), ClusterProducer.SHARD);
            plan.assign(List.of(planTp));
            plan.seekToBeginning(List.of(planTp));
            long reported = System.nanoTime();
            while (running.get()) {
                for (ConsumerRecord<String, ShardProgress> r : plan.poll(Duration.ZERO)) {
                    planStamps.check(r.headers(), r.topic() + "-" + r.partition() + "@" + r.offset());
                    if (ShardProgress.key(ClusterProducer.SHARD).equals(r.key())) {
                        report.set(r.value().report());
                    }
                }
                for (ConsumerRecord<String, Object> r : scored.poll(Duration.ofMillis(200))) {
                    String where = r.topic() + "-" + r.partition() + "@" + r.offset();
                    scoredStamps.check(r.headers(), where);
                    if (writeRejects && r.value() instanceof SlimReject) {
                        throw new ClusterRefusedException("record " + where + " is a slim reject, but this sink"
                                + " writes rejects; the run's scorers do not follow its settings");
                    }
                    position.hold(r);
                }
                for (TopicPartition tp : tps) {
                    position.polledTo.put(tp.partition(), scored.position(tp));
                }
                position.release(sink);
                SourceReport r = report.get();
                boolean complete = r != null && r.done() && position.nextSeq == r.candidates();
                if (complete || System.nanoTime() - reported > REPORT_EVERY.toNanos()) {
                    report(scored, run, position.resumeOffsets(), complete);
                    reported = System.nanoTime();
                }
                if (complete) {
                    sink.finish();
                    return Manifest.read(out.resolve(ScanFiles.MANIFEST));
                }
            }
            return null;
        }
    }

    /** Reports the sink's position to its monitoring group; a failed report only delays the lag figure. */
    private static void report(KafkaConsumer<String, Object> consumer, RunTopics run, Map<Integer, Long> at,
            boolean last) {
        Map<TopicPartition, OffsetAndMetadata> offsets = new HashMap<>();
        at.forEach((partition, offset) -> offsets.put(new TopicPartition(run.scored(), partition),
                new OffsetAndMetadata(offset)));
        if (offsets.isEmpty()) {
            return;
        }
        try {
            if (last) {
                consumer.commitSync(offsets, Duration.ofSeconds(5));
            } else {
                consumer.commitAsync(offsets, null);
            }
        } catch (KafkaException e) {
            // Monitoring only: the files and their offset log are what the sink resumes from.
        }
    }

    /** The reorder buffer and what the next checkpoint must record. */
    private static final class Position {
        private final TreeMap<Long, ConsumerRecord<String, Object>> waiting = new TreeMap<>();
        private final Map<Integer, TreeSet<Long>> waitingOffsets = new HashMap<>();
        private final Map<Integer, Long> polledTo = new HashMap<>();
        private long nextSeq;

        void hold(ConsumerRecord<String, Object> r) {
            long seq = ScoredTopicSerde.seq(r.value());
            if (seq < nextSeq) {
                return;
            }
            if (waiting.putIfAbsent(seq, r) != null) {
                throw new ClusterRefusedException("seq " + seq + " arrived twice on " + r.topic()
                        + " (offsets " + waiting.get(seq).offset() + " and " + r.offset() + ")");
            }
            waitingOffsets.computeIfAbsent(r.partition(), k -> new TreeSet<>()).add(r.offset());
        }

        void release(SurvivorSink sink) throws IOException {
            while (!waiting.isEmpty() && waiting.firstKey() == nextSeq) {
                ConsumerRecord<String, Object> r = waiting.pollFirstEntry().getValue();
                waitingOffsets.get(r.partition()).remove(r.offset());
                nextSeq++;
                if (r.value() instanceof SlimReject slim) {
                    sink.acceptRejected(slim.seq(), slim.reason());
                } else {
                    sink.accept((Scored) r.value());
                }
            }
        }

        /** Per partition: the lowest offset still waiting, or how far the partition was read. */
        Map<Integer, Long> resumeOffsets() {
            Map<Integer, Long> at = new TreeMap<>(polledTo);
            waitingOffsets.forEach((partition, offsets) -> {
                if (!offsets.isEmpty()) {
                    at.put(partition, offsets.first());
                }
            });
            return at;
        }
    }

    private static StageContext<Void> context(MeterRegistry registry) {
        return StageContext.terminal("sink", registry);
    }

    private static void sleep(Duration d) {
        try {
            Thread.sleep(d.toMillis());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
