package org.winnow.app.scan;

import org.winnow.producer.source.InputFileSource;
import org.winnow.producer.source.EnumerationSource;
import org.winnow.producer.source.EnumeratedSpace;
import org.winnow.app.cli.MetricsServer;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.OptionalLong;
import java.util.concurrent.atomic.AtomicReference;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.BadInputPolicy;
import org.winnow.pipeline.local.LocalPipeline;
import org.winnow.pipeline.local.PipelineException;
import org.winnow.producer.Bounds;
import org.winnow.producer.Enumerator;
import org.winnow.producer.ExclusionSet;
import org.winnow.producer.ShardSpec;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.stage.ModelScoring;
import org.winnow.sink.CrashHook;
import org.winnow.sink.Manifest;
import org.winnow.sink.SinkOptions;

class ScanJobTest {
    private static ScanJob.Settings settings(ScanFixtures.Input in, Path out) {
        return new ScanJob.Settings(new InputFileSource(in.file()), in.file(), null,
                new ModelScoring(ScanFixtures.model()), KeepRules.of(List.of("h11=2..5", "chi=-150..0"), 0.5, 0.9), out,
                new SinkOptions(30, true, 40, Duration.ofSeconds(1)), new LocalPipeline.Options(2, 8, 64),
                BadInputPolicy.SKIP);
    }

    /** The three-folds with at most three rows under the lossless rules: small, and scanned in well under a second. */
    static final EnumeratedSpace SMALL_SPACE = new EnumeratedSpace(Bounds.complete(3).withRows(1, 3), ExclusionSet.LOSSLESS,
            ShardSpec.ALL);

    private static ScanJob.Settings boundsSettings(Path out) {
        return new ScanJob.Settings(new EnumerationSource(SMALL_SPACE, EnumerationSource.COUNT_BUDGET, System::nanoTime),
                null, SMALL_SPACE, new ModelScoring(ScanFixtures.model()),
                KeepRules.of(List.of("h11=2..5", "chi=-150..0"), 0.5, 0.9), out,
                new SinkOptions(30, true, 40, Duration.ofSeconds(1)), new LocalPipeline.Options(2, 8, 64),
                BadInputPolicy.SKIP);
    }

    private static double sum(String scrape, String metric) {
        Matcher m = Pattern.compile("(?m)^" + metric + "(\\{[^}]*\\})? ([0-9.eE+-]+)$").matcher(scrape);
        double s = 0;
        while (m.find()) {
            s += Double.parseDouble(m.group(2));
        }
        return s;
    }

    @Test
    void theMetricsEndpointReconcilesWithTheManifest(@TempDir Path dir) throws Exception {
        ScanFixtures.Input in = ScanFixtures.input(dir, 9, 300);
        PrometheusMeterRegistry registry = new PrometheusMeterRegistry(PrometheusConfig.DEFAULT);
        AtomicReference<ScanStatus> status = new AtomicReference<>();
        try (MetricsServer server = new MetricsServer(registry, 0)) {
            ScanJob.Outcome o = ScanJob.run(settings(in, dir.resolve("out")), registry, Clock.systemUTC(), CrashHook.NONE,
                    status::set);
            HttpResponse<String> r = HttpClient.newHttpClient().send(HttpRequest.newBuilder(
                    URI.create("http://127.0.0.1:" + server.port() + "/metrics")).build(), HttpResponse.BodyHandlers.ofString());
            assertEquals(200, r.statusCode());
            assertTrue(r.headers().firstValue("Content-Type").orElse("").startsWith("text/plain"));
            String text = r.body();
            Manifest.Counts c = o.manifest().counts();
            assertEquals(c.candidates(), sum(text, "winnow_source_candidates_total"));
            assertEquals(c.scored(), sum(text, "winnow_scorer_verdicts_total"));
            assertEquals(c.scored(), sum(text, "winnow_sink_records_total"));
            assertEquals(c.scored(), sum(text, "winnow_scorer_novelty_total"), "every scored candidate in one novelty bin");
            assertEquals(c.rejected(), sum(text, "winnow_scorer_verdicts_total\\{reason=\"[^\"]*\",verdict=\"reject\"\\}"));
            assertEquals(c.kept(), sum(text, "winnow_scorer_verdicts_total\\{reason=\"[^\"]*\",verdict=\"keep\"\\}"));
            for (var e : c.rejectedByReason().entrySet()) {
                assertEquals((double) e.getValue(), sum(text, "winnow_scorer_verdicts_total\\{reason=\"" + e.getKey()
                        + "\",verdict=\"reject\"\\}"), e.getKey());
            }
            for (var e : c.keptByReason().entrySet()) {
                assertEquals((double) e.getValue(), sum(text, "winnow_scorer_verdicts_total\\{reason=\"" + e.getKey()
                        + "\",verdict=\"keep\"\\}"), e.getKey());
            }
            assertEquals(c.duplicates(), sum(text, "winnow_source_duplicates_total"));
            assertEquals(c.badInput(), sum(text, "winnow_source_bad_input_total"));
            assertTrue(text.contains("winnow_channel_depth{channel=\"candidates\"}"), "no channel gauge");
            assertTrue(o.pipeline().maxCandidateDepth() <= 8 && o.pipeline().maxScoredDepth() <= 8);
        }
        String line = status.get().line(1_000_000_000L);
        assertTrue(line.startsWith(String.format("%,d scored", status.get().scored())), line);
        assertTrue(line.contains("rejected ") && line.contains("kept as novel"), line);
    }

