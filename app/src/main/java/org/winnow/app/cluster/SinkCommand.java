package org.winnow.app.cluster;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.atomic.AtomicBoolean;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.KafkaConnectionOptions;
import org.winnow.app.cli.MetricsPortOption;
import org.winnow.app.cli.ProcessMetrics;
import org.winnow.app.cli.WinnowCli;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunTopics;
import org.winnow.pipeline.metrics.StageKind;
import org.winnow.sink.Manifest;
import org.winnow.sink.SinkOptions;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow sink --kafka HOST:PORT --run ID --out DIR}: writes a cluster run's survivors to the same
 * files as {@code winnow scan}, exactly once; restarted with the same DIR it continues.
 */
@Command(name = "sink", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Write a cluster run's survivors from Kafka to DIR; ends when the run is complete."})
public final class SinkCommand implements Callable<Integer> {
    /** The sink's name in its run's metric snapshots; a run has one sink. */
    static final String SINK_INSTANCE = "sink";

    @Spec
    CommandSpec spec;

    @picocli.CommandLine.Mixin
    KafkaConnectionOptions connection = new KafkaConnectionOptions();

    @picocli.CommandLine.Mixin
    MetricsPortOption metrics = new MetricsPortOption();

    @Option(names = "--run", required = true, paramLabel = "ID", description = "The run to write.")
    String run;

    @Option(names = "--out", required = true, paramLabel = "DIR", description = "The scan directory.")
    Path out;

    @Option(names = "--rejects", description = "Also write the rejected candidates with their reasons.")
    boolean rejects;

    @Option(names = "--lines-per-file", paramLabel = "N", description = "Survivor lines per file (default ${DEFAULT-VALUE}).")
    int linesPerFile = SinkOptions.DEFAULT_LINES_PER_FILE;

    @Option(names = "--checkpoint-records", paramLabel = "N",
            description = "Checkpoint at least every N records (default ${DEFAULT-VALUE}), and every 5 s.")
    int checkpointRecords = SinkOptions.DEFAULT_CHECKPOINT_RECORDS;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        KafkaSettings settings;
        RunTopics topics;
        SinkOptions options;
        try {
            settings = connection.settings();
            topics = new RunTopics(run);
            options = new SinkOptions(linesPerFile, rejects, checkpointRecords, SinkOptions.DEFAULT_CHECKPOINT_EVERY);
            metrics.validate();
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "sink", e.getMessage());
        }
        AtomicBoolean running = new AtomicBoolean(true);
        CountDownLatch finished = new CountDownLatch(1);
        ShutdownGrace.install(() -> running.set(false), finished, Duration.ofSeconds(15));
        try (ProcessMetrics process = metrics.open(err, "sink")) {
            try (RunAdmin admin = RunAdmin.connect(settings)) {
                admin.requireRun(topics);
            }
            Manifest m;
            try (MetricsPublisher snapshots = StageReporter.start(settings, topics, StageKind.SINK, SINK_INSTANCE,
                    process.registry(), Clock.systemUTC(), StageReporter.PERIOD)) {
                m = ClusterSink.run(settings, topics, out, options, Clock.systemUTC(), process.registry(), running);
            }
            if (m == null) {
                err.println("winnow sink: stopped; what was committed stays; rerun the same command to continue");
                err.flush();
                return 1;
            }
            Manifest.Counts c = m.counts();
            spec.commandLine().getOut().printf("run %s complete: %d candidates, %d kept, %d rejected; survivors in %s%n",
                    run, c.candidates(), c.kept(), c.rejected(), out);
            spec.commandLine().getOut().flush();
            return 0;
        } catch (ClusterRefusedException e) {
            return Exit.badInput(err, "sink", e.getMessage());
        } catch (IOException e) {
            return Exit.badInput(err, "sink", e.getMessage());
        } finally {
            finished.countDown();
        }
    }
}
