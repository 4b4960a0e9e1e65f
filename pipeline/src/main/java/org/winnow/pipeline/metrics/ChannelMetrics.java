package org.winnow.pipeline.metrics;

import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.MeterRegistry;
import java.util.function.Supplier;
import org.winnow.pipeline.channel.BoundedChannel;

/** Gauges of the in-memory hand-over: how full each channel is, and the sink's reorder buffer. */
public final class ChannelMetrics {
    /** Records held by a channel now, tagged {@value #TAG_CHANNEL}. */
    public static final String DEPTH = "winnow.channel.depth";
    /** The most a channel can hold, tagged {@value #TAG_CHANNEL}. */
    public static final String CAPACITY = "winnow.channel.capacity";
    /** Records the sink holds because an earlier seq has not arrived yet. */
    public static final String REORDER_DEPTH = "winnow.sink.reorder.depth";
    /** Tag: the channel's name. */
    public static final String TAG_CHANNEL = "channel";

    private ChannelMetrics() {}

    /** Registers the depth and capacity gauges of {@code channel}. */
    public static void bind(MeterRegistry registry, BoundedChannel<?> channel) {
        Gauge.builder(DEPTH, channel, BoundedChannel::depth).description("records held by the channel")
                .tag(TAG_CHANNEL, channel.name()).strongReference(true).register(registry);
        Gauge.builder(CAPACITY, channel, BoundedChannel::capacity).description("capacity of the channel")
                .tag(TAG_CHANNEL, channel.name()).strongReference(true).register(registry);
    }

    /** Registers the reorder-buffer gauge. */
    public static void bindReorder(MeterRegistry registry, Supplier<Number> depth) {
        Gauge.builder(REORDER_DEPTH, depth).description("records waiting for an earlier seq").strongReference(true)
                .register(registry);
    }
}
