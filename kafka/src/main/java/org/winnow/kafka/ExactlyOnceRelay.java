package org.winnow.kafka;

import java.time.Duration;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.concurrent.atomic.AtomicBoolean;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.ConsumerRecords;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.errors.RecordDeserializationException;
import org.apache.kafka.common.errors.WakeupException;
import org.apache.kafka.common.serialization.Deserializer;
import org.apache.kafka.common.serialization.Serializer;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.apache.kafka.common.serialization.StringSerializer;

/**
 * Kafka's exactly-once read-process-write loop: consume a batch of committed input in a consumer group,
 * turn each record into output records, and commit the outputs together with the input offsets in one
 * transaction. A process killed at any point leaves either the whole batch (outputs and offsets) or none
 * of it; whoever takes over its partitions resumes at the last committed offset.
 *
 * <p>Every failure that is not a refusal (a broker restarted or unreachable for a while, a transaction
 * fenced after a rebalance) aborts the batch, replaces the producer, rewinds the consumer to the group's
 * committed offsets and goes on. A {@link ClusterRefusedException} from the processor or the input check
 * aborts the batch and ends the loop: the stage must stop rather than count a foreign record.
 *
 * <p>One relay is one thread: {@link #run} is called once, and the clients are closed on that thread when it
 * returns; {@link #stop} and {@link #close} may be called from any thread.
 */
public final class ExactlyOnceRelay<I, O> implements AutoCloseable {
    /**
     * Turns one input record into zero or more outputs, sent through {@code out}. Called on the relay's
     * thread, inside the batch's transaction; it must not keep the emitter.
     */
    @FunctionalInterface
    public interface Processor<I, O> {
        void process(ConsumerRecord<String, I> record, Emitter<O> out);
    }

    /** Sends outputs into the current transaction, stamped for the run. */
    public interface Emitter<O> {
        /** Sends to the partition Kafka picks for {@code key}. */
        void send(String key, O value);

        /** Sends to a given partition of the output topic (for control records every reader must see). */
        void sendToPartition(int partition, String key, O value);
    }

    /** Hears about committed and aborted batches, on the relay's thread. */
    public interface Listener {
        Listener NONE = new Listener() {
        };

        default void committed(int inputs, int outputs) {
        }

        default void aborted(RuntimeException cause) {
        }
    }

    /**
     * Where the relay reads and writes and as whom. {@code instanceId} makes the transactional id
     * {@code groupId-instanceId}: an instance restarted under the same id fences its killed predecessor at
     * once instead of waiting for the predecessor's transaction to time out.
     */
    public record Options(String inputTopic, String outputTopic, String groupId, String instanceId,
            int maxPollRecords, Duration pollTimeout, Duration transactionTimeout) {
        public Options {
            Objects.requireNonNull(inputTopic, "inputTopic");
            Objects.requireNonNull(outputTopic, "outputTopic");
            Objects.requireNonNull(groupId, "groupId");
            Objects.requireNonNull(instanceId, "instanceId");
            org.winnow.geometry.Checks.requireArgument(maxPollRecords >= 1,
                    "max poll records must be positive: %s", maxPollRecords);
            Objects.requireNonNull(pollTimeout, "pollTimeout");
            Objects.requireNonNull(transactionTimeout, "transactionTimeout");
        }

        /** Defaults: batches of up to 2,000 records, 10 s transaction timeout. */
        public static Options of(String inputTopic, String outputTopic, String groupId, String instanceId) {
            return new Options(inputTopic, outputTopic, groupId, instanceId, 2000, Duration.ofMillis(200),
                    Duration.ofSeconds(10));
        }
    }

    private final KafkaSettings settings;
    private final Options options;
    private final Serializer<O> outputSerializer;
    private final WireHeaders inputStamps;
    private final WireHeaders outputStamps;
    private final Processor<I, O> processor;
    private final Listener listener;
    private final KafkaConsumer<String, I> consumer;
    private final AtomicBoolean running = new AtomicBoolean(true);
    private final AtomicBoolean started = new AtomicBoolean(false);
    private KafkaProducer<String, O> producer;

