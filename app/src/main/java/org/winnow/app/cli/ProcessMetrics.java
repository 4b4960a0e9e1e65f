package org.winnow.app.cli;

import io.micrometer.core.instrument.binder.jvm.JvmGcMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmMemoryMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmThreadMetrics;
import io.micrometer.core.instrument.binder.system.ProcessorMetrics;
import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.io.IOException;
import java.util.OptionalInt;

/**
 * The meters of one winnow process (scan or a cluster stage): a Prometheus registry with the JVM's own
 * meters bound, served on 127.0.0.1 when a port is given.
 */
public final class ProcessMetrics implements AutoCloseable {
    private final PrometheusMeterRegistry registry;
    private final JvmGcMetrics gc;
    private final MetricsServer server;

    private ProcessMetrics(PrometheusMeterRegistry registry, JvmGcMetrics gc, MetricsServer server) {
        this.registry = registry;
        this.gc = gc;
        this.server = server;
    }

    /**
     * Binds the JVM meters and, when {@code port} is not null, serves them on http://127.0.0.1:port/metrics
     * (0 picks a free port).
     */
    public static ProcessMetrics open(Integer port) throws IOException {
        PrometheusMeterRegistry registry = new PrometheusMeterRegistry(PrometheusConfig.DEFAULT);
        new JvmMemoryMetrics().bindTo(registry);
        new JvmThreadMetrics().bindTo(registry);
        new ProcessorMetrics().bindTo(registry);
        JvmGcMetrics gc = new JvmGcMetrics();
        gc.bindTo(registry);
        try {
            return new ProcessMetrics(registry, gc, port == null ? null : new MetricsServer(registry, port));
        } catch (IOException e) {
            gc.close();
            throw new IOException("--metrics-port " + port + ": cannot serve on 127.0.0.1 (" + e.getMessage() + ")", e);
        }
    }

    public PrometheusMeterRegistry registry() {
        return registry;
    }

    /** The port served, when serving. */
    public OptionalInt port() {
        return server == null ? OptionalInt.empty() : OptionalInt.of(server.port());
    }

    @Override
    public void close() {
        if (server != null) {
            server.close();
        }
        gc.close();
    }
}
