package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.File;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;

/**
 * Exactly once under faults: relays in JVMs of their own are killed with SIGKILL at random points and
 * restarted, and the broker is restarted under them, while input keeps arriving. Afterwards every input
 * key is in the output exactly once, with the value derived from its own input.
 */
@KafkaBroker
@Timeout(240)
class RelayKillTest {
    private static final long SEED = 20261201L;
    private static final int CHUNK = 2500;
    private static final int FAULTS = 10;

    private final EmbeddedKafkaBroker broker;

    @TempDir
    Path dir;

    RelayKillTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Test
    void killedRelaysAndARestartedBrokerLoseAndDuplicateNothing() throws Exception {
        RunTopics run = new RunTopics("kill-test");
        try (RunAdmin admin = RunAdmin.connect(KafkaSettings.of(broker.bootstrapServers()))) {
            admin.createRun(run, TopicLayout.singleBroker(3), new RunDescriptor(run.runId(), Map.of()));
        }
        SplittableRandom random = new SplittableRandom(SEED);
        Map<String, Process> children = new HashMap<>();
        List<String> log = new ArrayList<>();
        Map<String, Configuration> written = new HashMap<>();
        try {
            children.put("a", start(run, "a"));
            children.put("b", start(run, "b"));
            int next = 0;
            for (int fault = 0; fault < FAULTS; fault++) {
                written.putAll(RelayFixtures.write(broker.bootstrapServers(), run, next, CHUNK, SEED + fault));
                next += CHUNK;
                Thread.sleep(300 + random.nextInt(1500));
                if (fault == 4 || fault == 8) {
                    log.add("broker restart");
                    broker.restart();
                } else {
                    String victim = random.nextBoolean() ? "a" : "b";
                    log.add("kill -9 " + victim);
                    Process p = children.get(victim);
                    p.destroyForcibly();
                    p.waitFor(10, TimeUnit.SECONDS);
                    children.put(victim, start(run, victim));
                }
            }
            List<ConsumerRecord<String, String>> out = RelayFixtures.readOutput(broker.bootstrapServers(), run,
                    written.size(), Duration.ofSeconds(8), Duration.ofSeconds(150));
            Map<String, Integer> seen = new HashMap<>();
            for (ConsumerRecord<String, String> r : out) {
                seen.merge(r.key(), 1, Integer::sum);
                assertEquals(RelayFixtures.derive(written.get(r.key())), r.value(), r.key());
            }
            long duplicated = seen.values().stream().filter(n -> n > 1).count();
            long lost = written.keySet().stream().filter(k -> !seen.containsKey(k)).count();
            assertEquals(0, lost, "lost after " + log);
            assertEquals(0, duplicated, "duplicated after " + log);
            assertEquals(written.size(), out.size());
            assertTrue(log.size() == FAULTS);
        } finally {
            for (Process p : children.values()) {
                p.destroy();
            }
            for (Process p : children.values()) {
                if (!p.waitFor(15, TimeUnit.SECONDS)) {
                    p.destroyForcibly();
                }
            }
        }
    }

    private Process start(RunTopics run, String instance) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        return new ProcessBuilder(java, "-Xmx256m", "-XX:TieredStopAtLevel=1", "-cp",
                System.getProperty("java.class.path"), RelayChild.class.getName(),
                broker.bootstrapServers(), run.runId(), instance, "100")
                .redirectErrorStream(true)
                .redirectOutput(ProcessBuilder.Redirect.appendTo(new File(dir.toFile(), "relay-" + instance + ".log")))
                .start();
    }
}
