package org.winnow.kafkatestkit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.Set;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.apache.kafka.common.serialization.StringSerializer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;

/**
 * The test broker is a real one: transactions work on it (they need the single-node transaction log
 * settings), aborted writes stay invisible to read_committed readers, and committed data survives a
 * broker restart on the same log.
 */
@KafkaBroker
@Timeout(120)
class EmbeddedKafkaBrokerTest {
    private final EmbeddedKafkaBroker broker;

    EmbeddedKafkaBrokerTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Test
    void committedTransactionsAreReadAndAbortedOnesAreNotEvenAfterARestart() throws Exception {
        try (Admin admin = Admin.create(Map.of("bootstrap.servers", broker.bootstrapServers()))) {
            admin.createTopics(List.of(new NewTopic("t", 1, (short) 1))).all().get();
        }
        try (KafkaProducer<String, String> producer = producer()) {
            producer.initTransactions();
            producer.beginTransaction();
            producer.send(new ProducerRecord<>("t", "k1", "kept"));
            producer.commitTransaction();
            producer.beginTransaction();
            producer.send(new ProducerRecord<>("t", "k2", "dropped"));
            producer.flush();
            producer.abortTransaction();
            producer.beginTransaction();
            producer.send(new ProducerRecord<>("t", "k3", "kept too"));
            producer.commitTransaction();
        }
        assertEquals(List.of("kept", "kept too"), readAll("t", 2));

        broker.restart();
        assertTrue(broker.isRunning());
        assertEquals(List.of("kept", "kept too"), readAll("t", 2));
    }

    @Test
    void sharesOneBrokerAcrossTheClassesTests(EmbeddedKafkaBroker parameter) {
        assertTrue(parameter == broker, "the extension hands every test the same broker");
        assertFalse(broker.bootstrapServers().isBlank());
    }

    private KafkaProducer<String, String> producer() {
        Properties p = new Properties();
        p.put(ProducerConfig.BOOTSTRAP_SERVERS_CONFIG, broker.bootstrapServers());
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, "kit-test");
        return new KafkaProducer<>(p, new StringSerializer(), new StringSerializer());
    }

    private List<String> readAll(String topic, int expected) {
        Properties p = new Properties();
        p.put(ConsumerConfig.BOOTSTRAP_SERVERS_CONFIG, broker.bootstrapServers());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        List<String> values = new ArrayList<>();
        try (KafkaConsumer<String, String> consumer =
                new KafkaConsumer<>(p, new StringDeserializer(), new StringDeserializer())) {
            consumer.assign(Set.of(new org.apache.kafka.common.TopicPartition(topic, 0)));
            long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
            // Poll past the expected count once more, so a visible aborted record would be caught.
            int emptyPolls = 0;
            while (System.nanoTime() < deadline && (values.size() < expected || emptyPolls < 2)) {
                var records = consumer.poll(Duration.ofMillis(200));
                if (records.isEmpty()) {
                    emptyPolls++;
                }
                for (ConsumerRecord<String, String> r : records) {
                    values.add(r.value());
                }
            }
        }
        return values;
    }
}
