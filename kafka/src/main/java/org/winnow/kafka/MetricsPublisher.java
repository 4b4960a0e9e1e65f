package org.winnow.kafka;

import java.time.Duration;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.Supplier;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.serialization.ByteArraySerializer;
import org.apache.kafka.common.serialization.StringSerializer;
import org.winnow.geometry.Checks;
import org.winnow.pipeline.metrics.MetricSnapshot;

/**
 * Publishes a stage's {@link MetricSnapshot} to its run's metrics topic every period, and once more on
 * close. Snapshots are Kryo records ({@link WireTypes#metrics()}) stamped with the run like every other
 * record, keyed {@code stage/instance}.
 *
 * <p>Metrics must never stop or slow a stage: the producer is not transactional, waits for one
 * acknowledgement only, and a snapshot that cannot be sent is dropped and counted ({@link #dropped()}).
 */
public final class MetricsPublisher implements AutoCloseable {
    private static final KryoCodec CODEC = WireTypes.metrics().build();

    private final RunTopics run;
    private final Supplier<MetricSnapshot> source;
    private final KafkaProducer<String, byte[]> producer;
    private final WireHeaders stamps;
    private final ScheduledExecutorService timer;
    private final AtomicLong sent = new AtomicLong();
    private final AtomicLong dropped = new AtomicLong();
    private final Duration closeTimeout;
    private final java.util.concurrent.atomic.AtomicBoolean closed = new java.util.concurrent.atomic.AtomicBoolean();

    private MetricsPublisher(KafkaSettings settings, RunTopics run, Supplier<MetricSnapshot> source, Duration period) {
        this.run = run;
        this.source = source;
        this.stamps = WireHeaders.forRun(run);
        this.closeTimeout = settings.connectTimeout();
        Map<String, Object> p = RunAdmin.timeouts(settings);
        p.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, false);
        p.put(ProducerConfig.ACKS_CONFIG, "1");
        p.put(ProducerConfig.MAX_BLOCK_MS_CONFIG, (int) settings.connectTimeout().toMillis());
        p.put(ProducerConfig.DELIVERY_TIMEOUT_MS_CONFIG, (int) settings.connectTimeout().toMillis() * 2);
        p.put(ProducerConfig.LINGER_MS_CONFIG, 0);
        this.producer = new KafkaProducer<>(p, new StringSerializer(), new ByteArraySerializer());
        this.timer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "winnow-metrics-" + run.runId());
            t.setDaemon(true);
            return t;
        });
        long ms = period.toMillis();
        timer.scheduleAtFixedRate(this::publishQuietly, ms, ms, TimeUnit.MILLISECONDS);
    }

    /**
     * Starts publishing the snapshots of {@code source} to {@code run}'s metrics topic every {@code period}.
     *
     * @param source called from the publisher's own thread; must be safe to call from there
     */
    public static MetricsPublisher start(KafkaSettings settings, RunTopics run, Supplier<MetricSnapshot> source,
            Duration period) {
        Objects.requireNonNull(settings, "settings");
        Objects.requireNonNull(run, "run");
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(period, "period");
        Checks.requireArgument(period.toMillis() >= 10, "metrics period must be at least 10 ms: %s", period);
        return new MetricsPublisher(settings, run, source, period);
    }

    /** Snapshots handed to Kafka and acknowledged. */
    public long sent() {
        return sent.get();
    }

    /** Snapshots that could not be sent. */
    public long dropped() {
        return dropped.get();
    }

    private void publishQuietly() {
        try {
            publish();
        } catch (RuntimeException e) {
            dropped.incrementAndGet();
        }
    }

    private void publish() {
        MetricSnapshot s = source.get();
        if (!run.runId().equals(s.runId())) {
            throw new IllegalStateException("a snapshot of run '" + s.runId() + "' handed to the publisher of run '"
                    + run.runId() + "'");
        }
        ProducerRecord<String, byte[]> r = new ProducerRecord<>(run.metrics(), 0, s.timestampMillis(),
                s.stage() + "/" + s.instance(), CODEC.encode(s));
        stamps.stamp(r.headers());
        try {
            producer.send(r, (meta, e) -> (e == null ? sent : dropped).incrementAndGet());
        } catch (KafkaException e) {
            dropped.incrementAndGet();
        }
    }

    /** Publishes a last snapshot, waits for it up to the connect timeout, and stops; a second call does nothing. */
    @Override
    public void close() {
        if (!closed.compareAndSet(false, true)) {
            return;
        }
        timer.shutdown();
        try {
            timer.awaitTermination(closeTimeout.toMillis(), TimeUnit.MILLISECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        publishQuietly();
        try {
            producer.flush();
        } catch (KafkaException e) {
            dropped.incrementAndGet();
        }
        producer.close(closeTimeout);
    }

    /** Decodes a snapshot read from a metrics topic; bad bytes are refused with a {@link WireFormatException}. */
    public static MetricSnapshot decode(byte[] bytes) {
        return CODEC.decode(bytes, MetricSnapshot.class);
    }
}
