package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.apache.kafka.common.serialization.StringSerializer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.winnow.geometry.Configuration;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.ExactlyOnceRelay;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.KryoCodec;
import org.winnow.kafka.KryoSerde;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunDescriptor;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.ScoredTopicSerde;
import org.winnow.kafka.SlimReject;
import org.winnow.kafka.TopicLayout;
import org.winnow.kafka.WireHeaders;
import org.winnow.kafka.WireTypes;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Scored;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.CandidateScorer;
import org.winnow.scorer.stage.CheapInvariantFunction;
import org.winnow.scorer.stage.InvariantFunction;
import org.winnow.scorer.stage.PredictionFunction;
import org.winnow.scorer.stage.ScoringFunctions;

/**
 * The scan's scorer stage run as cluster scorers over a real broker: the scored topic holds exactly what
 * the scorer computes for each candidate when called directly, once each, with two scorers sharing the
 * work; and a scorer with another model or other rules than the run's is refused.
 *
 * <p>The exact invariants are the real ones; the prediction is a fixed function of the matrix standing in
 * for a model, because what is under test is the transport, not the model.
 */
@KafkaBroker
@Timeout(180)
class ClusterScorerTest {
    private static final String CHECKSUM = "aa".repeat(32);
    private static final KeepRules RULES = KeepRules.of(List.of("chi=-250..-100"), 0.9, 0.99);

    private final EmbeddedKafkaBroker broker;

    ClusterScorerTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Test
    void twoScorersInOneGroupWriteExactlyTheDirectScoresOnceEach() throws Exception {
        RunTopics run = createRun("score-two", 4);
        List<Candidate> candidates = candidates();
        AtomicLong a = new AtomicLong();
        AtomicLong b = new AtomicLong();
        ExecutorService threads = Executors.newFixedThreadPool(2);
        ClusterScorer sa = join(run, "a", CHECKSUM, RULES, a);
        ClusterScorer sb = join(run, "b", CHECKSUM, RULES, b);
        try {
            Future<?> fa = threads.submit(sa::run);
            Future<?> fb = threads.submit(sb::run);
            awaitAssigned(ClusterScorer.group(run), 2);
            write(run, candidates);
            List<ConsumerRecord<String, Object>> out = readScored(run, candidates.size());
            sa.stop();
            sb.stop();
            fa.get(30, TimeUnit.SECONDS);
            fb.get(30, TimeUnit.SECONDS);

            CandidateScorer direct = CandidateScorer.of(scoring(CHECKSUM), RULES);
            Map<String, Scored> byKey = new HashMap<>();
            for (ConsumerRecord<String, Object> r : out) {
                Scored s = (Scored) r.value();
                assertEquals(r.key(), s.candidate().key());
                assertTrue(byKey.put(r.key(), s) == null, "scored twice: " + r.key());
            }
            assertEquals(candidates.size(), byKey.size());
            long rejected = 0;
            for (Candidate c : candidates) {
                Scored expected = direct.score(c);
                assertEquals(expected, byKey.get(c.key()), c.key());
                rejected += expected.verdict() == org.winnow.pipeline.Verdict.REJECT ? 1 : 0;
            }
            assertTrue(rejected > 0 && rejected < candidates.size(), "the rules both keep and reject: " + rejected);
            assertTrue(a.get() > 0 && b.get() > 0, "both scorers worked: a=" + a + " b=" + b);
            assertEquals(candidates.size(), a.get() + b.get());
        } finally {
            sa.close();
            sb.close();
            threads.shutdownNow();
        }
    }

