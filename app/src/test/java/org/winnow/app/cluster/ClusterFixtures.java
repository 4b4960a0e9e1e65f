package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.function.LongSupplier;
import org.apache.kafka.clients.admin.OffsetSpec;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.common.TopicPartition;
import org.winnow.app.cli.WinnowCli;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunTopics;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;

/**
 * What the cluster tests share: the rules both sides of a comparison use, the one-JVM scan they are
 * compared with, the comparison itself, stage commands in child JVMs, and progress read off the broker.
 */
final class ClusterFixtures {
    static final List<String> KEEPS = List.of("h11=2..5", "chi=-150..0");
    static final double MIN_CONFIDENCE = 0.5;
    static final double NOVELTY = 0.9;

    private ClusterFixtures() {
    }

    /** The rule options of {@code winnow scan} and {@code winnow score} under the shared rules. */
    static List<String> ruleOptions() {
        return List.of("--keep", KEEPS.get(0), "--keep", KEEPS.get(1), "--min-confidence",
                String.valueOf(MIN_CONFIDENCE), "--novelty", String.valueOf(NOVELTY));
    }

    /** {@code winnow scan} of {@code input} into {@code out} under the shared rules; its manifest. */
    static Manifest scan(Path model, Path input, Path out) throws IOException {
        List<String> args = new ArrayList<>(List.of("scan", "--model", model.toString(), "--input", input.toString()));
        args.addAll(ruleOptions());
        args.addAll(List.of("--threads", "2", "--out", out.toString()));
        assertEquals(0, WinnowCli.commandLine().execute(args.toArray(String[]::new)), "winnow scan");
        return Manifest.read(out.resolve(ScanFiles.MANIFEST));
    }

