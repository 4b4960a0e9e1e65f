package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicLong;
import java.util.stream.LongStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cli.WinnowCli;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.app.watch.WatchState;
import org.winnow.app.watch.Watcher;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.kafka.ExactlyOnceRelay;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.TopicLayout;
import org.winnow.pipeline.metrics.StageKind;
import org.winnow.producer.source.InputFileSource;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.Manifest;
import org.winnow.sink.SinkOptions;
import picocli.CommandLine;

/**
 * A whole cluster run (producer, two scorers, sink) over a real broker gives the same survivors and the
 * same counts as {@code winnow scan} over the same input, model and rules, also when the sink is stopped
 * halfway and started again; and {@code winnow watch} adds up the metric snapshots of every stage to the
 * same counts, with both scorers' shares.
 */
@KafkaBroker
@Timeout(240)
class ClusterRunTest {
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
        Manifest scan = ClusterFixtures.scan(model, input.file(), scanDir);

        KafkaSettings kafka = KafkaSettings.of(broker.bootstrapServers());
        RunTopics run = new RunTopics("equivalence");
        ClusterProducer.Settings produce = new ClusterProducer.Settings(kafka, run, TopicLayout.singleBroker(3),
                new InputFileSource(input.file()), input.file().toString(), BadInputPolicy.SKIP, 40,
                RejectsOnWire.SLIM);
        ClusterProducer.createRun(produce);
        SimpleMeterRegistry producerMeters = new SimpleMeterRegistry();
        try (MetricsPublisher p = snapshots(kafka, run, StageKind.PRODUCE, "producer", producerMeters)) {
            ClusterProducer.run(produce, producerMeters);
        }

        KeepRules rules = KeepRules.of(ClusterFixtures.KEEPS, ClusterFixtures.MIN_CONFIDENCE,
                ClusterFixtures.NOVELTY);
        ModelScoring scoring = ModelScoring.load(model);
        AtomicLong a = new AtomicLong();
        AtomicLong b = new AtomicLong();
        ExecutorService threads = Executors.newFixedThreadPool(2);
        SimpleMeterRegistry metersA = new SimpleMeterRegistry();
        SimpleMeterRegistry metersB = new SimpleMeterRegistry();
        ClusterScorer sa = ClusterScorer.join(kafka, run, "a", scoring, rules, metersA, counting(a));
        ClusterScorer sb = ClusterScorer.join(kafka, run, "b", scoring, rules, metersB, counting(b));
        MetricsPublisher pa = snapshots(kafka, run, StageKind.SCORE, "a", metersA);
        MetricsPublisher pb = snapshots(kafka, run, StageKind.SCORE, "b", metersB);
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
            Manifest first = sink(kafka, run, clusterDir, options, firstRunning);
            stopper.join();
            Manifest cluster = first != null ? first : sink(kafka, run, clusterDir, options, new AtomicBoolean(true));
            sa.stop();
            sb.stop();
            fa.get(30, TimeUnit.SECONDS);
            fb.get(30, TimeUnit.SECONDS);
            pa.close();
            pb.close();

            assertNotNull(cluster);
            ClusterFixtures.assertSameOutcome(scanDir, clusterDir, "a sink stopped and started again");
            assertEquals(scan.modelChecksum(), cluster.modelChecksum());
            assertTrue(scan.counts().kept() > 0 && scan.counts().rejected() > 0, String.valueOf(scan.counts()));
            assertTrue(a.get() > 0 && b.get() > 0, "both scorers worked: a=" + a + " b=" + b);
            assertEquals(scan.counts().candidates(), a.get() + b.get());
            assertNull(first, "the first sink was stopped before the end, so the second one resumed");

            // What winnow watch makes of the snapshots every stage published.
            WatchState w;
            try (Watcher watcher = Watcher.open(kafka, run, Clock.systemUTC())) {
                w = watcher.once(Duration.ofSeconds(20));
            }
            List<WatchState.Instance> scorers = w.stage("score").instances();
            assertEquals(List.of("a", "b"), scorers.stream().map(WatchState.Instance::instance).toList());
            assertEquals(a.get(), scorers.get(0).candidates(), "scorer a's snapshots agree with its commits");
            assertEquals(b.get(), scorers.get(1).candidates(), "scorer b's snapshots agree with its commits");
            assertEquals(scan.counts().candidates(), w.stage("score").candidates());
            assertEquals(scan.counts().candidates(), w.stage("produce").candidates());
            for (WatchState.ReasonCount r : w.funnel()) {
                Map<String, Long> byReason = r.verdict().equals("keep") ? scan.counts().keptByReason()
                        : scan.counts().rejectedByReason();
                assertEquals(byReason.getOrDefault(r.reason(), 0L), r.count(), r.reason());
            }
            assertEquals(scan.counts().candidates(), LongStream.of(w.novelty()).sum());
            WatchState.Instance sinkView = w.stage("sink").instances().get(0);
            assertEquals(2, sinkView.incarnations(), "the restarted sink is one instance with two incarnations");
            // The second sink takes again what the first took after its last checkpoint.
            assertTrue(sinkView.candidates() >= scan.counts().candidates(), String.valueOf(sinkView));
            assertNotNull(w.lag().scorers());
            assertNotNull(w.lag().sink());
            // At rest only the transaction markers remain: at most one per partition.
            assertTrue(w.lag().scorers() <= 3 && w.lag().sink() <= 3, String.valueOf(w.lag()));
            assertEquals(0, w.refused(), w.lastRefusal());
            StringWriter out = new StringWriter();
            CommandLine cli = WinnowCli.commandLine();
            cli.setOut(new PrintWriter(out, true));
            assertEquals(0, cli.execute("watch", "--kafka", broker.bootstrapServers(), "--run", run.runId(), "--once"));
            assertTrue(out.toString().lines().anyMatch(l -> l.startsWith("score") && l.contains("a " + String.format(
                    java.util.Locale.ROOT, "%,d", a.get())) && l.contains("b ")), out.toString());
        } finally {
            pa.close();
            pb.close();
            sa.close();
            sb.close();
            threads.shutdownNow();
        }
    }

    private static MetricsPublisher snapshots(KafkaSettings kafka, RunTopics run, StageKind kind, String name,
            SimpleMeterRegistry meters) {
        return StageReporter.start(kafka, run, kind, name, meters, Clock.systemUTC(), Duration.ofMillis(200));
    }

    private static Manifest sink(KafkaSettings kafka, RunTopics run, Path dir, SinkOptions options,
            AtomicBoolean running) throws Exception {
        SimpleMeterRegistry meters = new SimpleMeterRegistry();
        try (MetricsPublisher p = snapshots(kafka, run, StageKind.SINK, "sink", meters)) {
            return ClusterSink.run(kafka, run, dir, options, Clock.systemUTC(), meters, running);
        }
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
