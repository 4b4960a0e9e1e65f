package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.WinnowCli;
import org.winnow.app.scan.InputFileSource;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.kafka.ExactlyOnceRelay;
import org.winnow.pipeline.kafka.KafkaSettings;
import org.winnow.pipeline.kafka.RunTopics;
import org.winnow.pipeline.kafka.TopicLayout;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.SinkOptions;

/**
 * A whole cluster run (producer, two scorers, sink) over a real broker gives the same survivors and the
 * same counts as {@code winnow scan} over the same input, model and rules, also when the sink is stopped
 * halfway and started again.
 */
@KafkaBroker
@Timeout(240)
class ClusterRunTest {
    private static final List<String> KEEPS = List.of("h11=2..5", "chi=-150..0");
    private static final double MIN_CONFIDENCE = 0.5;
    private static final double NOVELTY = 0.9;

    private final EmbeddedKafkaBroker broker;

    @TempDir
    Path dir;

    ClusterRunTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Test
    void aClusterRunWritesWhatTheOneJvmScanWrites() throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        ScanFixtures.Input input = ScanFixtures.input(dir, 17L, 400);
        Path scanDir = dir.resolve("scan");
        int exit = WinnowCli.commandLine().execute("scan", "--model", model.toString(), "--input",
                input.file().toString(), "--keep", KEEPS.get(0), "--keep", KEEPS.get(1), "--min-confidence",
                String.valueOf(MIN_CONFIDENCE), "--novelty", String.valueOf(NOVELTY), "--threads", "2", "--out",
                scanDir.toString());
        assertEquals(0, exit);
        Manifest scan = Manifest.read(scanDir.resolve(ScanFiles.MANIFEST));

        KafkaSettings kafka = KafkaSettings.of(broker.bootstrapServers());
        RunTopics run = new RunTopics("equivalence");
        ClusterProducer.run(new ClusterProducer.Settings(kafka, run, TopicLayout.singleBroker(3),
                new InputFileSource(input.file()), input.file().toString(), BadInputPolicy.SKIP, 40),
                new SimpleMeterRegistry());

        KeepRules rules = KeepRules.of(KEEPS, MIN_CONFIDENCE, NOVELTY);
        ModelScoring scoring = ModelScoring.load(model);
        AtomicLong a = new AtomicLong();
        AtomicLong b = new AtomicLong();
        ExecutorService threads = Executors.newFixedThreadPool(2);
        ClusterScorer sa = ClusterScorer.join(kafka, run, "a", scoring, rules, new SimpleMeterRegistry(), counting(a));
        ClusterScorer sb = ClusterScorer.join(kafka, run, "b", scoring, rules, new SimpleMeterRegistry(), counting(b));
        Path clusterDir = dir.resolve("cluster");
        try {
            Future<?> fa = threads.submit(sa::run);
            Future<?> fb = threads.submit(sb::run);

            // A sink stopped early leaves a checkpoint; the next one resumes from it.
            SinkOptions options = new SinkOptions(100_000, false, 25, Duration.ofSeconds(5));
            AtomicBoolean firstRunning = new AtomicBoolean(true);
            Thread stopper = new Thread(() -> {
                long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
                while (System.nanoTime() < deadline && !Files.exists(clusterDir.resolve(OffsetLog.FILE))) {
                    Thread.onSpinWait();
                }
                try {
                    Thread.sleep(300);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
                firstRunning.set(false);
            });
            stopper.start();
            Manifest first = ClusterSink.run(kafka, run, clusterDir, options, Clock.systemUTC(),
                    new SimpleMeterRegistry(), firstRunning);
            stopper.join();
            Manifest cluster = first != null ? first : ClusterSink.run(kafka, run, clusterDir, options,
                    Clock.systemUTC(), new SimpleMeterRegistry(), new AtomicBoolean(true));
            sa.stop();
            sb.stop();
            fa.get(30, TimeUnit.SECONDS);
            fb.get(30, TimeUnit.SECONDS);

            assertNotNull(cluster);
            assertTrue(cluster.complete());
            assertEquals(scan.counts(), cluster.counts());
            assertEquals(scan.modelChecksum(), cluster.modelChecksum());
            assertEquals(survivorLines(scanDir, scan), survivorLines(clusterDir, cluster));
            assertTrue(scan.counts().kept() > 0 && scan.counts().rejected() > 0, String.valueOf(scan.counts()));
            assertTrue(a.get() > 0 && b.get() > 0, "both scorers worked: a=" + a + " b=" + b);
            assertEquals(scan.counts().candidates(), a.get() + b.get());
            assertNull(first, "the first sink was stopped before the end, so the second one resumed");
        } finally {
            sa.close();
            sb.close();
            threads.shutdownNow();
        }
    }

    private static List<String> survivorLines(Path dir, Manifest m) throws Exception {
        List<String> lines = new ArrayList<>();
        for (String f : m.survivorFiles()) {
            for (String line : Files.readAllLines(dir.resolve(f))) {
                if (!line.startsWith("#")) {
                    lines.add(line);
                }
            }
        }
        return lines;
    }

    private static ExactlyOnceRelay.Listener counting(AtomicLong count) {
        return new ExactlyOnceRelay.Listener() {
            @Override
            public void committed(int inputs, int outputs) {
                count.addAndGet(inputs);
            }
        };
    }
}
