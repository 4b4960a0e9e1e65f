package org.winnow.kafkatestkit;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Comparator;
import java.util.Map;
import java.util.Objects;
import java.util.Properties;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.stream.Stream;
import kafka.server.KafkaConfig;
import kafka.server.KafkaRaftServer;
import kafka.tools.StorageTool;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.common.Uuid;
import org.apache.kafka.common.utils.Time;

/**
 * A real single-node Kafka broker (KRaft, combined broker and controller) running inside the calling JVM.
 *
 * <p>It listens on loopback only, on two free ports picked at {@link #start}, and keeps its log in a
 * temporary directory removed by {@link #close}. {@link #restart} stops the broker and starts it again on
 * the same ports and the same log, which is what a restarted broker looks like to its clients.
 *
 * <p>Not thread-safe: one test class owns one broker, and only that class's lifecycle callbacks start
 * and stop it.
 */
public final class EmbeddedKafkaBroker implements AutoCloseable {
    private static final Duration READY_TIMEOUT = Duration.ofSeconds(60);

    private final Path logDir;
    private final int port;
    private final int controllerPort;
    private final Map<String, String> overrides;
    private KafkaRaftServer server;

    private EmbeddedKafkaBroker(Path logDir, int port, int controllerPort, Map<String, String> overrides) {
        this.logDir = logDir;
        this.port = port;
        this.controllerPort = controllerPort;
        this.overrides = Map.copyOf(overrides);
    }

    /** Formats a fresh log directory and starts the broker; returns once it answers an Admin client. */
    public static EmbeddedKafkaBroker start() {
        return start(Map.of());
    }

    /** As {@link #start()}, with broker properties that replace or add to the single-node defaults. */
    public static EmbeddedKafkaBroker start(Map<String, String> overrides) {
        Objects.requireNonNull(overrides, "overrides");
        try {
            Path dir = Files.createTempDirectory("winnow-kafka-");
            int[] ports = twoFreePorts();
            EmbeddedKafkaBroker broker = new EmbeddedKafkaBroker(dir.resolve("log"), ports[0], ports[1], overrides);
            broker.format();
            broker.startServer();
            return broker;
        } catch (IOException e) {
            throw new UncheckedIOException("cannot prepare the broker's log directory", e);
        }
    }

    /** {@code 127.0.0.1:PORT}, for {@code bootstrap.servers}. */
    public String bootstrapServers() {
        return "127.0.0.1:" + port;
    }

    /** The broker's client port. */
    public int port() {
        return port;
    }

    /** Stops the broker cleanly, keeping its log; clients see it vanish until {@link #startAgain}. */
    public void stop() {
        if (server != null) {
            server.shutdown();
            server.awaitShutdown();
            server = null;
        }
    }

    /** Starts a stopped broker again on the same ports and log. */
    public void startAgain() {
        if (server == null) {
            startServer();
        }
    }

    /** Stops and starts the broker, as an operator's restart would. */
    public void restart() {
        stop();
        startAgain();
    }

    /** Whether the broker is running. */
    public boolean isRunning() {
        return server != null;
    }

    @Override
    public void close() {
        try {
            stop();
        } finally {
            deleteRecursively(logDir.getParent());
        }
    }

    /** The single-node settings: without replication factor 1 for the transaction log, transactions never start. */
    Properties properties() {
        Properties p = new Properties();
        p.put("process.roles", "broker,controller");
        p.put("node.id", "1");
        p.put("controller.quorum.voters", "1@127.0.0.1:" + controllerPort);
        p.put("listeners", "PLAINTEXT://127.0.0.1:" + port + ",CONTROLLER://127.0.0.1:" + controllerPort);
        p.put("advertised.listeners", "PLAINTEXT://127.0.0.1:" + port);
        p.put("controller.listener.names", "CONTROLLER");
        p.put("inter.broker.listener.name", "PLAINTEXT");
        p.put("listener.security.protocol.map", "PLAINTEXT:PLAINTEXT,CONTROLLER:PLAINTEXT");
        p.put("log.dirs", logDir.toString());
        p.put("offsets.topic.replication.factor", "1");
        p.put("offsets.topic.num.partitions", "1");
        p.put("transaction.state.log.replication.factor", "1");
        p.put("transaction.state.log.min.isr", "1");
        p.put("transaction.state.log.num.partitions", "1");
        p.put("share.coordinator.state.topic.replication.factor", "1");
        p.put("share.coordinator.state.topic.min.isr", "1");
        p.put("group.initial.rebalance.delay.ms", "0");
        p.put("num.partitions", "1");
        p.put("default.replication.factor", "1");
        p.put("auto.create.topics.enable", "false");
        // Small segments and a short flush interval are not needed; a short shutdown keeps tests quick.
        p.put("controlled.shutdown.enable", "true");
        p.putAll(overrides);
        return p;
    }

    private void format() throws IOException {
        Files.createDirectories(logDir);
        Path config = logDir.getParent().resolve("server.properties");
        try (OutputStream out = Files.newOutputStream(config)) {
            properties().store(out, "winnow test broker");
        }
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        int code;
        try (PrintStream print = new PrintStream(captured, true, StandardCharsets.UTF_8)) {
            // execute() returns the exit code; main() would call System.exit.
            code = StorageTool.execute(
                    new String[] {"format", "-t", Uuid.randomUuid().toString(), "-c", config.toString()}, print);
        }
        if (code != 0) {
            throw new IllegalStateException("formatting the broker's storage failed (exit " + code + "): "
                    + captured.toString(StandardCharsets.UTF_8).trim());
        }
    }

    private void startServer() {
        KafkaRaftServer s = new KafkaRaftServer(new KafkaConfig(properties(), false), Time.SYSTEM);
        s.startup();
        server = s;
        awaitReady();
    }

    private void awaitReady() {
        Properties p = new Properties();
        p.put(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, bootstrapServers());
        long deadline = System.nanoTime() + READY_TIMEOUT.toNanos();
        try (Admin admin = Admin.create(p)) {
            while (true) {
                try {
                    if (!admin.describeCluster().nodes().get(5, TimeUnit.SECONDS).isEmpty()) {
                        return;
                    }
                } catch (ExecutionException | TimeoutException e) {
                    if (System.nanoTime() > deadline) {
                        throw new IllegalStateException("broker at " + bootstrapServers() + " not ready within "
                                + READY_TIMEOUT.toSeconds() + " s", e);
                    }
                }
                Thread.sleep(50);
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while waiting for the broker", e);
        }
    }

    /**
     * Two distinct free ports for the client and controller listeners. Both sockets are held open together:
     * asked one after the other, the system may hand back the same port twice and the broker then fails to bind.
     */
    private static int[] twoFreePorts() throws IOException {
        try (ServerSocket a = new ServerSocket(0, 1, InetAddress.getLoopbackAddress());
                ServerSocket b = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            a.setReuseAddress(true);
            b.setReuseAddress(true);
            return new int[] {a.getLocalPort(), b.getLocalPort()};
        }
    }

    private static void deleteRecursively(Path root) {
        if (root == null || !Files.exists(root)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(root)) {
            paths.sorted(Comparator.reverseOrder()).forEach(path -> path.toFile().delete());
        } catch (IOException e) {
            throw new UncheckedIOException("cannot remove the broker's log directory " + root, e);
        }
    }
}