    @Test
    void abortedWithTheRealModelAndRerunGivesTheSameFiles(@TempDir Path dir) throws Exception {
        ScanFixtures.Input in = ScanFixtures.input(dir, 21, 500);
        abortRerunAndCompare(dir, out -> settings(in, out), 5);
    }

    @Test
    void abortedFromBoundsAndRerunGivesTheSameFiles(@TempDir Path dir) throws Exception {
        Manifest m = abortRerunAndCompare(dir, ScanJobTest::boundsSettings, 11);
        assertEquals(new Enumerator().count(SMALL_SPACE.bounds(), SMALL_SPACE.rules(), SMALL_SPACE.shard()).total(),
                m.counts().candidates());
        assertEquals(0, m.counts().duplicates());
    }

    /**
     * Runs the scan once uninterrupted, then aborts it at ten random durable steps in another directory and
     * reruns it to the end there: counts, file names and every committed file must equal the uninterrupted run.
     */
    private static Manifest abortRerunAndCompare(Path dir, java.util.function.Function<Path, ScanJob.Settings> settings,
            long seed) throws Exception {
        Path ref = dir.resolve("ref");
        ScanJob.run(settings.apply(ref), new PrometheusMeterRegistry(PrometheusConfig.DEFAULT), Clock.systemUTC(),
                CrashHook.NONE, s -> {});
        Path resumed = dir.resolve("resumed");
        java.util.SplittableRandom rnd = new java.util.SplittableRandom(seed);
        int aborts = 0;
        for (int i = 0; i < 10; i++) {
            int at = 1 + rnd.nextInt(25);
            int[] calls = {0};
            try {
                ScanJob.run(settings.apply(resumed), new PrometheusMeterRegistry(PrometheusConfig.DEFAULT),
                        Clock.systemUTC(), step -> {
                            if (++calls[0] == at) {
                                throw new IllegalStateException("crash before " + step);
                            }
                        }, s -> {});
            } catch (PipelineException | IllegalStateException e) {
                // A crash inside the pipeline, or while the sink opens the directory (its first checkpoint).
                aborts++;
            }
        }
        ScanJob.Outcome done = ScanJob.run(settings.apply(resumed), new PrometheusMeterRegistry(PrometheusConfig.DEFAULT),
                Clock.systemUTC(), CrashHook.NONE, s -> {});
        assertTrue(aborts >= 5, "aborts " + aborts);
        Manifest a = Manifest.read(ref.resolve("manifest.json"));
        assertTrue(a.complete() && done.manifest().complete());
        assertEquals(a.counts(), done.manifest().counts());
        assertEquals(a.survivorFiles(), done.manifest().survivorFiles());
        assertEquals(a.rejectFiles(), done.manifest().rejectFiles());
        assertTrue(a.survivorFiles().size() > 1, "a single file does not test the roll-over");
        for (String f : a.survivorFiles()) {
            assertEquals(Files.readString(ref.resolve(f)), Files.readString(resumed.resolve(f)), f);
        }
        for (String f : a.rejectFiles()) {
            assertEquals(Files.readString(ref.resolve(f)), Files.readString(resumed.resolve(f)), f);
        }
        return done.manifest();
    }

