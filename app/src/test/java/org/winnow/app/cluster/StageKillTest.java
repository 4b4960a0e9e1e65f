package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.function.LongSupplier;
import org.apache.kafka.clients.admin.OffsetSpec;
import org.apache.kafka.common.TopicPartition;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.WinnowCli;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import org.winnow.pipeline.kafka.ClusterRefusedException;
import org.winnow.pipeline.kafka.ExactlyOnceRelay;
import org.winnow.pipeline.kafka.KafkaSettings;
import org.winnow.pipeline.kafka.RunAdmin;
import org.winnow.pipeline.kafka.RunTopics;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;

/**
 * Exactly once under SIGKILL for the producer and the sink, as the real {@code winnow produce} and
 * {@code winnow sink} commands in JVMs of their own: each is killed at random points of its progress
 * (after a random number of committed chunks or checkpoints) and started again with the same command,
 * while two scorers keep working. The run must end with the survivors and counts of {@code winnow scan}
 * over the same input: nothing lost, nothing written twice. (Killed scorers and a restarted broker are
 * covered at the relay level by the pipeline's RelayKillTest.)
 */
@KafkaBroker
@Timeout(300)
class StageKillTest {
    private static final long SEED = 20261202L;
    private static final int FAULTS = 6;
    private static final List<String> KEEPS = List.of("h11=2..5", "chi=-150..0");

    private final EmbeddedKafkaBroker broker;

    @TempDir
    Path dir;

    private long start;

    StageKillTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Test
    void killedProducersAndSinksLoseAndDuplicateNothing() throws Exception {
        Path model = ScanFixtures.saveModel(dir);
        ScanFixtures.Input input = ScanFixtures.input(dir, 23L, 900);
        Path scanDir = dir.resolve("scan");
        assertEquals(0, WinnowCli.commandLine().execute("scan", "--model", model.toString(), "--input",
                input.file().toString(), "--keep", KEEPS.get(0), "--keep", KEEPS.get(1), "--min-confidence", "0.5",
                "--novelty", "0.9", "--threads", "2", "--out", scanDir.toString()));
        Manifest scan = Manifest.read(scanDir.resolve(ScanFiles.MANIFEST));

        KafkaSettings kafka = KafkaSettings.of(broker.bootstrapServers());
        RunTopics run = new RunTopics("kill-stages");
        Path out = dir.resolve("cluster");
        List<String> produce = List.of("produce", "--kafka", broker.bootstrapServers(), "--run", run.runId(),
                "--input", input.file().toString(), "--partitions", "3", "--chunk", "5");
        List<String> sink = List.of("sink", "--kafka", broker.bootstrapServers(), "--run", run.runId(), "--out",
                out.toString(), "--checkpoint-records", "40");
        SplittableRandom random = new SplittableRandom(SEED);
        List<String> log = new ArrayList<>();
        List<ClusterScorer> scorers = new ArrayList<>();
        Child producer = new Child("producer", produce, dir);
        Child writer = new Child("sink", sink, dir);
        ExecutorService threads = Executors.newFixedThreadPool(2);
        try (RunAdmin admin = RunAdmin.connect(kafka)) {
            start = System.nanoTime();
            producer.start();
            awaitRun(admin, run);
            TopicPartition plan = new TopicPartition(run.plan(), ClusterProducer.SHARD);
            // A progress record and a commit marker per committed chunk.
            LongSupplier chunks = () -> endOffset(admin, plan) / 2;
            LongSupplier checkpoints = () -> lines(out.resolve(OffsetLog.FILE));
            int killed = 0;
            // The first kill while only the producer runs; the next ones alternate between the producer (while it
            // is still sending) and the sink, so that one restarts while the other works.
            killed += killAtRandomPoint(producer, chunks, 1 + random.nextInt(12), "chunk", log);
            ModelScoring scoring = ModelScoring.load(model);
            KeepRules rules = KeepRules.of(KEEPS, 0.5, 0.9);
            List<Future<?>> running = new ArrayList<>();
            for (String name : List.of("a", "b")) {
                ClusterScorer s = ClusterScorer.join(kafka, run, name, scoring, rules, new SimpleMeterRegistry(),
                        ExactlyOnceRelay.Listener.NONE);
                scorers.add(s);
                running.add(threads.submit(s::run));
            }
            writer.start();
            for (int fault = 1; fault < FAULTS; fault++) {
                if (fault % 2 == 0 && producer.alive()) {
                    killed += killAtRandomPoint(producer, chunks, 1 + random.nextInt(12), "chunk", log);
                } else {
                    killed += killAtRandomPoint(writer, checkpoints, 1 + random.nextInt(3), "checkpoint", log);
                }
            }
            assertEquals(0, producer.await(120), () -> "producer exit code; " + log + "\n" + producer.output());
            assertEquals(0, writer.await(150), () -> "sink exit code; " + log + "\n" + writer.output());
            for (ClusterScorer s : scorers) {
                s.stop();
            }
            for (Future<?> f : running) {
                f.get(30, TimeUnit.SECONDS);
            }

            Manifest cluster = Manifest.read(out.resolve(ScanFiles.MANIFEST));
            assertTrue(cluster.complete(), String.valueOf(log));
            assertEquals(scan.counts(), cluster.counts(), "counts reconcile with winnow scan after " + log);
            List<String> expected = survivorLines(scanDir, scan);
            List<String> actual = survivorLines(out, cluster);
            long duplicated = actual.size() - actual.stream().distinct().count();
            long lost = expected.stream().filter(l -> !actual.contains(l)).count();
            assertEquals(0, duplicated, "duplicated after " + log);
            assertEquals(0, lost, "lost after " + log);
            assertEquals(expected, actual, "identical survivors after " + log);
            // Without real kills in the middle of the work the test would prove nothing.
            assertTrue(killed >= FAULTS - 1, "only " + killed + " kills landed mid-run: " + log);
        } finally {
            for (ClusterScorer s : scorers) {
                s.stop();
            }
            threads.shutdown();
            threads.awaitTermination(30, TimeUnit.SECONDS);
            for (ClusterScorer s : scorers) {
                s.close();
            }
            producer.kill();
            writer.kill();
        }
    }

