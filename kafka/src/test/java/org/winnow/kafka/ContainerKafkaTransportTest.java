package org.winnow.kafka;

import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Timeout;
import org.testcontainers.junit.jupiter.Container;
import org.testcontainers.junit.jupiter.Testcontainers;
import org.testcontainers.kafka.KafkaContainer;

/**
 * The transport contract against the apache/kafka image, where a Docker engine exists; skipped cleanly
 * where none does (as on CI).
 */
@Tag("integration")
@Testcontainers(disabledWithoutDocker = true)
@Timeout(300)
class ContainerKafkaTransportTest extends KafkaTransportContract {
    @Container
    static final KafkaContainer KAFKA = new KafkaContainer("apache/kafka:4.1.0")
            .withEnv("KAFKA_TRANSACTION_STATE_LOG_REPLICATION_FACTOR", "1")
            .withEnv("KAFKA_TRANSACTION_STATE_LOG_MIN_ISR", "1")
            .withEnv("KAFKA_AUTO_CREATE_TOPICS_ENABLE", "false");

    @Override
    String bootstrap() {
        return KAFKA.getBootstrapServers();
    }
}
