package org.winnow.app.watch;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpServer;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.net.InetSocketAddress;
import java.util.Objects;
import java.util.function.Supplier;

/**
 * Serves the dashboard on the loopback interface only: {@code /} is one self-contained page (inline SVG
 * charts, no external URL), {@code /state.json} the current {@link WatchState} that the page polls.
 */
public final class DashboardServer implements AutoCloseable {
    /** The page, a class-path resource beside this class. */
    static final String PAGE = "dashboard.html";

    private final HttpServer server;

    /** Starts serving {@code state} on 127.0.0.1:{@code port} (0 picks a free port). */
    public DashboardServer(Supplier<WatchState> state, int port) throws IOException {
        Objects.requireNonNull(state, "state");
        byte[] page = page();
        ObjectMapper json = new ObjectMapper();
        server = HttpServer.create(new InetSocketAddress("127.0.0.1", port), 0);
        server.createContext("/", exchange -> {
            if (!exchange.getRequestURI().getPath().equals("/")) {
                send(exchange, 404, "text/plain; charset=utf-8", "not found\n".getBytes());
                return;
            }
            send(exchange, 200, "text/html; charset=utf-8", page);
        });
        server.createContext("/state.json", exchange -> send(exchange, 200, "application/json",
                json.writeValueAsBytes(state.get())));
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

    private static void send(HttpExchange exchange, int status, String type, byte[] body) throws IOException {
        exchange.getResponseHeaders().set("Content-Type", type);
        exchange.getResponseHeaders().set("Cache-Control", "no-store");
        exchange.sendResponseHeaders(status, body.length);
        try (OutputStream out = exchange.getResponseBody()) {
            out.write(body);
        }
    }

    private static byte[] page() {
        try (InputStream in = DashboardServer.class.getResourceAsStream(PAGE)) {
            if (in == null) {
                throw new IllegalStateException("the dashboard page " + PAGE + " is missing from the jar");
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