    @Test
    void aRunWithSlimRejectsGetsEachRejectionAsItsSeqAndReasonAndEachKeptCandidateWhole() throws Exception {
        RunTopics run = createRun("score-slim", 2, Map.of(RejectsOnWire.SETTING, RejectsOnWire.SLIM.text()));
        List<Candidate> candidates = candidates();
        ExecutorService threads = Executors.newSingleThreadExecutor();
        ClusterScorer scorer = join(run, "slim", CHECKSUM, RULES, new AtomicLong());
        try {
            Future<?> f = threads.submit(scorer::run);
            write(run, candidates);
            List<ConsumerRecord<String, Object>> out = readScored(run, candidates.size());
            scorer.stop();
            f.get(30, TimeUnit.SECONDS);

            CandidateScorer direct = CandidateScorer.of(scoring(CHECKSUM), RULES);
            Map<String, Object> byKey = new HashMap<>();
            for (ConsumerRecord<String, Object> r : out) {
                assertTrue(byKey.put(r.key(), r.value()) == null, "scored twice: " + r.key());
                assertEquals(r.value() instanceof SlimReject, r.headers().lastHeader(ScoredTopicSerde.KIND) != null);
            }
            assertEquals(candidates.size(), byKey.size());
            long slim = 0;
            for (Candidate c : candidates) {
                Scored expected = direct.score(c);
                boolean rejected = expected.verdict() == org.winnow.pipeline.Verdict.REJECT;
                assertEquals(rejected ? new SlimReject(c.shard(), c.seq(), expected.reason()) : expected,
                        byKey.get(c.key()), c.key());
                slim += rejected ? 1 : 0;
            }
            assertTrue(slim > 0 && slim < candidates.size(), "slim and whole records both met: " + slim);
        } finally {
            scorer.close();
            threads.shutdownNow();
        }
    }

    @Test
    void aScorerWithAnotherModelOrOtherRulesIsRefused() {
        RunTopics run = createRun("score-refusals", 1);
        join(run, "first", CHECKSUM, RULES, new AtomicLong()).close();
        var model = assertThrows(ClusterRefusedException.class,
                () -> join(run, "second", "bb".repeat(32), RULES, new AtomicLong()));
        assertTrue(model.getMessage().contains("aaaaaaaaaaaaaaaa") && model.getMessage().contains("bbbbbbbbbbbbbbbb"),
                model.getMessage());
        var rules = assertThrows(ClusterRefusedException.class, () -> join(run, "third", CHECKSUM,
                KeepRules.of(List.of("chi=-250..-90"), 0.9, 0.99), new AtomicLong()));
        assertTrue(rules.getMessage().contains("rules"), rules.getMessage());
    }

    @Test
    void aScorerOfARunThatDoesNotExistIsRefused() {
        var e = assertThrows(ClusterRefusedException.class,
                () -> join(new RunTopics("never-created"), "x", CHECKSUM, RULES, new AtomicLong()));
        assertTrue(e.getMessage().contains("winnow.never-created.candidates"), e.getMessage());
    }

    private ClusterScorer join(RunTopics run, String instance, String checksum, KeepRules rules, AtomicLong count) {
        return ClusterScorer.join(KafkaSettings.of(broker.bootstrapServers()), run, instance, scoring(checksum),
                rules, new SimpleMeterRegistry(), new ExactlyOnceRelay.Listener() {
                    @Override
                    public void committed(int inputs, int outputs) {
                        count.addAndGet(inputs);
                    }
                });
    }

    /** Real exact invariants; a prediction that is a fixed function of the matrix. */
    static ScoringFunctions scoring(String checksum) {
        return new ScoringFunctions() {
            @Override
            public InvariantFunction newInvariants() {
                return new CheapInvariantFunction();
            }

            @Override
            public PredictionFunction newPredictions() {
                return (config, exact) -> Prediction.of(config.rows() + config.cols(), 0.95, exact.dim() == 3 ? (int) (config.rows() + config.cols() - exact.chi() / 2) : null, Math.floorMod(config.hashCode(), 100) / 100.0, "4:5");
            }

            @Override
            public String modelChecksum() {
                return checksum;
            }
        };
    }

    /** Every Calabi-Yau matrix of up to 2 factors of dimension up to 4 and up to 3 polynomials. */
    static List<Candidate> candidates() {
        List<Candidate> out = new ArrayList<>();
        InvariantFunction exact = new CheapInvariantFunction();
        int[] degreesUpTo = {0, 1, 2, 3, 4, 5};
        for (int rows = 1; rows <= 2; rows++) {
            for (int cols = 1; cols <= 3; cols++) {
                int entries = rows * cols;
                int total = (int) Math.pow(degreesUpTo.length, entries);
                for (int code = 0; code < total; code++) {
                    int[][] q = new int[rows][cols];
                    int rest = code;
                    for (int e = 0; e < entries; e++) {
                        q[e / cols][e % cols] = degreesUpTo[rest % degreesUpTo.length];
                        rest /= degreesUpTo.length;
                    }
                    int[] n = new int[rows];
                    boolean ok = true;
                    for (int r = 0; r < rows; r++) {
                        int sum = 0;
                        for (int j = 0; j < cols; j++) {
                            sum += q[r][j];
                        }
                        n[r] = sum - 1;
                        ok &= n[r] >= 1 && n[r] <= 4;
                    }
                    for (int j = 0; j < cols && ok; j++) {
                        int col = 0;
                        for (int r = 0; r < rows; r++) {
                            col += q[r][j];
                        }
                        ok = col >= 1;
                    }
                    if (!ok) {
                        continue;
                    }
                    Configuration c = Configuration.of(n, q);
                    if (!c.isCalabiYau() || c.dimension() < 1) {
                        continue;
                    }
                    try {
                        exact.compute(c);
                    } catch (RuntimeException e) {
                        continue;
                    }
                    out.add(new Candidate(c, c.toText(), 0, out.size()));
                }
            }
        }
        return out;
    }

