package org.winnow.kafka;

import org.junit.jupiter.api.Timeout;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;

/** The transport contract against a real KRaft broker started in this JVM. */
@KafkaBroker
@Timeout(120)
class InProcessKafkaTransportTest extends KafkaTransportContract {
    private final EmbeddedKafkaBroker broker;

    InProcessKafkaTransportTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Override
    String bootstrap() {
        return broker.bootstrapServers();
    }
}
