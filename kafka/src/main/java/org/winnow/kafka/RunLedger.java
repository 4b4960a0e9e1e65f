package org.winnow.kafka;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.function.Function;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.apache.kafka.common.serialization.StringSerializer;

/**
 * The run's descriptor topic read as an append-only log of {@code key -> text} entries. The topic has one
 * partition, so its order is total: for each key the first entry wins, which settles races between stages
 * that start at once (two producers creating the run, two scorers claiming a model) without any lock.
 */
final class RunLedger implements AutoCloseable {
    static final String RUN_KEY = "run";
    static final String MODEL_KEY = "model";

    private final KafkaSettings settings;
    private final RunTopics run;
    private final TopicPartition partition;
    private final KafkaConsumer<String, String> consumer;

    RunLedger(KafkaSettings settings, RunTopics run) {
        this.settings = settings;
        this.run = run;
        this.partition = new TopicPartition(run.descriptor(), 0);
        Map<String, Object> p = RunAdmin.timeouts(settings);
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, false);
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        this.consumer = new KafkaConsumer<>(p, new StringDeserializer(), new StringDeserializer());
        consumer.assign(List.of(partition));
    }

    /** The first entry under {@code key}, or null. */
    String first(String key) {
        for (ConsumerRecord<String, String> r : readAll()) {
            if (key.equals(r.key())) {
                return r.value();
            }
        }
        return null;
    }

    /**
     * The first entry under {@code key}; when there is none, appends {@code proposal} and reads again (the
     * first entry may then be another stage's, appended a moment earlier).
     */
    <T> T settle(String key, String proposal, Function<String, T> decode) {
        String existing = first(key);
        if (existing == null) {
            append(key, proposal);
            existing = first(key);
            if (existing == null) {
                throw new ClusterRefusedException("the entry appended to " + run.descriptor()
                        + " is not readable back; is the topic being deleted?");
            }
        }
        return decode.apply(existing);
    }

    private void append(String key, String value) {
        Map<String, Object> p = RunAdmin.timeouts(settings);
        p.put(ProducerConfig.ACKS_CONFIG, "all");
        p.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, true);
        p.put(ProducerConfig.DELIVERY_TIMEOUT_MS_CONFIG, (int) settings.connectTimeout().toMillis() * 6);
        try (KafkaProducer<String, String> producer =
                new KafkaProducer<>(p, new StringSerializer(), new StringSerializer())) {
            ProducerRecord<String, String> r = new ProducerRecord<>(run.descriptor(), 0, key, value);
            WireHeaders.forRun(run).stamp(r.headers());
            producer.send(r).get(settings.connectTimeout().toMillis() * 6, TimeUnit.MILLISECONDS);
        } catch (ExecutionException | TimeoutException e) {
            throw new ClusterRefusedException("cannot write to " + run.descriptor() + " on " + settings.bootstrap()
                    + ": " + RunAdmin.rootMessage(e), e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new ClusterRefusedException("interrupted while writing to " + run.descriptor(), e);
        }
    }

    private List<ConsumerRecord<String, String>> readAll() {
        Duration timeout = settings.connectTimeout().multipliedBy(2);
        long end;
        try {
            end = consumer.endOffsets(List.of(partition), timeout).get(partition);
        } catch (org.apache.kafka.common.errors.TimeoutException e) {
            throw RunAdmin.unreachable(settings, e);
        }
        consumer.seekToBeginning(List.of(partition));
        List<ConsumerRecord<String, String>> records = new ArrayList<>();
        WireHeaders stamps = WireHeaders.forRun(run);
        long deadline = System.nanoTime() + timeout.toNanos();
        while (consumer.position(partition, timeout) < end) {
            if (System.nanoTime() > deadline) {
                throw new ClusterRefusedException("reading " + run.descriptor() + " on " + settings.bootstrap()
                        + " timed out");
            }
            for (ConsumerRecord<String, String> r : consumer.poll(Duration.ofMillis(100))) {
                stamps.check(r.headers(), r.topic() + "-" + r.partition() + "@" + r.offset());
                records.add(r);
            }
        }
        return records;
    }

    @Override
    public void close() {
        consumer.close(org.apache.kafka.clients.consumer.CloseOptions.timeout(Duration.ofSeconds(1)));
    }

}
