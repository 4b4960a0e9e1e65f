package org.winnow.bench;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.stream.Stream;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.LogDirDescription;
import org.winnow.app.cli.WinnowCli;
import org.winnow.app.cluster.ClusterProducer;
import org.winnow.app.cluster.ClusterScorer;
import org.winnow.app.cluster.ClusterSink;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.kafka.ExactlyOnceRelay;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.TopicLayout;
import org.winnow.producer.source.InputFileSource;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.Manifest;
import org.winnow.sink.SinkOptions;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine;

/**
 * Cluster mode against {@code winnow scan} on one machine: the same input (by default the synthetic
 * scenario, invented data), model and rules, scanned in one JVM and then run as producer, scorers and sink over a real broker
 * on loopback (all in this JVM, so the comparison measures the transport, not process start-up). Prints
 * candidates per second of both and the bytes per candidate the broker stored for the candidates and
 * scored topics (lz4-compressed batches, headers included), which is what crossed the wire.
 *
 * <p>Run with {@code bench/cluster-throughput.sh [candidates] [scorers]}, or on a given model and
 * candidate file with {@code --model M --input F} ({@code bench/compare.sh} does, on its four-fold bench
 * file; then {@code candidates} lines of F are used). The last line is
 * {@code scan_rate=R cluster_rate=Q counts_equal=B} for drivers (of the last form given with {@code --rejects}).
 * Not a test.
 */
@Command(name = "cluster-throughput", mixinStandardHelpOptions = true)
public final class ClusterThroughput implements Callable<Integer> {
    @Parameters(index = "0", defaultValue = "50000", description = "Candidates (default ${DEFAULT-VALUE}).")
    int count;

    @Parameters(index = "1", defaultValue = "2", description = "Scorers (default ${DEFAULT-VALUE}).")
    int scorers;

    @Option(names = "--model", description = "A frozen model (.wnm); default a small one trained on the synthetic scenario.")
    Path modelPath;

    @Option(names = "--input", description = "Candidate lines (the first `candidates` are used); default synthetic draws.")
    Path inputPath;

    @Option(names = "--rejects", split = ",", paramLabel = "FORM",
            description = "How the cluster runs carry rejected candidates, one cluster run per form in this order: "
                    + "slim, whole (default ${DEFAULT-VALUE}).")
    List<RejectsOnWire> forms = List.of(RejectsOnWire.SLIM);

    public static void main(String[] args) {
        System.exit(new CommandLine(new ClusterThroughput()).setCaseInsensitiveEnumValuesAllowed(true).execute(args));
    }

    @Override
    public Integer call() throws Exception {
        Path dir = Files.createTempDirectory("winnow-cluster-bench-");
        FrozenModel model;
        Path modelFile;
        if (modelPath != null) {
            model = FrozenModel.load(modelPath);
            modelFile = modelPath;
        } else {
            model = Trainer.train(SyntheticScenario.generate(400, 5), TrainingOptions.defaults(4, 11)
                    .withArchitecture(new Architecture(8, 2, 12, 4)).withEpochs(2)
                    .withLabelSource("synthetic scenario"), TrainingProgress.silent());
            modelFile = dir.resolve("bench.wnm");
            model.save(modelFile);
        }
        List<String> lines = new ArrayList<>();
        if (inputPath != null) {
            try (Stream<String> in = Files.lines(inputPath)) {
                in.limit(count).forEach(lines::add);
            }
        } else {
            SplittableRandom rnd = new SplittableRandom(2026L);
            for (int i = 0; i < count; i++) {
                lines.add(SyntheticScenario.draw(rnd).toText());
            }
        }
        Path input = Files.write(dir.resolve("input.txt"), lines);
        List<String> keeps = List.of("h11=2..5", "chi=-150..0");

        long t0 = System.nanoTime();
        int exit = WinnowCli.commandLine().execute("scan", "--model", modelFile.toString(), "--input",
                input.toString(), "--keep", keeps.get(0), "--keep", keeps.get(1), "--out",
                dir.resolve("scan").toString());
        double scanSeconds = (System.nanoTime() - t0) / 1e9;
        if (exit != 0) {
            throw new IllegalStateException("scan failed with exit " + exit);
        }
        Manifest scan = Manifest.read(dir.resolve("scan").resolve("manifest.json"));

        try (EmbeddedKafkaBroker broker = EmbeddedKafkaBroker.start()) {
            String last = null;
            for (RejectsOnWire form : forms) {
                last = clusterRun(broker, form, model, input, keeps, dir, scan, scanSeconds);
            }
            System.out.println(last);
        }
        return 0;
    }

