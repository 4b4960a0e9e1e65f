package org.winnow.app.cli;

import java.nio.file.Path;
import org.winnow.kafka.KafkaSettings;
import picocli.CommandLine.Option;

/** The broker address and client properties shared by every cluster stage, as one picocli mixin. */
public final class KafkaConnectionOptions {
    @Option(names = "--kafka", required = true, paramLabel = "HOST:PORT", description = "Kafka bootstrap address.")
    public String kafka;

    @Option(names = "--kafka-config", paramLabel = "F",
            description = "Kafka client properties passed through (TLS, SASL, tuning).")
    public Path kafkaConfig;

    /** The client settings these options describe. */
    public KafkaSettings settings() {
        return kafkaConfig == null ? KafkaSettings.of(kafka) : KafkaSettings.of(kafka, kafkaConfig);
    }
}
