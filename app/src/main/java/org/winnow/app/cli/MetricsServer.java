package org.winnow.app.cli;

import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.Map;

/** Serves {@code /metrics} in the Prometheus text format on the loopback interface only. */
public final class MetricsServer implements AutoCloseable {
    private final LoopbackHttpServer server;

    /** Starts serving {@code registry} on 127.0.0.1:{@code port} (0 picks a free port). */
    public MetricsServer(PrometheusMeterRegistry registry, int port) throws IOException {
        server = new LoopbackHttpServer(port, Map.of("/metrics", path -> LoopbackHttpServer.Response.ok(
                "text/plain; version=0.0.4; charset=utf-8", registry.scrape().getBytes(StandardCharsets.UTF_8))));
    }

    /** The port actually bound. */
    public int port() {
        return server.port();
    }

    @Override
    public void close() {
        server.close();
    }
}