    /** One cluster run over the scan's input; prints its figures and returns the line for drivers. */
    private String clusterRun(EmbeddedKafkaBroker broker, RejectsOnWire form, FrozenModel model, Path input,
            List<String> keeps, Path dir, Manifest scan, double scanSeconds) throws Exception {
        KafkaSettings kafka = KafkaSettings.of(broker.bootstrapServers());
        RunTopics run = new RunTopics("bench-" + form.text());
        KeepRules rules = KeepRules.of(keeps, KeepRules.DEFAULT_MIN_CONFIDENCE, KeepRules.DEFAULT_NOVELTY_GUARD);
        ModelScoring scoring = new ModelScoring(model);
        ExecutorService threads = Executors.newFixedThreadPool(scorers + 1);
        long t1 = System.nanoTime();
        Timeline timeline = new Timeline(t1);
        Future<?> producer = threads.submit(() -> ClusterProducer.run(new ClusterProducer.Settings(kafka, run,
                TopicLayout.singleBroker(Math.max(scorers, 1) * 2), new InputFileSource(input), input.toString(),
                BadInputPolicy.SKIP, 2000, form), new SimpleMeterRegistry()));
        List<ClusterScorer> joined = new ArrayList<>();
        for (int i = 0; i < scorers; i++) {
            ClusterScorer s = join(kafka, run, "s" + i, scoring, rules, timeline);
            joined.add(s);
            threads.submit(s::run);
        }
        Manifest cluster = ClusterSink.run(kafka, run, dir.resolve("cluster-" + form.text()), new SinkOptions(),
                Clock.systemUTC(), new SimpleMeterRegistry(), new AtomicBoolean(true));
        double clusterSeconds = (System.nanoTime() - t1) / 1e9;
        double joinedAt = (timeline.joined.get() - t1) / 1e9;
        producer.get();
        joined.forEach(ClusterScorer::stop);
        threads.shutdown();
        long candidates = cluster.counts().candidates();
        Map<String, Long> sizes = topicSizes(kafka, run);
        System.out.printf("candidates %d (scan %d); counts equal: %s%n", candidates, scan.counts().candidates(),
                scan.counts().equals(cluster.counts()));
        System.out.printf("winnow scan      %.1f s  %.0f candidates/s%n", scanSeconds,
                scan.counts().candidates() / scanSeconds);
        System.out.printf("cluster (%d sc., %s rejects)  %.1f s  %.0f candidates/s  (%.2f of scan)%n", scorers,
                form.text(), clusterSeconds, candidates / clusterSeconds,
                candidates / clusterSeconds / (scan.counts().candidates() / scanSeconds));
        // Where a short run's time goes: until every scorer joined the run (it exists once the producer
        // created it), until the first scored batch was committed, until the last, and the sink's end.
        System.out.printf(java.util.Locale.ROOT, "cluster timeline  scorers joined %.2f s, first scored batch committed %.2f s,"
                + " last %.2f s (%d batches), sink complete %.2f s%n", joinedAt, timeline.first(), timeline.last(),
                timeline.batches.get(), clusterSeconds);
        System.out.printf("bytes/candidate  candidates topic %.1f, scored topic %.1f%n",
                sizes.get(run.candidates()) / (double) candidates, sizes.get(run.scored()) / (double) candidates);
        joined.forEach(ClusterScorer::close);
        return String.format(java.util.Locale.ROOT, "scan_rate=%.1f cluster_rate=%.1f counts_equal=%s",
                scan.counts().candidates() / scanSeconds, candidates / clusterSeconds,
                scan.counts().equals(cluster.counts()));
    }

    /** Joins once the producer has created the run; until then the run is refused. */
    /** When the scorers joined and committed their batches, in nanoseconds on the bench's clock. */
    private static final class Timeline implements ExactlyOnceRelay.Listener {
        final long start;
        final java.util.concurrent.atomic.AtomicLong joined = new java.util.concurrent.atomic.AtomicLong();
        final java.util.concurrent.atomic.AtomicLong firstCommit = new java.util.concurrent.atomic.AtomicLong(Long.MAX_VALUE);
        final java.util.concurrent.atomic.AtomicLong lastCommit = new java.util.concurrent.atomic.AtomicLong();
        final java.util.concurrent.atomic.AtomicInteger batches = new java.util.concurrent.atomic.AtomicInteger();

        Timeline(long start) {
            this.start = start;
        }

        @Override
        public void committed(int inputs, int outputs) {
            long now = System.nanoTime();
            firstCommit.accumulateAndGet(now, Math::min);
            lastCommit.accumulateAndGet(now, Math::max);
            batches.incrementAndGet();
        }

        double first() {
            return firstCommit.get() == Long.MAX_VALUE ? Double.NaN : (firstCommit.get() - start) / 1e9;
        }

        double last() {
            return lastCommit.get() == 0 ? Double.NaN : (lastCommit.get() - start) / 1e9;
        }
    }

    private static ClusterScorer join(KafkaSettings kafka, RunTopics run, String name, ModelScoring scoring,
            KeepRules rules, Timeline timeline) throws InterruptedException {
        long deadline = System.nanoTime() + Duration.ofSeconds(60).toNanos();
        while (true) {
            try {
                ClusterScorer s = ClusterScorer.join(kafka, run, name, scoring, rules, new SimpleMeterRegistry(),
                        timeline);
                timeline.joined.accumulateAndGet(System.nanoTime(), Math::max);
                return s;
            } catch (org.winnow.kafka.ClusterRefusedException e) {
                if (System.nanoTime() > deadline) {
                    throw e;
                }
                Thread.sleep(200);
            }
        }
    }

    private static Map<String, Long> topicSizes(KafkaSettings kafka, RunTopics run) throws Exception {
        Map<String, Long> sizes = new java.util.HashMap<>();
        try (Admin admin = Admin.create(kafka.common())) {
            int node = admin.describeCluster().nodes().get().iterator().next().id();
            Map<String, LogDirDescription> dirs = admin.describeLogDirs(List.of(node)).allDescriptions().get().get(node);
            for (LogDirDescription d : dirs.values()) {
                d.replicaInfos().forEach((tp, info) -> sizes.merge(tp.topic(), info.size(), Long::sum));
            }
        }
        return sizes;
    }
}
