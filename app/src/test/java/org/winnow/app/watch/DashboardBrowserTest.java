package org.winnow.app.watch;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.app.cluster.StageReporter;
import org.winnow.geometry.Configuration;
import org.winnow.kafkatestkit.EmbeddedKafkaBroker;
import org.winnow.kafkatestkit.KafkaBroker;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.kafka.KafkaSettings;
import org.winnow.kafka.MetricsPublisher;
import org.winnow.kafka.RunAdmin;
import org.winnow.kafka.RunDescriptor;
import org.winnow.kafka.RunTopics;
import org.winnow.kafka.TopicLayout;
import org.winnow.pipeline.metrics.ScorerMetrics;
import org.winnow.pipeline.metrics.StageKind;

/**
 * The dashboard in a real browser (Debian's headless Chromium): two scorers publish snapshots through the
 * broker, the watch serves them, and the page, loaded twice with more work done in between, shows
 * non-empty charts and counts that moved. Skipped where Chromium is not installed.
 */
@KafkaBroker
@Timeout(180)
class DashboardBrowserTest {
    private static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    private static final Configuration QUINTIC = Configuration.parse("4:5");

    private final EmbeddedKafkaBroker broker;

    @TempDir
    Path dir;

    DashboardBrowserTest(EmbeddedKafkaBroker broker) {
        this.broker = broker;
    }

    @Test
    void thePageShowsLiveChartsAndCountsThatUpdate() throws Exception {
        assumeTrue(Files.isExecutable(CHROMIUM), "no Chromium at " + CHROMIUM);
        KafkaSettings kafka = KafkaSettings.of(broker.bootstrapServers());
        RunTopics run = new RunTopics("dashboard");
        try (RunAdmin admin = RunAdmin.connect(kafka)) {
            admin.createRun(run, TopicLayout.singleBroker(2), new RunDescriptor(run.runId(), Map.of()));
        }
        SimpleMeterRegistry metersA = new SimpleMeterRegistry();
        SimpleMeterRegistry metersB = new SimpleMeterRegistry();
        ScorerMetrics scorerA = new ScorerMetrics(metersA);
        ScorerMetrics scorerB = new ScorerMetrics(metersB);
        SplittableRandom random = new SplittableRandom(11L);
        AtomicBoolean running = new AtomicBoolean(true);
        try (MetricsPublisher pa = StageReporter.start(kafka, run, StageKind.SCORE, "a", metersA, Clock.systemUTC(),
                Duration.ofMillis(100));
                MetricsPublisher pb = StageReporter.start(kafka, run, StageKind.SCORE, "b", metersB, Clock.systemUTC(),
                        Duration.ofMillis(100));
                Watcher watcher = Watcher.open(kafka, run, Clock.systemUTC());
                DashboardServer server = new DashboardServer(watcher::state, 0)) {
            Thread loop = new Thread(() -> watcher.run(running, Duration.ofMillis(200), s -> { }), "watch-loop");
            loop.start();
            try {
                score(scorerA, random, 300);
                score(scorerB, random, 200);
                awaitScored(watcher, 500);
                String url = "http://127.0.0.1:" + server.port() + "/";
                String first = dumpDom(url);
                assertEquals("500", text(first, "count-score"), "scored count after the first round");
                List<Long> novelty = barCounts(first, "chart-novelty");
                assertEquals(ScorerMetrics.NOVELTY_BINS, novelty.size());
                assertEquals(500, novelty.stream().mapToLong(Long::longValue).sum());
                assertTrue(barCounts(first, "chart-funnel").stream().anyMatch(c -> c > 0), "funnel bars drawn");
                assertEquals(List.of(300L, 200L), barCounts(first, "chart-instances"), "one bar per scorer");
                assertTrue(first.contains("class=\"series\""), "throughput chart has a line");

                score(scorerA, random, 400);
                score(scorerB, random, 100);
                awaitScored(watcher, 1000);
                String second = dumpDom(url);
                assertEquals("1,000", text(second, "count-score"), "the count moved between the two loads");
                assertEquals(List.of(700L, 300L), barCounts(second, "chart-instances"));
                assertNotEquals(text(first, "updated"), text(second, "updated"));

                Path png = dir.resolve("dashboard.png");
                chromium("--screenshot=" + png, "--window-size=1200,1000", "--virtual-time-budget=4000", url);
                byte[] bytes = Files.readAllBytes(png);
                assertTrue(bytes.length > 1000, "screenshot of " + bytes.length + " bytes");
                assertEquals((byte) 0x89, bytes[0]);
                assertEquals("PNG", new String(bytes, 1, 3, StandardCharsets.US_ASCII));
            } finally {
                running.set(false);
                loop.join(5_000);
            }
        }
    }

    /** Counts {@code n} random verdicts, as the scorer stage does for each candidate. */
    private static void score(ScorerMetrics metrics, SplittableRandom random, int n) {
        for (int i = 0; i < n; i++) {
            Reason r = Reason.values()[random.nextInt(Reason.values().length)];
            metrics.scored(Scored.of(new Candidate(QUINTIC, "k", 0, i), new ExactInvariants(3, -200, 1, 1, 1), Prediction.of(1, 1.0, 101, random.nextDouble(), ""), r), 1000);
        }
    }

    private static void awaitScored(Watcher watcher, long n) throws InterruptedException {
        await(() -> watcher.state().stage("score").candidates() == n, "watch to see " + n + " scored");
        // The page draws the history too; let it hold a few points.
        Thread.sleep(600);
    }

    private static void await(java.util.function.BooleanSupplier condition, String what) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (!condition.getAsBoolean()) {
            assertTrue(System.nanoTime() < deadline, "timed out waiting for " + what);
            Thread.sleep(50);
        }
    }

    private String dumpDom(String url) throws IOException, InterruptedException {
        return chromium("--dump-dom", "--virtual-time-budget=4000", url);
    }

    private String chromium(String... args) throws IOException, InterruptedException {
        Path profile = Files.createTempDirectory(dir, "profile");
        List<String> cmd = new ArrayList<>(List.of(CHROMIUM.toString(), "--headless", "--no-sandbox", "--disable-gpu",
                "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update",
                "--disable-sync", "--user-data-dir=" + profile));
        cmd.addAll(List.of(args));
        Path out = Files.createTempFile(dir, "chromium", ".out");
        Process p = new ProcessBuilder(cmd).redirectOutput(out.toFile()).redirectError(ProcessBuilder.Redirect.DISCARD)
                .start();
        if (!p.waitFor(60, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("chromium did not finish within 60 s: " + cmd);
        }
        assertEquals(0, p.exitValue(), "chromium exit code");
        return Files.readString(out);
    }

    /** The text of the element with {@code id}. */
    private static String text(String dom, String id) {
        Matcher m = Pattern.compile("id=\"" + id + "\"[^>]*>([^<]*)<").matcher(dom);
        assertTrue(m.find(), "no element #" + id + " in the page");
        return m.group(1);
    }

    /** The data-count of every bar drawn inside the element with {@code id}. */
    private static List<Long> barCounts(String dom, String id) {
        int start = dom.indexOf("id=\"" + id + "\"");
        assertTrue(start >= 0, "no element #" + id);
        int end = dom.indexOf("</svg>", start);
        assertTrue(end > start, "#" + id + " holds no chart");
        Matcher m = Pattern.compile("<rect class=\"bar\"[^>]*data-count=\"(\\d+)\"").matcher(dom.substring(start, end));
        List<Long> counts = new ArrayList<>();
        while (m.find()) {
            counts.add(Long.parseLong(m.group(1)));
        }
        return counts;
    }
}
