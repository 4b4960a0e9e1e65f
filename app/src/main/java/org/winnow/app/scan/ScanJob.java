package org.winnow.app.scan;

import io.micrometer.core.instrument.MeterRegistry;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Clock;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.Consumer;
import org.winnow.app.cli.RunIds;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.CandidateSource;
import org.winnow.pipeline.Sequencer;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.local.LocalPipeline;
import org.winnow.pipeline.local.PipelineException;
import org.winnow.producer.source.EnumeratedSpace;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ScorerStage;
import org.winnow.scorer.stage.ScoringFunctions;
import org.winnow.sink.CrashHook;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanFiles;
import org.winnow.sink.ScanInfo;
import org.winnow.sink.SinkOptions;
import org.winnow.sink.SurvivorSink;

/**
 * One scan in this JVM: the source, N scorer workers and the sink over bounded channels, continuing
 * from the directory's last committed point when it holds one.
 */
public final class ScanJob {
    /**
     * Everything that defines a scan.
     *
     * @param source      where candidates come from
     * @param sourceFile  the input file whose bytes identify the scan, or null for an enumeration
     * @param space       the enumerated space (it identifies the scan and its bounds go to the manifest), or
     *                    null for an input file
     * @param scoring     the per-thread scoring parts
     * @param rules       the keep rules
     * @param out         the scan directory
     * @param sink        file options
     * @param pipeline    threads and queue sizes
     * @param policy      what to do with a bad input line
     */
    public record Settings(CandidateSource source, Path sourceFile, EnumeratedSpace space,
            ScoringFunctions scoring, KeepRules rules, Path out, SinkOptions sink, LocalPipeline.Options pipeline,
            BadInputPolicy policy) {
        public Settings {
            Objects.requireNonNull(source, "source");
            Objects.requireNonNull(scoring, "scoring");
            Objects.requireNonNull(rules, "rules");
            Objects.requireNonNull(out, "out");
            Objects.requireNonNull(sink, "sink");
            Objects.requireNonNull(pipeline, "pipeline");
            Objects.requireNonNull(policy, "policy");
        }
    }

    /** What a completed scan left: its manifest and the pipeline's high-water marks. */
    public record Outcome(Manifest manifest, LocalPipeline.Result pipeline) {}

    private ScanJob() {}

    /** The run id of {@code s}; see {@link RunIds}. */
    public static String runId(Settings s) throws IOException {
        List<String> parts = new ArrayList<>();
        parts.add("winnow scan format " + ScanFiles.FORMAT_VERSION);
        parts.add(s.sourceFile() != null ? "input file" : "enumeration " + (s.space() == null ? null : s.space().key()));
        parts.addAll(s.rules().describe());
        parts.add("model " + s.scoring().modelChecksum());
        if (s.scoring().proofBudget() != null) {
            parts.add("prove " + s.scoring().proofBudget().toMillis() + " ms"); // the proof step can change verdicts
        }
        parts.add("lines per file " + s.sink().linesPerFile());
        parts.add("rejects " + s.sink().writeRejects());
        return RunIds.of(parts, s.sourceFile());
    }

    /**
     * Runs (or continues) the scan to its end.
     *
     * @param started receives the live status once the run has started
     * @throws IOException       when the directory cannot be used (another scan, not empty, unreadable)
     * @throws PipelineException when the run stopped at a failure; what was committed stays committed
     */
    public static Outcome run(Settings s, MeterRegistry registry, Clock clock, CrashHook hook,
            Consumer<ScanStatus> started) throws IOException, PipelineException, InterruptedException {
        AtomicReference<Sequencer> sequencer = new AtomicReference<>();
        java.util.function.Supplier<SourceReport> report = () -> {
            Sequencer q = sequencer.get();
            return q == null ? null : q.report();
        };
        ScanInfo info = new ScanInfo(runId(s), s.source().description(),
                s.space() == null ? null : s.space().manifestValue(), s.rules().describe(),
                s.scoring().modelChecksum(), s.scoring().modelFile());
        SurvivorSink sink = SurvivorSink.open(s.out(), info, s.sink(), clock, report, hook);
        try {
            started.accept(new ScanStatus(registry, report, s.source().size()));
        } catch (RuntimeException e) {
            sink.close(); // releases the directory's lock; the pipeline closes it on every later path
            throw e;
        }
        LocalPipeline.Result result = new LocalPipeline(s.pipeline(), registry).run(s.source(), s.policy(),
                sink.resumeFrom(), i -> new ScorerStage(s.scoring(), s.rules(), System::nanoTime), sink, sequencer::set);
        return new Outcome(Manifest.read(s.out().resolve(ScanFiles.MANIFEST)), result);
    }
}
