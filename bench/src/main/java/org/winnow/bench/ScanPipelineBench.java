package org.winnow.bench;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicLong;
import org.winnow.app.scan.ScanJob;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Sequencer;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.local.LocalPipeline;
import org.winnow.pipeline.metrics.SourceMetrics;
import org.winnow.producer.source.InputFileSource;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.CandidateScorer;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.CrashHook;
import org.winnow.sink.SinkOptions;
import org.winnow.sink.SurvivorSink;

/**
 * End-to-end candidates per second of {@code winnow scan} in one JVM against each stage alone: the
 * source (read, parse, validate, canonical form, dedup), the scorer (invariants, model, rules) on N
 * threads, and the sink (format, write, checkpoints). Not a JMH benchmark: the stages are
 * multi-threaded and stateful, so it times whole passes, best of {@code reps} rounds after a warm-up round.
 *
 * <p>Run: {@code bench/scan-pipeline.sh [candidates] [threads] [reps] [model.wnm]}.
 */
public final class ScanPipelineBench {
    private ScanPipelineBench() {}

    public static void main(String[] args) throws Exception {
        int count = args.length > 0 ? Integer.parseInt(args[0]) : 100_000;
        int threads = args.length > 1 ? Integer.parseInt(args[1]) : Runtime.getRuntime().availableProcessors();
        int reps = args.length > 2 ? Integer.parseInt(args[2]) : 3;
        PrintStream out = System.out;
        FrozenModel model = args.length > 3 ? FrozenModel.load(Path.of(args[3])) : syntheticModel();
        Path work = Files.createTempDirectory("winnow-scan-bench");
        Path input = work.resolve("input.txt");
        List<String> lines = new ArrayList<>(count);
        SplittableRandom rnd = new SplittableRandom(2026);
        for (int i = 0; i < count; i++) {
            lines.add(randomThreefold(rnd).toText());
        }
        Files.write(input, lines);
        ModelScoring scoring = new ModelScoring(model);
        KeepRules rules = KeepRules.of(List.of("h11=2..6", "chi=-200..-40"), 0.8, 0.99);

        List<Candidate> candidates = new ArrayList<>();
        List<Scored> scored = new ArrayList<>();
        Pass sourcePass = () -> {
            candidates.clear();
            Sequencer s = new Sequencer(0, 0, BadInputPolicy.SKIP, candidates::add, new SourceMetrics(new SimpleMeterRegistry()));
            new InputFileSource(input).run(s);
            return s.report().candidates();
        };
        Pass scorerPass = () -> scoreAll(candidates, scoring, rules, threads, scored);
        Pass sinkPass = () -> sinkAlone(work, scored);
        Pass endToEndPass = () -> {
            Path dir = Files.createTempDirectory(work, "e2e");
            ScanJob.Settings settings = new ScanJob.Settings(new InputFileSource(input), input, null, scoring,
                    rules, dir, new SinkOptions(), new LocalPipeline.Options(threads, 1024, 8192), BadInputPolicy.SKIP);
            return ScanJob.run(settings, new SimpleMeterRegistry(), Clock.systemUTC(), CrashHook.NONE, st -> {})
                    .manifest().counts().scored();
        };
        Pass[] passes = {sourcePass, scorerPass, sinkPass, endToEndPass};
        double[] rate = new double[4];
        double[] cpu = new double[4];
        // Round 0 warms every stage up; the rounds after it interleave the stages, so that a burst of
        // foreign load on the shared machine hurts them alike, and the best of each is kept.
        for (int round = 0; round <= reps; round++) {
            for (int i = 0; i < passes.length; i++) {
                double[] r = time(passes[i]);
                if (round > 0 && r[0] > rate[i]) {
                    rate[i] = r[0];
                    cpu[i] = r[1];
                }
            }
        }
        double source = rate[0];
        double scorer = rate[1];
        double sink = rate[2];
        double endToEnd = rate[3];
        double slowest = Math.min(source, Math.min(scorer, sink));
        out.printf(Locale.ROOT, "candidates %d (distinct %d), scorer threads %d, best of %d after a warm-up%n", count,
                candidates.size(), threads, reps);
        out.printf(Locale.ROOT, "source alone     %,10.0f candidates/s  %8.1f us CPU each%n", source, cpu[0]);
        out.printf(Locale.ROOT, "scorer alone     %,10.0f candidates/s  %8.1f us CPU each (%d threads)%n", scorer, cpu[1],
                threads);
        out.printf(Locale.ROOT, "sink alone       %,10.0f candidates/s  %8.1f us CPU each%n", sink, cpu[2]);
        out.printf(Locale.ROOT, "end to end       %,10.0f candidates/s  %8.1f us CPU each%n", endToEnd, cpu[3]);
        out.printf(Locale.ROOT, "end to end / slowest stage: %.2f (wall); stage CPU sum / end-to-end CPU: %.2f%n",
                endToEnd / slowest, (cpu[0] + cpu[1] + cpu[2]) / cpu[3]);
    }

