package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.serialization.StringSerializer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.winnow.geometry.Configuration;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;

/** The read-process-write loop in this JVM: group sharing and refusals. */
@KafkaBroker
@Timeout(180)
class ExactlyOnceRelayTest {
    private final EmbeddedKafkaBroker broker;

    ExactlyOnceRelayTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    private RunTopics createRun(String id, int partitions) {
        RunTopics run = new RunTopics(id);
        try (RunAdmin admin = RunAdmin.connect(KafkaSettings.of(broker.bootstrapServers()))) {
            admin.createRun(run, TopicLayout.singleBroker(partitions), new RunDescriptor(id, Map.of()));
        }
        return run;
    }

    @Test
    void twoRelaysInOneGroupBothWorkAndTheOutputIsExactlyTheInput() throws Exception {
        RunTopics run = createRun("group-share", 4);
        AtomicLong a = new AtomicLong();
        AtomicLong b = new AtomicLong();
        ExecutorService threads = Executors.newFixedThreadPool(2);
        var relayA = RelayFixtures.relay(broker.bootstrapServers(), run, "a", counting(a));
        var relayB = RelayFixtures.relay(broker.bootstrapServers(), run, "b", counting(b));
        try {
            Future<?> fa = threads.submit(relayA::run);
            Future<?> fb = threads.submit(relayB::run);
            awaitMembers("relay-" + run.runId(), 2);
            Map<String, Configuration> written = RelayFixtures.write(broker.bootstrapServers(), run, 0, 4000, 3L);
            List<ConsumerRecord<String, String>> out = RelayFixtures.readOutput(broker.bootstrapServers(), run,
                    written.size(), Duration.ofSeconds(2), Duration.ofSeconds(60));
            relayA.stop();
            relayB.stop();
            fa.get(30, TimeUnit.SECONDS);
            fb.get(30, TimeUnit.SECONDS);

            assertEquals(written.size(), out.size(), "each input exactly once");
            Map<String, String> byKey = new HashMap<>();
            for (ConsumerRecord<String, String> r : out) {
                byKey.put(r.key(), r.value());
            }
            assertEquals(written.size(), byKey.size(), "no key twice");
            written.forEach((k, c) -> assertEquals(RelayFixtures.derive(c), byKey.get(k), k));
            assertTrue(a.get() > 0 && b.get() > 0, "both instances worked: a=" + a + " b=" + b);
            assertEquals(written.size(), a.get() + b.get());
        } finally {
            relayA.close();
            relayB.close();
            threads.shutdownNow();
        }
    }

    @Test
    void aRecordOfAnotherRunStopsTheRelayWithARefusal() throws Exception {
        RunTopics run = createRun("foreign-record", 1);
        try (KafkaProducer<String, Configuration> producer = new KafkaProducer<>(
                KafkaSettings.of(broker.bootstrapServers()).common(), new StringSerializer(),
                KryoSerde.of(RelayFixtures.CODEC, Configuration.class))) {
            var r = new ProducerRecord<>(run.candidates(), "4:5", Configuration.parse("4:5"));
            WireHeaders.forRun(new RunTopics("another-run")).stamp(r.headers());
            producer.send(r).get();
        }
        ExecutorService thread = Executors.newSingleThreadExecutor();
        try (var relay = RelayFixtures.relay(broker.bootstrapServers(), run, "x", ExactlyOnceRelay.Listener.NONE)) {
            Future<?> f = thread.submit(relay::run);
            var e = assertThrows(ExecutionException.class, () -> f.get(60, TimeUnit.SECONDS));
            assertTrue(e.getCause() instanceof ClusterRefusedException, String.valueOf(e.getCause()));
            assertTrue(e.getCause().getMessage().contains("'another-run'"), e.getCause().getMessage());
        } finally {
            thread.shutdownNow();
        }
        assertEquals(0, RelayFixtures.readOutput(broker.bootstrapServers(), run, 0, Duration.ofMillis(500),
                Duration.ofSeconds(5)).size(), "nothing was written for the refused record");
    }

    @Test
    void undecodableBytesAreRefusedNotRetriedForever() throws Exception {
        RunTopics run = createRun("garbage", 1);
        try (KafkaProducer<String, String> producer = new KafkaProducer<>(
                KafkaSettings.of(broker.bootstrapServers()).common(), new StringSerializer(), new StringSerializer())) {
            var r = new ProducerRecord<>(run.candidates(), "k", "not kryo at all");
            WireHeaders.forRun(run).stamp(r.headers());
            producer.send(r).get();
        }
        ExecutorService thread = Executors.newSingleThreadExecutor();
        try (var relay = RelayFixtures.relay(broker.bootstrapServers(), run, "x", ExactlyOnceRelay.Listener.NONE)) {
            Future<?> f = thread.submit(relay::run);
            var e = assertThrows(ExecutionException.class, () -> f.get(60, TimeUnit.SECONDS));
            assertTrue(e.getCause() instanceof ClusterRefusedException, String.valueOf(e.getCause()));
            assertTrue(e.getCause().getMessage().contains("cannot be decoded"), e.getCause().getMessage());
        } finally {
            thread.shutdownNow();
        }
    }

    private static ExactlyOnceRelay.Listener counting(AtomicLong count) {
        return new ExactlyOnceRelay.Listener() {
            @Override
            public void committed(int inputs, int outputs) {
                count.addAndGet(inputs);
            }
        };
    }

    private void awaitMembers(String group, int members) throws Exception {
        try (Admin admin = Admin.create(KafkaSettings.of(broker.bootstrapServers()).common())) {
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
            while (System.nanoTime() < deadline) {
                try {
                    var d = admin.describeConsumerGroups(List.of(group)).all().get().get(group);
                    long assigned = d.members().stream()
                            .filter(m -> !m.assignment().topicPartitions().isEmpty()).count();
                    if (assigned == members) {
                        return;
                    }
                } catch (ExecutionException e) {
                    // The group does not exist until its first member joins.
                }
                Thread.sleep(100);
            }
        }
        throw new AssertionError("group " + group + " never had " + members + " members with partitions");
    }
}
