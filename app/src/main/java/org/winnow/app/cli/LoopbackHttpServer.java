package org.winnow.app.cli;

import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpServer;
import java.io.IOException;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.util.Map;
import java.util.Objects;

/**
 * An HTTP server on the loopback interface only, each path prefix answered afresh on every request: what
 * the Prometheus endpoint of every command and the dashboard of {@code winnow watch} share. Answers are
 * never cached, since each is the state of the moment.
 */
public final class LoopbackHttpServer implements AutoCloseable {
    /** One answer. */
    public record Response(int status, String contentType, byte[] body) {
        public Response {
            Objects.requireNonNull(contentType, "contentType");
            Objects.requireNonNull(body, "body");
        }

        /** A 200 answer. */
        public static Response ok(String contentType, byte[] body) {
            return new Response(200, contentType, body);
        }
    }

    /** Answers a request for {@code path} (the full request path, under the route's prefix). */
    @FunctionalInterface
    public interface Route {
        Response answer(String path) throws IOException;
    }

    private final HttpServer server;

    /** Starts serving {@code routes} (path prefix to route) on 127.0.0.1:{@code port} (0 picks a free port). */
    public LoopbackHttpServer(int port, Map<String, Route> routes) throws IOException {
        server = HttpServer.create(new InetSocketAddress("127.0.0.1", port), 0);
        routes.forEach((prefix, route) -> server.createContext(prefix,
                exchange -> send(exchange, route.answer(exchange.getRequestURI().getPath()))));
        server.start();
    }

    /** The port actually bound. */
    public int port() {
        return server.getAddress().getPort();
    }

    @Override
    public void close() {
        server.stop(0);
    }

    private static void send(HttpExchange exchange, Response r) throws IOException {
        exchange.getResponseHeaders().set("Content-Type", r.contentType());
        exchange.getResponseHeaders().set("Cache-Control", "no-store");
        exchange.sendResponseHeaders(r.status(), r.body().length);
        try (OutputStream out = exchange.getResponseBody()) {
            out.write(r.body());
        }
    }
}