    @Test
    void theSizeOfASpaceIsItsCountWithinTheBudgetAndUnknownPastIt() {
        long total = new Enumerator().count(SMALL_SPACE.bounds(), SMALL_SPACE.rules(), SMALL_SPACE.shard()).total();
        assertEquals(OptionalLong.of(total),
                new EnumerationSource(SMALL_SPACE, Duration.ofHours(1), System::nanoTime).size());
        // A clock that moves a millisecond at every reading runs out of a 5 ms budget long before the end.
        long[] now = {0};
        EnumerationSource slow = new EnumerationSource(SMALL_SPACE, Duration.ofMillis(5), () -> now[0] += 1_000_000);
        assertEquals(OptionalLong.empty(), slow.size());
        assertTrue(total > 10, "the space is too small to test the budget: " + total);
    }

    @Test
    void statusShowsRatesSharesAndAnEta() {
        var reg = new io.micrometer.core.instrument.simple.SimpleMeterRegistry();
        var metrics = new org.winnow.pipeline.metrics.ScorerMetrics(reg);
        ScanStatus st = new ScanStatus(reg, () -> new org.winnow.pipeline.SourceReport(0, 0, 0, 0, 0, List.of(), false),
                OptionalLong.of(1000));
        // No interval yet: no rate and no ETA, rather than "0/s".
        assertEquals("0 scored, --/s, rejected 0.0%, kept as novel 0", st.line(0));
        var cfg = org.winnow.geometry.Configuration.parse("4:5");
        var cand = new org.winnow.pipeline.Candidate(cfg, "4:5", 0, 0);
        var inv = new org.winnow.pipeline.ExactInvariants(3, -200, 1, 1, 1);
        var est = org.winnow.pipeline.Prediction.of(1, 1, 101, 0.5, "");
        for (int i = 0; i < 100; i++) {
            org.winnow.pipeline.Reason r = i < 30 ? org.winnow.pipeline.Reason.EXACT_CHI_OUT_OF_RANGE
                    : i < 40 ? org.winnow.pipeline.Reason.KEPT_AS_NOVEL : org.winnow.pipeline.Reason.KEPT_IN_RANGE;
            metrics.scored(org.winnow.pipeline.Scored.of(cand, inv, est, r), 10);
        }
        // 100 scored in 2 s: 50/s; 900 left: 18 s.
        assertEquals("100 scored, 50/s, rejected 30.0% (exact-chi-out-of-range 30.0%), kept as novel 10, ETA 0:00:18",
                st.line(2_000_000_000L));
        // A measured standstill is a rate: 0 in the next interval blends into 0.7 * 50 = 35/s.
        String still = st.line(3_000_000_000L);
        assertTrue(still.startsWith("100 scored, 35/s, "), still);
        // Started a period before its first line (as the plain status is), the first line has a rate.
        var reg2 = new io.micrometer.core.instrument.simple.SimpleMeterRegistry();
        var metrics2 = new org.winnow.pipeline.metrics.ScorerMetrics(reg2);
        ScanStatus later = new ScanStatus(reg2, () -> new org.winnow.pipeline.SourceReport(0, 0, 0, 0, 0, List.of(),
                false), OptionalLong.of(1000));
        later.start(0);
        for (int i = 0; i < 50; i++) {
            metrics2.scored(org.winnow.pipeline.Scored.of(cand, inv, est, org.winnow.pipeline.Reason.KEPT_IN_RANGE), 10);
        }
        // 50 in 10 s: 5/s; 950 left: 190 s.
        assertEquals("50 scored, 5/s, rejected 0.0%, kept as novel 0, ETA 0:03:10", later.line(10_000_000_000L));
    }
}
