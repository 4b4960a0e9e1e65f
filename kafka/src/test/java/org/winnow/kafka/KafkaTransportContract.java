package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicInteger;
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
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;

/**
 * The transport's behaviour against a real broker, written once and run against every kind of broker the
 * build can start (in-process here, a container where a Docker engine exists).
 */
abstract class KafkaTransportContract {
    private static final AtomicInteger RUNS = new AtomicInteger();
    private static final String MODEL = "0123456789abcdef0123456789abcdef0123456789abcdef0123456789abcdef";
    private static final String OTHER_MODEL = "fedcba9876543210fedcba9876543210fedcba9876543210fedcba9876543210";

    @TempDir
    Path dir;

    /** The broker under test, as {@code HOST:PORT}. */
    abstract String bootstrap();

    private KafkaSettings settings() {
        return KafkaSettings.of(bootstrap());
    }

    private static RunTopics freshRun() {
        return new RunTopics("contract-" + RUNS.incrementAndGet() + "-" + ProcessHandle.current().pid());
    }

    @Test
    void createsEveryTopicOfTheRunWithTheAskedPartitions() {
        RunTopics run = freshRun();
        try (RunAdmin admin = RunAdmin.connect(settings())) {
            admin.createRun(run, TopicLayout.singleBroker(3), new RunDescriptor(run.runId(), Map.of("bounds", "b1")));
            Map<String, Integer> partitions = admin.partitions(run);
            assertEquals(3, partitions.get(run.candidates()));
            assertEquals(3, partitions.get(run.scored()));
            assertEquals(3, partitions.get(run.plan()));
            assertEquals(1, partitions.get(run.descriptor()));
            assertEquals(1, partitions.get(run.metrics()));
            assertEquals(Map.of("bounds", "b1"), admin.requireRun(run).settings());
        }
    }

    @Test
    void joiningARunWithItsOwnSettingsIsFineAndWithOthersIsRefused() {
        RunTopics run = freshRun();
        RunDescriptor mine = new RunDescriptor(run.runId(), Map.of("bounds", "rows<=3"));
        try (RunAdmin admin = RunAdmin.connect(settings())) {
            admin.createRun(run, TopicLayout.singleBroker(2), mine);
            assertEquals(mine, admin.createRun(run, TopicLayout.singleBroker(2), mine));
            var e = assertThrows(ClusterRefusedException.class, () -> admin.createRun(run, TopicLayout.singleBroker(2),
                    new RunDescriptor(run.runId(), Map.of("bounds", "rows<=4"))));
            assertTrue(e.getMessage().contains("bounds: 'rows<=3' vs 'rows<=4'"), e.getMessage());
        }
    }

    @Test
    void refusesARunWhoseTopicsAreMissingNamingThem() {
        RunTopics run = freshRun();
        try (RunAdmin admin = RunAdmin.connect(settings())) {
            var e = assertThrows(ClusterRefusedException.class, () -> admin.requireRun(run));
            assertTrue(e.getMessage().contains(run.candidates()) && e.getMessage().contains(run.scored())
                    && e.getMessage().contains("--run"), e.getMessage());
            assertEquals(1, e.getMessage().lines().count());
        }
    }

    @Test
    void theFirstModelClaimedIsTheRunsModelAndAnotherIsRefused() {
        RunTopics run = freshRun();
        try (RunAdmin admin = RunAdmin.connect(settings())) {
            admin.createRun(run, TopicLayout.singleBroker(1), new RunDescriptor(run.runId(), Map.of()));
            assertNull(admin.claimedModel(run));
            admin.claimModel(run, MODEL);
            admin.claimModel(run, MODEL.toUpperCase(java.util.Locale.ROOT));
            var e = assertThrows(ClusterRefusedException.class, () -> admin.claimModel(run, OTHER_MODEL));
            assertTrue(e.getMessage().contains("0123456789abcdef") && e.getMessage().contains("fedcba9876543210"),
                    e.getMessage());
            assertEquals(MODEL, admin.claimedModel(run));
        }
    }