    /**
     * Waits until {@code progress} has moved {@code ahead} steps, kills {@code victim} with SIGKILL and starts
     * it again; returns 1, or 0 when the victim finished first (logged either way).
     */
    private int killAtRandomPoint(Child victim, LongSupplier progress, int ahead, String unit, List<String> log)
            throws IOException, InterruptedException {
        long target = progress.getAsLong() + ahead;
        while (victim.alive() && progress.getAsLong() < target) {
            Thread.sleep(5);
        }
        if (!victim.alive()) {
            log.add(victim.name + " finished before its kill");
            return 0;
        }
        victim.kill();
        log.add(String.format(java.util.Locale.ROOT, "kill -9 %s at %s %d, %.1f s into the run", victim.name, unit,
                progress.getAsLong(), (System.nanoTime() - start) / 1e9));
        victim.start();
        return 1;
    }

    /** One stage command in a JVM of its own, restartable with the same arguments. */
    private static final class Child {
        private final String name;
        private final List<String> args;
        private Process process;

        private final Path dir;

        Child(String name, List<String> args, Path dir) {
            this.name = name;
            this.args = args;
            this.dir = dir;
        }

        void start() throws IOException {
            String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
            List<String> cmd = new ArrayList<>(List.of(java, "-Xmx256m", "-XX:TieredStopAtLevel=1",
                    "-XX:+UseSerialGC", "-cp", System.getProperty("java.class.path"), WinnowCli.class.getName()));
            cmd.addAll(args);
            process = new ProcessBuilder(cmd).redirectErrorStream(true)
                    .redirectOutput(ProcessBuilder.Redirect.appendTo(log().toFile())).start();
        }

        boolean alive() {
            return process != null && process.isAlive();
        }

        /** SIGKILL on Linux: no shutdown hook, no flush, no goodbye. */
        void kill() throws InterruptedException {
            if (process != null && process.isAlive()) {
                process.destroyForcibly();
                process.waitFor(15, TimeUnit.SECONDS);
            }
        }

        int await(int seconds) throws InterruptedException {
            if (!process.waitFor(seconds, TimeUnit.SECONDS)) {
                kill();
                return -1;
            }
            return process.exitValue();
        }

        String output() {
            try {
                return Files.readString(log());
            } catch (IOException e) {
                return "(no output: " + e.getMessage() + ")";
            }
        }

        private Path log() {
            return dir.resolve(name + ".log");
        }
    }

    private static void awaitRun(RunAdmin admin, RunTopics run) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (true) {
            try {
                admin.requireRun(run);
                return;
            } catch (ClusterRefusedException e) {
                assertTrue(System.nanoTime() < deadline, "the producer did not create the run: " + e.getMessage());
                Thread.sleep(100);
            }
        }
    }

    private static long endOffset(RunAdmin admin, TopicPartition tp) {
        try {
            return admin.admin().listOffsets(Map.of(tp, OffsetSpec.latest())).all().get(5, TimeUnit.SECONDS).get(tp)
                    .offset();
        } catch (Exception e) {
            return 0;
        }
    }

    private static long lines(Path file) {
        try {
            return Files.exists(file) ? Files.readAllLines(file).size() : 0;
        } catch (IOException e) {
            return 0;
        }
    }

    private static List<String> survivorLines(Path dir, Manifest m) throws IOException {
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
}
