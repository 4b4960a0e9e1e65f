package org.winnow.app.watch;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.ListOffsetsResult;
import org.apache.kafka.clients.admin.OffsetSpec;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.TopicPartition;
import org.winnow.kafka.RunTopics;

/**
 * Consumer lag of a run: the end offsets of the candidates and scored topics (the admin client's
 * listOffsets) minus the offsets committed by the scorers' group and by the sink's monitoring group.
 * Transaction markers take an offset each, so at rest a partition can read one above zero.
 */
final class LagProbe {
    private final Admin admin;
    private final RunTopics run;
    private final String scorerGroup;
    private final String sinkGroup;
    private final long timeoutMillis;

    LagProbe(Admin admin, RunTopics run, String scorerGroup, String sinkGroup, long timeoutMillis) {
        this.admin = admin;
        this.run = run;
        this.scorerGroup = scorerGroup;
        this.sinkGroup = sinkGroup;
        this.timeoutMillis = timeoutMillis;
    }

    /** The lag now; a figure that cannot be read (group not started, broker away) is null. */
    WatchState.Lag read() {
        return new WatchState.Lag(lag(run.candidates(), scorerGroup), lag(run.scored(), sinkGroup));
    }

    private Long lag(String topic, String group) {
        try {
            Map<TopicPartition, OffsetAndMetadata> committed = admin.listConsumerGroupOffsets(group)
                    .partitionsToOffsetAndMetadata().get(timeoutMillis, TimeUnit.MILLISECONDS);
            Map<TopicPartition, OffsetSpec> latest = new HashMap<>();
            Map<TopicPartition, OffsetSpec> earliest = new HashMap<>();
            int partitions = admin.describeTopics(List.of(topic)).allTopicNames()
                    .get(timeoutMillis, TimeUnit.MILLISECONDS).get(topic).partitions().size();
            for (int i = 0; i < partitions; i++) {
                latest.put(new TopicPartition(topic, i), OffsetSpec.latest());
                earliest.put(new TopicPartition(topic, i), OffsetSpec.earliest());
            }
            boolean any = committed.keySet().stream().anyMatch(tp -> tp.topic().equals(topic));
            if (!any) {
                return null;
            }
            Map<TopicPartition, ListOffsetsResult.ListOffsetsResultInfo> ends = admin.listOffsets(latest).all()
                    .get(timeoutMillis, TimeUnit.MILLISECONDS);
            Map<TopicPartition, ListOffsetsResult.ListOffsetsResultInfo> starts = admin.listOffsets(earliest).all()
                    .get(timeoutMillis, TimeUnit.MILLISECONDS);
            long lag = 0;
            for (TopicPartition tp : latest.keySet()) {
                OffsetAndMetadata c = committed.get(tp);
                long from = c != null ? c.offset() : starts.get(tp).offset();
                lag += Math.max(0, ends.get(tp).offset() - from);
            }
            return lag;
        } catch (ExecutionException | TimeoutException | KafkaException e) {
            return null;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return null;
        }
    }
}