    private RunTopics createRun(String id, int partitions) {
        return createRun(id, partitions, Map.of());
    }

    private RunTopics createRun(String id, int partitions, Map<String, String> settings) {
        RunTopics run = new RunTopics(id);
        try (RunAdmin admin = RunAdmin.connect(KafkaSettings.of(broker.bootstrapServers()))) {
            admin.createRun(run, TopicLayout.singleBroker(partitions), new RunDescriptor(id, settings));
        }
        return run;
    }

    private void write(RunTopics run, List<Candidate> candidates) {
        KryoCodec codec = WireTypes.stages().build();
        Map<String, Object> p = new HashMap<>(KafkaSettings.of(broker.bootstrapServers()).common());
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, "test-writer-" + run.runId());
        try (KafkaProducer<String, Candidate> producer = new KafkaProducer<>(p, new StringSerializer(),
                KryoSerde.of(codec, Candidate.class))) {
            producer.initTransactions();
            producer.beginTransaction();
            for (Candidate c : candidates) {
                ProducerRecord<String, Candidate> r = new ProducerRecord<>(run.candidates(), c.key(), c);
                WireHeaders.forRun(run).stamp(r.headers());
                producer.send(r);
            }
            producer.commitTransaction();
        }
    }

    private List<ConsumerRecord<String, Object>> readScored(RunTopics run, int expected) {
        Map<String, Object> p = new HashMap<>(KafkaSettings.of(broker.bootstrapServers()).common());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, false);
        List<ConsumerRecord<String, Object>> out = new ArrayList<>();
        WireHeaders stamps = WireHeaders.forRunAndModel(run, CHECKSUM);
        try (KafkaConsumer<String, Object> consumer = new KafkaConsumer<>(p, new StringDeserializer(),
                ScoredTopicSerde.of(WireTypes.stages().build()))) {
            List<TopicPartition> tps = new ArrayList<>();
            for (int i = 0; i < consumer.partitionsFor(run.scored()).size(); i++) {
                tps.add(new TopicPartition(run.scored(), i));
            }
            consumer.assign(tps);
            consumer.seekToBeginning(tps);
            long deadline = System.nanoTime() + Duration.ofSeconds(60).toNanos();
            long quietSince = System.nanoTime();
            while (System.nanoTime() < deadline
                    && (out.size() < expected || System.nanoTime() - quietSince < Duration.ofSeconds(2).toNanos())) {
                var records = consumer.poll(Duration.ofMillis(200));
                for (ConsumerRecord<String, Object> r : records) {
                    stamps.check(r.headers(), r.topic() + "@" + r.offset());
                    out.add(r);
                    quietSince = System.nanoTime();
                }
            }
        }
        return out;
    }

    private void awaitAssigned(String group, int members) throws Exception {
        try (Admin admin = Admin.create(KafkaSettings.of(broker.bootstrapServers()).common())) {
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
            while (System.nanoTime() < deadline) {
                try {
                    var d = admin.describeConsumerGroups(List.of(group)).all().get().get(group);
                    if (d.members().stream().filter(m -> !m.assignment().topicPartitions().isEmpty()).count()
                            == members) {
                        return;
                    }
                } catch (java.util.concurrent.ExecutionException e) {
                    // The group does not exist until its first member joins.
                }
                Thread.sleep(100);
            }
        }
        throw new AssertionError("group " + group + " never had " + members + " members with partitions");
    }
}