    public ExactlyOnceRelay(KafkaSettings settings, Options options, Deserializer<I> inputDeserializer,
            Serializer<O> outputSerializer, WireHeaders inputStamps, WireHeaders outputStamps,
            Processor<I, O> processor, Listener listener) {
        this.settings = Objects.requireNonNull(settings, "settings");
        this.options = Objects.requireNonNull(options, "options");
        this.outputSerializer = Objects.requireNonNull(outputSerializer, "outputSerializer");
        this.inputStamps = Objects.requireNonNull(inputStamps, "inputStamps");
        this.outputStamps = Objects.requireNonNull(outputStamps, "outputStamps");
        this.processor = Objects.requireNonNull(processor, "processor");
        this.listener = Objects.requireNonNull(listener, "listener");
        this.consumer = new KafkaConsumer<>(consumerProperties(settings, options), new StringDeserializer(),
                Objects.requireNonNull(inputDeserializer, "inputDeserializer"));
    }

    /** Consumer settings shared by every transactional reader of a run. */
    static Map<String, Object> consumerProperties(KafkaSettings settings, Options options) {
        Map<String, Object> p = new HashMap<>(settings.common());
        p.put(ConsumerConfig.GROUP_ID_CONFIG, options.groupId());
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, false);
        p.put(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        p.put(ConsumerConfig.MAX_POLL_RECORDS_CONFIG, options.maxPollRecords());
        // A killed member's partitions move to the survivors after this long, not after the 45 s default.
        p.putIfAbsent(ConsumerConfig.SESSION_TIMEOUT_MS_CONFIG, 6000);
        p.putIfAbsent(ConsumerConfig.HEARTBEAT_INTERVAL_MS_CONFIG, 1500);
        p.put(ConsumerConfig.CLIENT_ID_CONFIG, options.groupId() + "-" + options.instanceId() + "-in");
        return p;
    }