    @Test
    void candidatesCrossTheBrokerExactlyAsWrittenAndOnlyWhenCommitted() {
        RunTopics run = freshRun();
        try (RunAdmin admin = RunAdmin.connect(settings())) {
            admin.createRun(run, TopicLayout.singleBroker(2), new RunDescriptor(run.runId(), Map.of()));
        }
        KryoCodec codec = WireTypes.base().build();
        KryoSerde<Configuration> serde = KryoSerde.of(codec, Configuration.class);
        WireHeaders stamps = WireHeaders.forRun(run);
        SplittableRandom random = new SplittableRandom(11L);
        List<Configuration> committed = new ArrayList<>();
        Map<String, Object> p = settings().common();
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, run.runId() + "-writer");
        try (KafkaProducer<String, Configuration> producer =
                new KafkaProducer<>(p, new StringSerializer(), serde.serializer())) {
            producer.initTransactions();
            for (int batch = 0; batch < 4; batch++) {
                producer.beginTransaction();
                for (int i = 0; i < 50; i++) {
                    Configuration c = KryoCodecTest.randomConfiguration(random);
                    ProducerRecord<String, Configuration> r = new ProducerRecord<>(run.candidates(), c.toText(), c);
                    stamps.stamp(r.headers());
                    producer.send(r);
                    if (batch != 2) {
                        committed.add(c);
                    }
                }
                if (batch == 2) {
                    producer.flush();
                    producer.abortTransaction();
                } else {
                    producer.commitTransaction();
                }
            }
        }
        List<Configuration> read = readCommitted(run, run.candidates(), serde, stamps, committed.size());
        assertEquals(new java.util.HashSet<>(committed), new java.util.HashSet<>(read));
        assertEquals(committed.size(), read.size(), "no aborted record visible, none twice");
    }

    @Test
    void refusesRecordsStampedWithAnotherRun() {
        RunTopics run = freshRun();
        try (RunAdmin admin = RunAdmin.connect(settings())) {
            admin.createRun(run, TopicLayout.singleBroker(1), new RunDescriptor(run.runId(), Map.of()));
        }
        KryoSerde<Configuration> serde = KryoSerde.of(WireTypes.base().build(), Configuration.class);
        Map<String, Object> p = settings().common();
        try (KafkaProducer<String, Configuration> producer =
                new KafkaProducer<>(p, new StringSerializer(), serde.serializer())) {
            Configuration quintic = Configuration.parse("4:5");
            ProducerRecord<String, Configuration> r = new ProducerRecord<>(run.candidates(), "4:5", quintic);
            WireHeaders.forRun(new RunTopics("someone-else")).stamp(r.headers());
            producer.send(r);
        }
        var e = assertThrows(ClusterRefusedException.class,
                () -> readCommitted(run, run.candidates(), serde, WireHeaders.forRun(run), 1));
        assertTrue(e.getMessage().contains("'someone-else'"), e.getMessage());
    }

    @Test
    void aWrongBootstrapAddressIsRefusedQuicklyInOneLine() throws IOException {
        int closedPort;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            closedPort = s.getLocalPort();
        }
        KafkaSettings wrong = KafkaSettings.of("127.0.0.1:" + closedPort).withConnectTimeout(Duration.ofSeconds(2));
        var e = assertTimeoutPreemptively(Duration.ofSeconds(30),
                () -> assertThrows(ClusterRefusedException.class, () -> RunAdmin.connect(wrong)));
        assertEquals("no Kafka broker answered at 127.0.0.1:" + closedPort + " within 2 s", e.getMessage());
    }

    @Test
    void anUnresolvableHostIsRefusedInOneLine() {
        KafkaSettings wrong = KafkaSettings.of("no-such-host.invalid:9092").withConnectTimeout(Duration.ofSeconds(2));
        var e = assertTimeoutPreemptively(Duration.ofSeconds(30),
                () -> assertThrows(ClusterRefusedException.class, () -> RunAdmin.connect(wrong)));
        assertTrue(e.getMessage().contains("no-such-host.invalid:9092"), e.getMessage());
        assertEquals(1, e.getMessage().lines().count());
    }

    @Test
    void thePassThroughFileReachesTheClients() throws IOException {
        // Asking for TLS from a plaintext listener can only fail if the file's setting was applied.
        Path file = dir.resolve("client.properties");
        Files.writeString(file, "security.protocol=SSL\n");
        try (RunAdmin ok = RunAdmin.connect(settings())) {
            assertTrue(ok.settings().clientProperties().isEmpty());
        }
        KafkaSettings tls = KafkaSettings.of(bootstrap(), file).withConnectTimeout(Duration.ofSeconds(2));
        var e = assertTimeoutPreemptively(Duration.ofSeconds(30),
                () -> assertThrows(ClusterRefusedException.class, () -> RunAdmin.connect(tls)));
        assertTrue(e.getMessage().contains(bootstrap()), e.getMessage());
    }

    private <T> List<T> readCommitted(RunTopics run, String topic, KryoSerde<T> serde, WireHeaders stamps,
            int expected) {
        Properties p = new Properties();
        p.putAll(settings().common());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        List<T> values = new ArrayList<>();
        try (KafkaConsumer<String, T> consumer = new KafkaConsumer<>(p, new StringDeserializer(), serde.deserializer())) {
            int partitions = consumer.partitionsFor(topic).size();
            List<TopicPartition> tps = new ArrayList<>();
            for (int i = 0; i < partitions; i++) {
                tps.add(new TopicPartition(topic, i));
            }
            consumer.assign(tps);
            consumer.seekToBeginning(tps);
            Map<TopicPartition, Long> end = consumer.endOffsets(tps);
            long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
            while (System.nanoTime() < deadline && tps.stream().anyMatch(tp -> consumer.position(tp) < end.get(tp))) {
                for (ConsumerRecord<String, T> r : consumer.poll(Duration.ofMillis(200))) {
                    stamps.check(r.headers(), r.topic() + "-" + r.partition() + "@" + r.offset());
                    values.add(r.value());
                }
            }
        }
        assertTrue(values.size() >= Math.min(expected, 1) || expected == 0);
        return values;
    }
}