    /** The survivor lines of a scan directory, in file order, without the comment headers. */
    static List<String> survivorLines(Path dir, Manifest m) throws IOException {
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

    /**
     * The cluster run in {@code out} ended as the scan in {@code scanDir}: complete, the same counts (which
     * reconcile), nothing lost, nothing written twice, the same survivors in the same order.
     */
    static void assertSameOutcome(Path scanDir, Path out, Object faults) throws IOException {
        Manifest scan = Manifest.read(scanDir.resolve(ScanFiles.MANIFEST));
        Manifest cluster = Manifest.read(out.resolve(ScanFiles.MANIFEST));
        assertTrue(cluster.complete(), "complete after " + faults);
        Manifest.Counts c = cluster.counts();
        assertEquals(c.candidates(), c.scored(), "every candidate scored after " + faults);
        assertEquals(c.scored(), c.kept() + c.rejected(), "kept and rejected add up after " + faults);
        assertEquals(scan.counts(), c, "counts reconcile with winnow scan after " + faults);
        List<String> expected = survivorLines(scanDir, scan);
        List<String> actual = survivorLines(out, cluster);
        long duplicated = actual.size() - actual.stream().distinct().count();
        long lost = expected.stream().filter(l -> !actual.contains(l)).count();
        assertEquals(0, duplicated, "duplicated after " + faults);
        assertEquals(0, lost, "lost after " + faults);
        assertEquals(expected, actual, "identical survivors after " + faults);
    }

    /** Committed chunks of the producer: a progress record and a commit marker each. */
    static LongSupplier producerChunks(RunAdmin admin, RunTopics run) {
        TopicPartition plan = new TopicPartition(run.plan(), ClusterProducer.SHARD);
        return monotone(() -> {
            try {
                return admin.admin().listOffsets(Map.of(plan, OffsetSpec.latest())).all().get(5, TimeUnit.SECONDS)
                        .get(plan).offset() / 2;
            } catch (Exception e) {
                return 0;
            }
        });
    }

    /** The scorers' committed offsets on the candidates topic, summed over its partitions. */
    static LongSupplier scorerOffsets(RunAdmin admin, RunTopics run) {
        return monotone(() -> {
            try {
                return admin.admin().listConsumerGroupOffsets(ClusterScorer.group(run)).partitionsToOffsetAndMetadata()
                        .get(5, TimeUnit.SECONDS).values().stream().mapToLong(OffsetAndMetadata::offset).sum();
            } catch (Exception e) {
                return 0;
            }
        });
    }

    /** The sink's checkpoints so far: one line of its offset log each. */
    static LongSupplier sinkCheckpoints(Path out) {
        Path file = out.resolve(OffsetLog.FILE);
        return monotone(() -> {
            try {
                return Files.exists(file) ? Files.readAllLines(file).size() : 0;
            } catch (IOException e) {
                return 0;
            }
        });
    }

    /** The highest value read so far: a reading that fails (a broker away) returns 0 and must not count. */
    private static LongSupplier monotone(LongSupplier reading) {
        long[] best = {0};
        return () -> {
            synchronized (best) {
                best[0] = Math.max(best[0], reading.getAsLong());
                return best[0];
            }
        };
    }

    /** Faults injected into one run, with the time of each since the run started, for failure messages. */
    static final class FaultLog {
        private final long start = System.nanoTime();
        private final List<String> entries = new ArrayList<>();

        synchronized void add(String format, Object... args) {
            entries.add(String.format(Locale.ROOT, format, args)
                    + String.format(Locale.ROOT, " (%.1f s)", (System.nanoTime() - start) / 1e9));
        }

        synchronized long count(String prefix) {
            return entries.stream().filter(e -> e.startsWith(prefix)).count();
        }

        @Override
        public synchronized String toString() {
            return entries.toString();
        }
    }

    /**
     * Waits until {@code progress} has moved {@code ahead} steps, kills {@code victim} with SIGKILL and starts
     * it again with the same command, as an operator would; returns 1, or 0 when the victim ended first.
     */
    static int killAtRandomPoint(Child victim, LongSupplier progress, int ahead, String unit, FaultLog log)
            throws IOException, InterruptedException {
        long target = progress.getAsLong() + ahead;
        while (victim.alive() && progress.getAsLong() < target) {
            Thread.sleep(5);
        }
        if (!victim.alive()) {
            log.add("%s ended before its kill", victim.name());
            return 0;
        }
        victim.kill();
        log.add("kill -9 %s at %s %d", victim.name(), unit, progress.getAsLong());
        victim.start();
        return 1;
    }

    /** One {@code winnow} stage command in a JVM of its own, restartable with the same arguments. */
    static final class Child {
        private final String name;
        private final List<String> args;
        private final Path log;
        private Process process;

        Child(String name, List<String> args, Path dir) {
            this.name = name;
            this.args = List.copyOf(args);
            this.log = dir.resolve(name + ".log");
        }

        String name() {
            return name;
        }

        void start() throws IOException {
            List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Xmx256m", "-XX:TieredStopAtLevel=1", "-XX:+UseSerialGC", "-cp",
                    // Surefire names the real test class path here; java.class.path may be its one-jar launcher.
                    System.getProperty("surefire.test.class.path", System.getProperty("java.class.path")),
                    WinnowCli.class.getName()));
            cmd.addAll(args);
            process = new ProcessBuilder(cmd).redirectErrorStream(true)
                    .redirectOutput(ProcessBuilder.Redirect.appendTo(log.toFile())).start();
        }

        boolean alive() {
            return process != null && process.isAlive();
        }

        /** The exit code of a process that has ended, or null while it runs. */
        Integer exitCode() {
            return process == null || process.isAlive() ? null : process.exitValue();
        }

        /** SIGKILL on Linux: no shutdown hook, no flush, no goodbye. */
        void kill() throws InterruptedException {
            if (process != null && process.isAlive()) {
                process.destroyForcibly();
                process.waitFor(15, TimeUnit.SECONDS);
            }
        }

        /** SIGTERM, the way a long-running scorer is told to stop; its exit code, or -1 if it had to be killed. */
        int stop(int seconds) throws InterruptedException {
            if (process == null) {
                return -1;
            }
            process.destroy();
            return await(seconds);
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
                return Files.readString(log);
            } catch (IOException e) {
                return "(no output: " + e.getMessage() + ")";
            }
        }
    }
}