    private interface Pass {
        long run() throws Exception;
    }

    /** Candidates per second of one pass, and the process CPU microseconds per candidate. */
    private static double[] time(Pass pass) throws Exception {
        com.sun.management.OperatingSystemMXBean os = (com.sun.management.OperatingSystemMXBean)
                java.lang.management.ManagementFactory.getOperatingSystemMXBean();
        long cpu0 = os.getProcessCpuTime();
        long t0 = System.nanoTime();
        long done = pass.run();
        return new double[] {done / ((System.nanoTime() - t0) / 1e9), (os.getProcessCpuTime() - cpu0) / 1e3 / done};
    }

    private static long scoreAll(List<Candidate> candidates, ModelScoring scoring, KeepRules rules, int threads,
            List<Scored> into) throws InterruptedException {
        Scored[] out = new Scored[candidates.size()];
        AtomicLong next = new AtomicLong();
        List<Thread> ts = new ArrayList<>();
        for (int t = 0; t < threads; t++) {
            ts.add(new Thread(() -> {
                CandidateScorer scorer = CandidateScorer.of(scoring, rules);
                for (long i = next.getAndIncrement(); i < out.length; i = next.getAndIncrement()) {
                    out[(int) i] = scorer.score(candidates.get((int) i));
                }
            }));
        }
        ts.forEach(Thread::start);
        for (Thread t : ts) {
            t.join();
        }
        into.clear();
        into.addAll(List.of(out));
        return out.length;
    }

    private static long sinkAlone(Path work, List<Scored> scored) throws Exception {
        Path dir = Files.createTempDirectory(work, "sink");
        SourceReport done = new SourceReport(scored.size(), 0, scored.size(), 0, 0, List.of(), true);
        SurvivorSink sink = SurvivorSink.open(dir, new org.winnow.sink.ScanInfo("bench", "bench", null, List.of(), "bench"),
                new SinkOptions(), Clock.systemUTC(), () -> done,
                CrashHook.NONE);
        SimpleMeterRegistry reg = new SimpleMeterRegistry();
        sink.open(StageContext.terminal("sink", reg));
        for (Scored s : scored) {
            sink.accept(s);
        }
        sink.finish();
        sink.close();
        return scored.size();
    }

    /**
     * A random Calabi-Yau three-fold configuration: K in 1..7 columns, sum n = K + 3, each row's n_r + 1
     * degree units spread over the columns, every column of total degree at least 2.
     */
    static Configuration randomThreefold(SplittableRandom rnd) {
        while (true) {
            int k = 1 + rnd.nextInt(7);
            int sumN = k + 3;
            int m = 1 + rnd.nextInt(Math.min(sumN, 8));
            int[] n = new int[m];
            java.util.Arrays.fill(n, 1);
            for (int extra = sumN - m; extra > 0; extra--) {
                n[rnd.nextInt(m)]++;
            }
            int[][] q = new int[m][k];
            for (int r = 0; r < m; r++) {
                for (int unit = 0; unit <= n[r]; unit++) {
                    q[r][rnd.nextInt(k)]++;
                }
            }
            boolean ok = true;
            for (int j = 0; j < k && ok; j++) {
                int sum = 0;
                for (int r = 0; r < m; r++) {
                    sum += q[r][j];
                }
                ok = sum >= 2;
            }
            if (ok) {
                return Configuration.of(n, q);
            }
        }
    }

    private static FrozenModel syntheticModel() {
        TrainingOptions o = TrainingOptions.defaults(8, 3).withEpochs(3).withLabelSource("synthetic scenario");
        return Trainer.train(SyntheticScenario.generate(2000, 7), o, TrainingProgress.silent());
    }
}
