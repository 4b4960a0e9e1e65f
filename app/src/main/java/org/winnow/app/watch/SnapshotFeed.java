package org.winnow.app.watch;

import java.time.Duration;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.apache.kafka.common.serialization.StringDeserializer;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.WireFormatException;
import org.winnow.kafka.WireHeaders;

/**
 * Reads a run's metrics topic from its beginning into a {@link ClusterView}. A record stamped with another
 * run, or one that does not decode, is refused: counted and named in the view, never added to it.
 */
final class SnapshotFeed implements AutoCloseable {
    private final KafkaConsumer<String, byte[]> consumer;
    private final TopicPartition partition;
    private final WireHeaders stamps;
    private final ClusterView view;

    SnapshotFeed(KafkaSettings settings, RunTopics run, ClusterView view) {
        Map<String, Object> p = new HashMap<>(settings.common());
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, false);
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        this.consumer = new KafkaConsumer<>(p, new StringDeserializer(), new ByteArrayDeserializer());
        this.partition = new TopicPartition(run.metrics(), 0);
        this.stamps = WireHeaders.forRun(run);
        this.view = view;
        consumer.assign(List.of(partition));
        consumer.seekToBeginning(List.of(partition));
    }

    /** Takes what arrives within {@code wait}; returns how many records were read. */
    int poll(Duration wait) {
        int n = 0;
        for (ConsumerRecord<String, byte[]> r : consumer.poll(wait)) {
            n++;
            String where = r.topic() + "-" + r.partition() + "@" + r.offset();
            try {
                stamps.check(r.headers(), where);
                view.accept(MetricsPublisher.decode(r.value()));
            } catch (ClusterRefusedException | WireFormatException | IllegalArgumentException e) {
                view.refused(e.getMessage());
            }
        }
        return n;
    }

    /** Reads everything on the topic now, for a one-off view. */
    void readToEnd(Duration timeout) {
        long end = consumer.endOffsets(List.of(partition)).get(partition);
        long deadline = System.nanoTime() + timeout.toNanos();
        while (consumer.position(partition) < end && System.nanoTime() < deadline) {
            poll(Duration.ofMillis(200));
        }
    }

    @Override
    public void close() {
        consumer.close(org.apache.kafka.clients.consumer.CloseOptions.timeout(Duration.ofSeconds(2)));
    }
}
