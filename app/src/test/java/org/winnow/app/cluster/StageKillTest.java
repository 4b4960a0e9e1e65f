package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.function.LongSupplier;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cluster.ClusterFixtures.Child;
import org.winnow.app.cluster.ClusterFixtures.FaultLog;
import org.winnow.app.scan.ScanFixtures;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.TopicLayout;
import org.winnow.producer.source.InputFileSource;

/**
 * Exactly once under real faults, with every stage a real {@code winnow} command in a JVM of its own: one
 * producer, two scorers and a sink. In one run, the producer, each scorer and the sink are killed with
 * SIGKILL at seeded random points of the run's progress (after a random number of committed producer
 * chunks) and started again with the same command; in another, the broker is stopped and started again on
 * the same port and log at random points while all four work, and whatever stopped is started again, as an
 * operator would. Each run must end with the survivors and counts of {@code winnow scan} over the same
 * input: nothing lost, nothing written twice.
 *
 * <p>The run is created first, as {@code winnow produce} would create it, and the producer starts once the
 * scorers and the sink have joined: otherwise, on a loaded machine, the producer is done before the other
 * JVMs are up, and the faults would land on a run that is only draining.
 *
 * <p>Each wait is bounded for an idle machine and stretched by its load ({@link LoadSlack}): at a load of 20
 * on two cores the fixed 90 s for the stages to join once failed a correct run.
 */
@KafkaBroker
// Only a guard against a hung test: the waits inside are bounded, stretched by the machine's load (LoadSlack).
@Timeout(1800)
class StageKillTest {
    private static final long SEED = 20261202L;
    /** Faults of the kill run, in this order, each at a random point; a victim that has ended is skipped. */
    private static final List<String> KILLS = List.of("producer", "scorer", "sink", "producer", "scorer", "sink",
            "scorer", "sink");
    private static final int BROKER_RESTARTS = 3;

    @TempDir
    static Path shared;

    private static Path model;
    private static Path input;
    private static Path scanDir;

    private final EmbeddedKafkaBroker broker;

    @TempDir
    Path dir;

    StageKillTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @BeforeAll
    static void scanOnce() throws IOException {
        model = ScanFixtures.saveModel(shared);
        input = ScanFixtures.input(shared, 23L, 900).file();
        scanDir = shared.resolve("scan");
        ClusterFixtures.scan(model, input, scanDir);
    }

    @Test
    void killedProducersScorersAndSinksLoseAndDuplicateNothing() throws Exception {
        RunTopics run = new RunTopics("kill-stages");
        Path out = dir.resolve("cluster");
        Stages stages = new Stages(run, out);
        SplittableRandom random = new SplittableRandom(SEED);
        FaultLog log = new FaultLog();
        try (RunAdmin admin = RunAdmin.connect(KafkaSettings.of(broker.bootstrapServers()))) {
            stages.startAll(out, log);
            LongSupplier chunks = ClusterFixtures.producerChunks(admin, run);
            int landed = 0;
            for (String kind : KILLS) {
                Child victim = switch (kind) {
                    case "scorer" -> stages.scorers.get(random.nextInt(stages.scorers.size()));
                    case "sink" -> stages.sink;
                    default -> stages.producer;
                };
                landed += ClusterFixtures.killAtRandomPoint(victim, chunks, 1 + random.nextInt(5), "chunk", log);
            }
            assertEquals(0, stages.producer.await(LoadSlack.seconds(120)), () -> "producer exit code; " + log + "\n"
                    + stages.producer.output());
            log.add("producer done");
            assertEquals(0, stages.sink.await(LoadSlack.seconds(150)), () -> "sink exit code; " + log + "\n"
                    + stages.sink.output());
            log.add("sink done");
            stages.stopScorers(log);

            ClusterFixtures.assertSameOutcome(scanDir, out, log);
            System.out.println("StageKillTest kills: " + log);
            // Without real kills in the middle of the work the test would prove nothing.
            assertTrue(landed >= KILLS.size() - 1, "only " + landed + " kills landed mid-run: " + log);
            for (String victim : List.of("kill -9 producer", "kill -9 scorer", "kill -9 sink")) {
                assertTrue(log.count(victim) >= 1, "no '" + victim + "' landed: " + log);
            }
        } finally {
            stages.killAll();
        }
    }