    /** Producer settings for a transactional writer of a run. */
    static Map<String, Object> producerProperties(KafkaSettings settings, String transactionalId,
            Duration transactionTimeout) {
        Map<String, Object> p = new HashMap<>(settings.common());
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, transactionalId);
        p.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, true);
        p.put(ProducerConfig.ACKS_CONFIG, "all");
        p.put(ProducerConfig.TRANSACTION_TIMEOUT_CONFIG, (int) transactionTimeout.toMillis());
        p.putIfAbsent(ProducerConfig.LINGER_MS_CONFIG, 5);
        p.putIfAbsent(ProducerConfig.BATCH_SIZE_CONFIG, 262_144);
        p.putIfAbsent(ProducerConfig.COMPRESSION_TYPE_CONFIG, "lz4");
        p.put(ProducerConfig.CLIENT_ID_CONFIG, transactionalId + "-out");
        return p;
    }

    /**
     * Runs until {@link #stop} is called or a refusal ends it.
     *
     * @throws ClusterRefusedException when a record of another run or model is met
     */
    public void run() {
        if (!started.compareAndSet(false, true)) {
            throw new IllegalStateException("a relay runs once");
        }
        try {
            loop();
        } finally {
            closeClients();
        }
    }

    private void loop() {
        consumer.subscribe(List.of(options.inputTopic()));
        while (running.get()) {
            ConsumerRecords<String, I> records;
            try {
                ensureProducer();
                if (producer == null) {
                    continue;
                }
                records = consumer.poll(options.pollTimeout());
            } catch (WakeupException e) {
                break;
            } catch (RecordDeserializationException e) {
                // Not transient: rewinding would meet the same bytes again.
                throw new ClusterRefusedException("record " + e.topicPartition() + "@" + e.offset()
                        + " cannot be decoded: " + RunAdmin.rootMessage(e), e);
            } catch (KafkaException e) {
                // A broker gone during poll, a rebalance that fenced us: rewind and try again.
                recover(e);
                continue;
            }
            if (!records.isEmpty()) {
                transact(records);
            }
        }
    }

    /** Asks {@link #run} to return after the batch in hand; safe from any thread. */
    public void stop() {
        running.set(false);
        consumer.wakeup();
    }

    /**
     * Stops the relay; a relay that never ran releases its clients here, one that ran released them when
     * {@link #run} returned.
     */
    @Override
    public void close() {
        stop();
        if (started.compareAndSet(false, true)) {
            closeClients();
        }
    }

    private void closeClients() {
        try {
            consumer.close(org.apache.kafka.clients.consumer.CloseOptions.timeout(Duration.ofSeconds(5)));
        } finally {
            closeProducer(Duration.ofSeconds(5));
        }
    }

    private void transact(ConsumerRecords<String, I> records) {
        int[] sent = new int[1];
        Emitter<O> emitter = new Emitter<>() {
            @Override
            public void send(String key, O value) {
                producer.send(stamped(new ProducerRecord<>(options.outputTopic(), key, value)));
                sent[0]++;
            }

            @Override
            public void sendToPartition(int partition, String key, O value) {
                producer.send(stamped(new ProducerRecord<>(options.outputTopic(), partition, key, value)));
                sent[0]++;
            }
        };
        try {
            producer.beginTransaction();
            Map<TopicPartition, OffsetAndMetadata> next = new HashMap<>();
            for (ConsumerRecord<String, I> r : records) {
                inputStamps.check(r.headers(), r.topic() + "-" + r.partition() + "@" + r.offset());
                processor.process(r, emitter);
                next.put(new TopicPartition(r.topic(), r.partition()), new OffsetAndMetadata(r.offset() + 1));
            }
            producer.sendOffsetsToTransaction(next, consumer.groupMetadata());
            producer.commitTransaction();
            listener.committed(records.count(), sent[0]);
        } catch (ClusterRefusedException e) {
            abortQuietly();
            throw e;
        } catch (KafkaException e) {
            recover(e);
        }
    }

    private ProducerRecord<String, O> stamped(ProducerRecord<String, O> r) {
        outputStamps.stamp(r.headers());
        return r;
    }

    /**
     * After a failed batch: the producer's state is unknown (its commit may or may not have landed), so a
     * new producer under the same transactional id settles it, and the consumer goes back to whatever
     * offsets the group committed.
     */
    private void recover(KafkaException cause) {
        listener.aborted(cause);
        closeProducer(Duration.ZERO);
        while (running.get()) {
            try {
                Set<TopicPartition> assigned = consumer.assignment();
                Map<TopicPartition, OffsetAndMetadata> committed = consumer.committed(assigned,
                        settings.connectTimeout());
                for (TopicPartition tp : assigned) {
                    OffsetAndMetadata at = committed.get(tp);
                    if (at == null) {
                        consumer.seekToBeginning(List.of(tp));
                    } else {
                        consumer.seek(tp, at.offset());
                    }
                }
                return;
            } catch (WakeupException e) {
                return;
            } catch (KafkaException e) {
                pause();
            }
        }
    }

    private void ensureProducer() {
        if (producer != null) {
            return;
        }
        KafkaProducer<String, O> p = new KafkaProducer<>(producerProperties(settings,
                options.groupId() + "-" + options.instanceId(), options.transactionTimeout()),
                new StringSerializer(), outputSerializer);
        try {
            p.initTransactions();
            producer = p;
        } catch (KafkaException e) {
            p.close(Duration.ZERO);
            listener.aborted(e);
            pause();
        }
    }

    private void abortQuietly() {
        try {
            producer.abortTransaction();
        } catch (KafkaException e) {
            closeProducer(Duration.ZERO);
        }
    }

    private void closeProducer(Duration timeout) {
        if (producer != null) {
            try {
                producer.close(timeout);
            } finally {
                producer = null;
            }
        }
    }

    private void pause() {
        try {
            Thread.sleep(250);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            running.set(false);
        }
    }
}
