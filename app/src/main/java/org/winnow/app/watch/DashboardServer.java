package org.winnow.app.watch;

import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.Map;
import java.util.Objects;
import java.util.function.Supplier;
import org.winnow.app.cli.LoopbackHttpServer.Response;
import org.winnow.app.cli.LoopbackHttpServer;

/**
 * Serves the dashboard on the loopback interface only: {@code /} is one self-contained page (inline SVG
 * charts, no external URL), {@code /state.json} the current {@link WatchState} that the page polls.
 */
public final class DashboardServer implements AutoCloseable {
    /** The page, a class-path resource beside this class. */
    static final String PAGE = "dashboard.html";

    private final LoopbackHttpServer server;

    /** Starts serving {@code state} on 127.0.0.1:{@code port} (0 picks a free port). */
    public DashboardServer(Supplier<WatchState> state, int port) throws IOException {
        Objects.requireNonNull(state, "state");
        byte[] page = page();
        ObjectMapper json = new ObjectMapper();
        server = new LoopbackHttpServer(port, Map.of(
                "/", path -> path.equals("/") ? Response.ok("text/html; charset=utf-8", page)
                        : new Response(404, "text/plain; charset=utf-8", "not found\n".getBytes(StandardCharsets.UTF_8)),
                "/state.json", path -> Response.ok("application/json", json.writeValueAsBytes(state.get()))));
    }

    /** The port actually bound. */
    public int port() {
        return server.port();
    }

    @Override
    public void close() {
        server.close();
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
