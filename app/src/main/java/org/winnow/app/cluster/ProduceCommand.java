package org.winnow.app.cluster;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.KafkaConnectionOptions;
import org.winnow.app.cli.MetricsPortOption;
import org.winnow.app.cli.ProcessMetrics;
import org.winnow.app.cli.WinnowCli;
import org.winnow.pipeline.BadInputException;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.SourceReport;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RejectsOnWire;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.TopicLayout;
import org.winnow.pipeline.metrics.StageKind;
import org.winnow.producer.source.InputFileSource;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow produce --kafka HOST:PORT --run ID --input F}: creates a cluster run (its topics and
 * descriptor) and sends the input's candidates, exactly once; run it again after a crash to resume.
 */
@Command(name = "produce", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Create a cluster run on Kafka and send its candidates from an input file, exactly once."})
public final class ProduceCommand implements Callable<Integer> {
    /** The producer's name in its run's metric snapshots; a run has one producer (shard 0). */
    static final String PRODUCER_INSTANCE = "producer";

    @Spec
    CommandSpec spec;

    @picocli.CommandLine.Mixin
    KafkaConnectionOptions connection = new KafkaConnectionOptions();

    @picocli.CommandLine.Mixin
    MetricsPortOption metrics = new MetricsPortOption();

    @Option(names = "--run", required = true, paramLabel = "ID", description = "The run to create or continue.")
    String run;

    @Option(names = "--input", required = true, paramLabel = "F", description = "Configurations, one a line.")
    Path input;

    @Option(names = "--partitions", paramLabel = "N",
            description = "Partitions of the run's topics: the most scorers that can work at once (default ${DEFAULT-VALUE}).")
    int partitions = 6;

    @Option(names = "--replication", paramLabel = "N", description = "Replication factor (default ${DEFAULT-VALUE}).")
    short replication = 1;

    @Option(names = "--chunk", paramLabel = "N",
            description = "Candidates per transaction (default ${DEFAULT-VALUE}).")
    int chunk = 2000;

    @Option(names = "--rejects",
            description = "Carry rejected candidates whole, for a sink that writes them (winnow sink --rejects); "
                    + "otherwise a rejected candidate crosses the wire as its key, seq and reason only.")
    boolean rejects;

    @Option(names = "--strict", description = "Fail on the first malformed input line instead of skipping it.")
    boolean strict;

    @Override
    public Integer call() throws Exception {
        PrintWriter err = spec.commandLine().getErr();
        ClusterProducer.Settings settings;
        try {
            if (!Files.isReadable(input)) {
                return Exit.badInput(err, "produce", "--input " + input + ": no such readable file");
            }
            if (!Files.isRegularFile(input)) {
                // The run's identity is a digest of the file, read before the file is sent: a pipe or a device
                // cannot be read twice, and /dev/zero never ends.
                return Exit.badInput(err, "produce", "--input " + input + ": not a regular file (a directory, a pipe "
                        + "or a device); give a file of configurations, one a line");
            }
            metrics.validate();
            KafkaSettings k = connection.settings();
            String identity = ClusterProducer.sourceIdentity(input);
            settings = new ClusterProducer.Settings(k, new RunTopics(run), new TopicLayout(partitions, replication),
                    new InputFileSource(input), identity, strict ? BadInputPolicy.FAIL : BadInputPolicy.SKIP, chunk,
                    rejects ? RejectsOnWire.WHOLE : RejectsOnWire.SLIM);
        } catch (IllegalArgumentException e) {
            return Exit.badInput(err, "produce", e.getMessage());
        }
        try (ProcessMetrics process = metrics.open(err, "produce")) {
            ClusterProducer.createRun(settings);
            SourceReport r;
            try (MetricsPublisher snapshots = StageReporter.start(settings.kafka(), settings.run(), StageKind.PRODUCE,
                    PRODUCER_INSTANCE, process.registry(), Clock.systemUTC(), StageReporter.PERIOD)) {
                r = ClusterProducer.run(settings, process.registry());
            }
            spec.commandLine().getOut().printf("run %s: %d candidates sent (%d duplicates, %d bad input lines)%n",
                    run, r.candidates(), r.duplicates(), r.badInputs());
            spec.commandLine().getOut().flush();
            return 0;
        } catch (ClusterRefusedException e) {
            return Exit.badInput(err, "produce", e.getMessage());
        } catch (BadInputException e) {
            return Exit.badInput(err, "produce", input + " " + e.getMessage() + " (--strict)");
        } catch (java.io.IOException e) {
            return Exit.badInput(err, "produce", e.getMessage());
        }
    }
}
