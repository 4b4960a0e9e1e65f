package org.winnow.app.cluster;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.atomic.AtomicLong;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.KafkaConnectionOptions;
import org.winnow.app.cli.MetricsPortOption;
import org.winnow.app.cli.ProcessMetrics;
import org.winnow.app.cli.ProofBudget;
import org.winnow.app.cli.WinnowCli;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.ExactlyOnceRelay;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RunTopics;
import org.winnow.pipeline.metrics.StageKind;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.rules.RulesFile;
import org.winnow.scorer.stage.ModelScoring;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow score --kafka HOST:PORT --run ID --model M ...}: one scorer of a cluster run. Start as many
 * as the candidates topic has partitions; they share the work in one consumer group, and any of them may
 * be killed and restarted without losing or repeating a candidate.
 */
@Command(name = "score", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Score a cluster run's candidates from Kafka, exactly once, until stopped (SIGTERM)."})
public final class ScoreCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @picocli.CommandLine.Mixin
    KafkaConnectionOptions connection = new KafkaConnectionOptions();

    @picocli.CommandLine.Mixin
    MetricsPortOption metrics = new MetricsPortOption();

    @Option(names = "--run", required = true, paramLabel = "ID", description = "The run to join.")
    String run;

    @Option(names = "--model", required = true, paramLabel = "M", description = "The frozen model (.wnm).")
    Path model;

    @Option(names = "--keep", paramLabel = "INVARIANT=LO..HI", description = "Keep range (repeatable), as for scan.")
    List<String> keeps = new ArrayList<>();

    @Option(names = "--rules-file", paramLabel = "F", description = "Rules file, as for scan.")
    Path rulesFile;

    @Option(names = "--min-confidence", paramLabel = "X", description = "As for scan (default 0.85).")
    Double minConfidence;

    @Option(names = "--novelty", paramLabel = "X", description = "As for scan (default 0.99).")
    Double novelty;

    @Option(names = "--prove", paramLabel = "TIME",
            description = "Opt-in proof step: run the exact Hodge backend for up to TIME (200ms, 2s) on each candidate "
                    + "whose verdict rests on an unproved value a rule names; off by default. Counts of settled, "
                    + "unsettled and out-of-time candidates go to the manifest and the metrics.")
    String prove;

    @Option(names = "--instance", paramLabel = "NAME",
            description = "This scorer's name in the group; restart a killed scorer under the same name "
                    + "(default: host name and process id).")
    String instance;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        KafkaSettings settings;
        RunTopics topics;
        KeepRules rules;
        ModelScoring scoring;
        try {
            settings = connection.settings();
            topics = new RunTopics(run);
            rules = rules();
            metrics.validate();
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "score", e.getMessage());
        } catch (IOException e) {
            return Exit.badInput(err, "score", "--rules-file " + rulesFile + ": cannot read (" + e.getMessage() + ")");
        }
        try {
            scoring = ModelScoring.load(model);
        } catch (IOException | RuntimeException e) {
            return Exit.badInput(err, "score", "--model " + model + ": " + e.getMessage());
        }
        try {
            scoring = scoring.withProofBudget(ProofBudget.parse(prove), System::nanoTime);
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "score", e.getMessage());
        }
        String name = instance != null ? instance : defaultInstance();
        AtomicLong scored = new AtomicLong();
        ExactlyOnceRelay.Listener progress = new ExactlyOnceRelay.Listener() {
            @Override
            public void committed(int inputs, int outputs) {
                scored.addAndGet(inputs);
            }
        };
        CountDownLatch finished = new CountDownLatch(1);
        try (ProcessMetrics process = metrics.open(err, "score");
                ClusterScorer scorer = ClusterScorer.join(settings, topics, name, scoring, rules, process.registry(),
                        progress)) {
            ShutdownGrace.install(scorer::stop, finished, Duration.ofSeconds(15));
            err.println("winnow score: scorer " + name + " joined run " + run + " on " + connection.kafka);
            err.flush();
            try (MetricsPublisher snapshots = StageReporter.start(settings, topics, StageKind.SCORE, name,
                    process.registry(), Clock.systemUTC(), StageReporter.PERIOD)) {
                scorer.run();
            }
            err.println("winnow score: scorer " + name + " stopped after " + scored.get() + " candidates");
            err.flush();
            return 0;
        } catch (ClusterRefusedException e) {
            return Exit.badInput(err, "score", e.getMessage());
        } catch (IOException e) {
            return Exit.badInput(err, "score", e.getMessage());
        } finally {
            finished.countDown();
        }
    }

    private KeepRules rules() throws IOException {
        List<String> all = new ArrayList<>();
        OptionalDouble fileConfidence = OptionalDouble.empty();
        OptionalDouble fileNovelty = OptionalDouble.empty();
        if (rulesFile != null) {
            RulesFile.Contents c = RulesFile.read(rulesFile);
            all.addAll(c.keeps());
            fileConfidence = c.minConfidence();
            fileNovelty = c.noveltyGuard();
        }
        all.addAll(keeps);
        double conf = minConfidence != null ? minConfidence : fileConfidence.orElse(KeepRules.DEFAULT_MIN_CONFIDENCE);
        double nov = novelty != null ? novelty : fileNovelty.orElse(KeepRules.DEFAULT_NOVELTY_GUARD);
        return KeepRules.of(all, conf, nov);
    }

    private static String defaultInstance() {
        String host;
        try {
            host = java.net.InetAddress.getLocalHost().getHostName();
        } catch (IOException e) {
            host = "host";
        }
        return host.replaceAll("[^A-Za-z0-9_-]", "-") + "-" + ProcessHandle.current().pid();
    }
}
