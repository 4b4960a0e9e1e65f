package org.winnow.kafka;

import static org.winnow.geometry.Checks.requireArgument;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.HashMap;
import java.util.Map;
import java.util.Objects;
import java.util.Properties;
import java.util.Set;
import java.util.TreeMap;
import java.util.regex.Pattern;

/**
 * How a stage reaches the cluster: the bootstrap address, the client properties passed through from a
 * {@code --kafka-config} file (TLS, SASL, tuning), and how long to wait for a first answer before giving
 * up with a one-line refusal.
 *
 * <p>The pass-through file may not set what each stage sets itself to keep exactly-once delivery
 * (serialisers, transactional ids, isolation level, offset commits, group ids) nor the bootstrap address,
 * which has one source only: the {@code --kafka} option.
 */
public record KafkaSettings(String bootstrap, Map<String, String> clientProperties, Duration connectTimeout) {
    /** Wait this long for a broker to answer before refusing; short, because a wrong address never will. */
    public static final Duration DEFAULT_CONNECT_TIMEOUT = Duration.ofSeconds(5);

    private static final Pattern HOST_PORT = Pattern.compile("[A-Za-z0-9._\\-]+:(\\d{1,5})|\\[[0-9A-Fa-f:.]+]:(\\d{1,5})");

    /** Keys the stages own; a pass-through file setting one would break delivery guarantees or confuse. */
    static final Set<String> RESERVED = Set.of(
            "bootstrap.servers", "key.serializer", "value.serializer", "key.deserializer", "value.deserializer",
            "transactional.id", "isolation.level", "enable.auto.commit", "enable.idempotence", "group.id",
            "group.instance.id", "auto.offset.reset");

    public KafkaSettings {
        Objects.requireNonNull(bootstrap, "bootstrap");
        Objects.requireNonNull(clientProperties, "clientProperties");
        Objects.requireNonNull(connectTimeout, "connectTimeout");
        requireBootstrap(bootstrap);
        for (String key : clientProperties.keySet()) {
            requireArgument(!RESERVED.contains(key),
                    "client property '%s' is set by winnow itself and may not be overridden", key);
        }
        requireArgument(!connectTimeout.isNegative() && !connectTimeout.isZero(),
                "connect timeout must be positive: %s", connectTimeout);
        clientProperties = Map.copyOf(new TreeMap<>(clientProperties));
    }

    /** Plain settings: no pass-through properties, the default connect timeout. */
    public static KafkaSettings of(String bootstrap) {
        return new KafkaSettings(bootstrap, Map.of(), DEFAULT_CONNECT_TIMEOUT);
    }

    /** Settings with the client properties read from {@code clientConfig}, a Java properties file. */
    public static KafkaSettings of(String bootstrap, Path clientConfig) {
        return new KafkaSettings(bootstrap, readProperties(clientConfig), DEFAULT_CONNECT_TIMEOUT);
    }

    /** The same settings with another connect timeout. */
    public KafkaSettings withConnectTimeout(Duration timeout) {
        return new KafkaSettings(bootstrap, clientProperties, timeout);
    }

    /** Properties common to every client: the pass-through ones plus the bootstrap address. */
    public Map<String, Object> common() {
        Map<String, Object> p = new HashMap<>(clientProperties);
        p.put("bootstrap.servers", bootstrap);
        return p;
    }

    /** Reads a {@code --kafka-config} file; a missing or unreadable file is refused naming the path. */
    static Map<String, String> readProperties(Path file) {
        Objects.requireNonNull(file, "clientConfig");
        Properties p = new Properties();
        try (Reader in = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            p.load(in);
        } catch (NoSuchFileException e) {
            throw new IllegalArgumentException("Kafka client config " + file + ": no such file");
        } catch (IOException | IllegalArgumentException e) {
            throw new IllegalArgumentException("Kafka client config " + file + ": cannot read: " + e.getMessage());
        }
        Map<String, String> values = new TreeMap<>();
        for (String key : p.stringPropertyNames()) {
            requireArgument(!RESERVED.contains(key),
                    "Kafka client config %s sets '%s', which winnow sets itself", file, key);
            values.put(key, p.getProperty(key).trim());
        }
        return values;
    }

    private static void requireBootstrap(String bootstrap) {
        requireArgument(!bootstrap.isBlank(), "Kafka bootstrap address must be HOST:PORT[,HOST:PORT...]: '%s'",
                bootstrap);
        for (String part : bootstrap.split(",", -1)) {
            var m = HOST_PORT.matcher(part.trim());
            requireArgument(m.matches(), "Kafka bootstrap address must be HOST:PORT[,HOST:PORT...]: '%s'", bootstrap);
            int port = Integer.parseInt(m.group(1) != null ? m.group(1) : m.group(2));
            requireArgument(port >= 1 && port <= 65535, "Kafka port must be in 1..65535: '%s'", part.trim());
        }
    }
}
