package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class KafkaSettingsTest {
    @TempDir
    Path dir;

    @Test
    void acceptsHostPortLists() {
        assertEquals("a:9092,10.0.0.1:1,[::1]:65535",
                KafkaSettings.of("a:9092,10.0.0.1:1,[::1]:65535").bootstrap());
    }

    @Test
    void refusesMalformedBootstrapAddressesNamingThem() {
        for (String bad : new String[] {"", "host", "host:", ":9092", "host:0", "host:70000", "a:1,,b:2", "a b:1"}) {
            var e = assertThrows(IllegalArgumentException.class, () -> KafkaSettings.of(bad), bad);
            assertTrue(e.getMessage().contains("'"), e.getMessage());
        }
    }

    @Test
    void passesClientPropertiesThroughFromAFile() throws Exception {
        Path file = dir.resolve("client.properties");
        Files.writeString(file, "# TLS to the cluster\nsecurity.protocol=SSL\nssl.truststore.location=/etc/ts.jks\n");
        KafkaSettings s = KafkaSettings.of("broker:9093", file);
        assertEquals("SSL", s.common().get("security.protocol"));
        assertEquals("/etc/ts.jks", s.common().get("ssl.truststore.location"));
        assertEquals("broker:9093", s.common().get("bootstrap.servers"));
    }

    @Test
    void refusesAFileThatSetsWhatTheStagesOwn() throws Exception {
        for (String key : KafkaSettings.RESERVED) {
            Path file = dir.resolve("bad.properties");
            Files.writeString(file, key + "=x\n");
            var e = assertThrows(IllegalArgumentException.class, () -> KafkaSettings.of("b:1", file));
            assertTrue(e.getMessage().contains(key) && e.getMessage().contains(file.toString()), e.getMessage());
        }
    }

    @Test
    void refusesAMissingFileNamingIt() {
        Path missing = dir.resolve("nope.properties");
        var e = assertThrows(IllegalArgumentException.class, () -> KafkaSettings.of("b:1", missing));
        assertTrue(e.getMessage().contains(missing.toString()) && e.getMessage().contains("no such file"));
    }
}
