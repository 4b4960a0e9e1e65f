package org.winnow.kafka;

import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.SplittableRandom;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.apache.kafka.common.serialization.StringSerializer;
import org.winnow.geometry.Configuration;

/**
 * The relay under test turns each configuration into a line of text derived from it; the tests write
 * keyed configurations and check that every key comes out exactly once with the right text.
 */
final class RelayFixtures {
    static final String MODEL = "0123456789abcdef0123456789abcdef0123456789abcdef0123456789abcdef";
    static final KryoCodec CODEC = WireTypes.base().build();

    private RelayFixtures() {
    }

    /** What the relay writes for {@code c}: a function of the value only, so replays are detectable. */
    static String derive(Configuration c) {
        int sum = 0;
        for (int j = 0; j < c.cols(); j++) {
            sum += c.colSum(j);
        }
        return c.toText() + " total-degree=" + sum;
    }

    static ExactlyOnceRelay<Configuration, String> relay(String bootstrap, RunTopics run, String instance,
            ExactlyOnceRelay.Listener listener) {
        return relay(bootstrap, run, instance, listener, 0L);
    }

    static ExactlyOnceRelay<Configuration, String> relay(String bootstrap, RunTopics run, String instance,
            long nanosPerRecord) {
        return relay(bootstrap, run, instance, ExactlyOnceRelay.Listener.NONE, nanosPerRecord);
    }

    private static ExactlyOnceRelay<Configuration, String> relay(String bootstrap, RunTopics run, String instance,
            ExactlyOnceRelay.Listener listener, long nanosPerRecord) {
        return new ExactlyOnceRelay<>(KafkaSettings.of(bootstrap),
                ExactlyOnceRelay.Options.of(run.candidates(), run.scored(), "relay-" + run.runId(), instance),
                KryoSerde.of(CODEC, Configuration.class), new StringSerializer(), WireHeaders.forRun(run),
                WireHeaders.forRunAndModel(run, MODEL),
                (record, out) -> {
                    if (nanosPerRecord > 0) {
                        java.util.concurrent.locks.LockSupport.parkNanos(nanosPerRecord);
                    }
                    out.send(record.key(), derive(record.value()));
                }, listener);
    }

    /** Writes {@code count} keyed random configurations, keys {@code first..first+count-1}, committed. */
    static Map<String, Configuration> write(String bootstrap, RunTopics run, int first, int count, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        Map<String, Configuration> written = new HashMap<>();
        Map<String, Object> p = new HashMap<>(KafkaSettings.of(bootstrap).common());
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, "writer-" + run.runId());
        p.put(ProducerConfig.LINGER_MS_CONFIG, 5);
        try (KafkaProducer<String, Configuration> producer = new KafkaProducer<>(p, new StringSerializer(),
                KryoSerde.of(CODEC, Configuration.class))) {
            producer.initTransactions();
            producer.beginTransaction();
            WireHeaders stamps = WireHeaders.forRun(run);
            for (int i = first; i < first + count; i++) {
                Configuration c = KryoCodecTest.randomConfiguration(random);
                String key = String.format("c%07d", i);
                ProducerRecord<String, Configuration> r = new ProducerRecord<>(run.candidates(), key, c);
                stamps.stamp(r.headers());
                producer.send(r);
                written.put(key, c);
            }
            producer.commitTransaction();
        }
        return written;
    }

    /**
     * Reads the whole output topic (committed records only) until {@code expected} records arrived and then
     * {@code quiet} passed with nothing more, or {@code deadline} passed.
     */
    static List<ConsumerRecord<String, String>> readOutput(String bootstrap, RunTopics run, int expected,
            Duration quiet, Duration deadline) {
        Properties p = new Properties();
        p.putAll(KafkaSettings.of(bootstrap).common());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        List<ConsumerRecord<String, String>> out = new ArrayList<>();
        try (KafkaConsumer<String, String> consumer =
                new KafkaConsumer<>(p, new StringDeserializer(), new StringDeserializer())) {
            List<TopicPartition> tps = new ArrayList<>();
            int n = consumer.partitionsFor(run.scored()).size();
            for (int i = 0; i < n; i++) {
                tps.add(new TopicPartition(run.scored(), i));
            }
            consumer.assign(tps);
            consumer.seekToBeginning(tps);
            WireHeaders stamps = WireHeaders.forRunAndModel(run, MODEL);
            long end = System.nanoTime() + deadline.toNanos();
            long lastNew = System.nanoTime();
            while (System.nanoTime() < end) {
                var records = consumer.poll(Duration.ofMillis(200));
                for (ConsumerRecord<String, String> r : records) {
                    stamps.check(r.headers(), r.topic() + "-" + r.partition() + "@" + r.offset());
                    out.add(r);
                    lastNew = System.nanoTime();
                }
                if (out.size() >= expected && System.nanoTime() - lastNew > quiet.toNanos()) {
                    break;
                }
            }
        }
        return out;
    }
}