    @Test
    void aBrokerRestartedUnderTheRealStagesLosesAndDuplicatesNothing() throws Exception {
        RunTopics run = new RunTopics("restart-broker");
        Path out = dir.resolve("cluster");
        Stages stages = new Stages(run, out);
        SplittableRandom random = new SplittableRandom(SEED + 1);
        FaultLog log = new FaultLog();
        try (RunAdmin admin = RunAdmin.connect(KafkaSettings.of(broker.bootstrapServers()))) {
            stages.startAll(out, log);
            LongSupplier chunks = ClusterFixtures.producerChunks(admin, run);
            int restarts = 0;
            for (int i = 0; i < BROKER_RESTARTS; i++) {
                long target = chunks.getAsLong() + 2 + random.nextInt(8);
                while (stages.producer.alive() && chunks.getAsLong() < target) {
                    Thread.sleep(5);
                }
                if (!stages.producer.alive()) {
                    log.add("producer ended before broker restart %d", i + 1);
                    break;
                }
                long at = chunks.getAsLong();
                broker.stop();
                Thread.sleep(random.nextInt(1500));
                broker.startAgain();
                log.add("broker restart at chunk %d", at);
                restarts++;
                stages.restartWhatStopped(log);
            }
            LoadSlack wait = LoadSlack.of(150);
            while (stages.sink.exitCode() == null || stages.sink.exitCode() != 0) {
                assertTrue(wait.within(), () -> "the run did not complete (" + wait.describe() + "): " + log + "\n"
                        + stages.sink.output());
                if (stages.producer.exitCode() != null && log.count("producer done") == 0) {
                    log.add("producer done");
                }
                stages.restartWhatStopped(log);
                Thread.sleep(100);
            }
            log.add("sink done");
            stages.stopScorers(log);

            ClusterFixtures.assertSameOutcome(scanDir, out, log);
            System.out.println("StageKillTest broker restarts: " + log);
            assertTrue(restarts >= BROKER_RESTARTS - 1, "only " + restarts + " broker restarts mid-run: " + log);
            // Once joined, the scorers and the sink ride a broker restart out; only the producer's open
            // transaction may be lost with it, and that producer exits to be run again.
            assertEquals(0, log.count("restarted scorer") + log.count("restarted sink"), String.valueOf(log));
        } finally {
            stages.killAll();
        }
    }

    /** The four stage commands of one run. */
    private final class Stages {
        private static final int PARTITIONS = 3;
        final RunTopics run;
        final Child producer;
        final List<Child> scorers = new ArrayList<>();
        final Child sink;

        Stages(RunTopics run, Path out) {
            this.run = run;
            String bootstrap = broker.bootstrapServers();
            producer = new Child("producer", List.of("produce", "--kafka", bootstrap, "--run", run.runId(), "--input",
                    input.toString(), "--partitions", String.valueOf(PARTITIONS), "--chunk", "5"), dir);
            for (String name : List.of("a", "b")) {
                List<String> args = new ArrayList<>(List.of("score", "--kafka", bootstrap, "--run", run.runId(),
                        "--model", model.toString(), "--instance", name));
                args.addAll(ClusterFixtures.ruleOptions());
                scorers.add(new Child("scorer-" + name, args, dir));
            }
            sink = new Child("sink", List.of("sink", "--kafka", bootstrap, "--run", run.runId(), "--out",
                    out.toString(), "--checkpoint-records", "40"), dir);
        }

        /**
         * Creates the run with the producer's settings, starts the scorers and the sink, and the producer
         * once they have joined.
         */
        void startAll(Path out, FaultLog log) throws IOException, InterruptedException {
            ClusterProducer.createRun(new ClusterProducer.Settings(KafkaSettings.of(broker.bootstrapServers()), run,
                    new TopicLayout(PARTITIONS, (short) 1), new InputFileSource(input),
                    ClusterProducer.sourceIdentity(input), BadInputPolicy.SKIP, 5, RejectsOnWire.SLIM));
            for (Child s : scorers) {
                s.start();
            }
            sink.start();
            awaitJoined(out, log);
            producer.start();
        }

        /** Starts again, as an operator would, a stage that exited with an error (a producer stays done at 0). */
        void restartWhatStopped(FaultLog log) throws IOException {
            List<Child> all = new ArrayList<>(scorers);
            all.add(producer);
            all.add(sink);
            for (Child c : all) {
                Integer exit = c.exitCode();
                if (exit != null && exit != 0) {
                    log.add("restarted %s after exit %d", c.name(), exit);
                    c.start();
                }
            }
        }

        /**
         * Waits until both scorers have joined the run and the sink has opened its directory (which it does
         * once the scorers' claims are on the run): from then on no stage needs the broker to start.
         */
        private void awaitJoined(Path out, FaultLog log) throws InterruptedException {
            LoadSlack wait = LoadSlack.of(90);
            while (!(scorers.stream().allMatch(s -> s.output().contains("joined run"))
                    && java.nio.file.Files.exists(out.resolve(org.winnow.sink.ScanFiles.MANIFEST)))) {
                assertTrue(wait.within(), () -> "the stages did not join (" + wait.describe() + "): " + log);
                Thread.sleep(50);
            }
            log.add("all stages joined");
        }

        /**
         * SIGTERM to the scorers, which run until told to stop; each must stop cleanly: its shutdown hook
         * ends the relay and the command says so (the JVM's exit code is then 143, 128 + SIGTERM).
         */
        void stopScorers(FaultLog log) throws InterruptedException {
            for (Child s : scorers) {
                int exit = s.stop(LoadSlack.seconds(30));
                String last = s.output().strip().lines().reduce((a, b) -> b).orElse("");
                assertTrue((exit == 0 || exit == 143) && last.contains("stopped after"),
                        () -> s.name() + " did not stop cleanly (exit " + exit + "); " + log + "\n" + s.output());
            }
            log.add("scorers stopped");
        }

        void killAll() throws InterruptedException {
            producer.kill();
            for (Child s : scorers) {
                s.kill();
            }
            sink.kill();
        }
    }
}
