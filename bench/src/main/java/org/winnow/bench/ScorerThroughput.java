package org.winnow.bench;

import java.io.BufferedReader;
import java.io.BufferedWriter;
import com.sun.management.OperatingSystemMXBean;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.winnow.geometry.hodge.RefinedH11Estimator;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.model.Predictor;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * The scorer alone: reads a candidate file, and on {@code threads} workers (one {@link Predictor}
 * each) parses every line and predicts its h11 (features, forward pass, neighbour vote). Timed from
 * opening the file to the last prediction; JVM start and model load are outside, as they are for
 * the numpy scorer. The main thread only reads lines and hands out blocks of them.
 *
 * <p>Prints one line {@code candidates=N seconds=S rate=R cpu_seconds=C cpu_rate=Q} (wall clock, and
 * the CPU time of the whole process: workers, reader, JIT and GC, which is what a shared machine
 * does not distort much), then where that CPU time went: {@code cpu_split=} per kind of thread
 * (workers, the reader, the JIT compilers, GC, VM threads; {@link ThreadCpu}) and {@code worker_split=}
 * the workers' own time by step (parsing the line, scoring, tallying), each over the timed pass only.
 * Then the histogram of predicted h11, the candidates per source of the anchor
 * ({@link RefinedH11Estimator.Source}: the first page, or the Hodge engine where the first page is
 * unsettled) and the histogram that a scorer deferring the unsettled candidates prints (those as -1,
 * as the numpy port does), so that a driver can check that both scorers agree on the whole file.
 *
 * <p>With {@code --warmups N} the file is scored N times untimed first: a one-off run spends a good
 * part of its CPU in the JIT compilers (docs/benchmarks.md), which a long scan pays once, so the warm
 * rate is the one to compare thread counts by.
 */
@Command(name = "scorer-throughput", mixinStandardHelpOptions = true)
public final class ScorerThroughput implements Callable<Integer> {
    private static final int BLOCK = 4096;
    private static final String[] END = new String[0];

    @Option(names = "--model", required = true, description = "The frozen model (.wnm).")
    Path model;

    @Option(names = "--candidates", required = true, description = "The candidate file.")
    Path candidates;

    @Option(names = "--threads", defaultValue = "1", description = "Worker threads (default ${DEFAULT-VALUE}).")
    int threads;

    @Option(names = "--warmups", defaultValue = "0",
            description = "Untimed passes over the file before the timed one, so that the timed one runs JIT-compiled code"
                    + " (default ${DEFAULT-VALUE}: the timed pass includes the JIT's work, as a one-off run does).")
    int warmups;

    @Option(names = "--predictions", description = "Also write the predicted h11 of every line, in order (1 thread only).")
    Path predictions;

    public static void main(String[] args) {
        System.exit(new CommandLine(new ScorerThroughput()).execute(args));
    }

    @Override
    public Integer call() throws Exception {
        FrozenModel m = FrozenModel.load(model);
        if (predictions != null) {
            writePredictions(m);
            return 0;
        }
        OperatingSystemMXBean os = (OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean();
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> new Thread(r, "scorer-worker"));
        try {
            for (int round = 0; round < warmups; round++) {
                run(m, pool);
            }
            ThreadCpu before = ThreadCpu.snapshot();
            long cpuStart = os.getProcessCpuTime();
            long start = System.nanoTime();
            Tally tally = run(m, pool);
            double seconds = (System.nanoTime() - start) / 1e9;
            double cpu = (os.getProcessCpuTime() - cpuStart) / 1e9;
            ThreadCpu after = ThreadCpu.snapshot();
            long n = tally.predicted.values().stream().mapToLong(Long::longValue).sum();
            System.out.printf("candidates=%d seconds=%.3f rate=%.1f cpu_seconds=%.3f cpu_rate=%.1f%n", n, seconds,
                    n / seconds, cpu, n / cpu);
            // Every CPU-second of the timed run by thread kind, and the workers' own time by step.
            System.out.println("cpu_split=" + ThreadCpu.format(after.since(before, ThreadCpu.hotspot(
                    name -> name.equals("scorer-worker") ? "workers" : name.equals("main") || name.equals("java") ? "reader" : null))));
            System.out.printf(Locale.ROOT, "worker_split=parse:%.3f,score:%.3f,tally:%.3f%n", tally.parseNanos / 1e9,
                    tally.scoreNanos / 1e9, tally.tallyNanos / 1e9);
            print(tally);
        } finally {
            pool.shutdownNow();
        }
        return 0;
    }

    private static void print(Tally tally) {
        System.out.println("histogram=" + tally.predicted);
        System.out.println("comparable=" + tally.comparable);
        StringBuilder sources = new StringBuilder("sources=");
        for (RefinedH11Estimator.Source source : RefinedH11Estimator.Source.values()) {
            sources.append(source.ordinal() > 0 ? "," : "").append(source.name().toLowerCase(Locale.ROOT)).append(':')
                    .append(tally.sources[source.ordinal()]);
        }
        System.out.println(sources);
    }

    /** Per worker, then summed: predicted h11, the deferring scorer's view, and the anchor's sources. */
    private static final class Tally {
        final Map<Integer, Long> predicted = new TreeMap<>();
        final Map<Integer, Long> comparable = new TreeMap<>();
        final long[] sources = new long[RefinedH11Estimator.Source.values().length];
        long parseNanos;
        long scoreNanos;
        long tallyNanos;

        void add(Tally o) {
            parseNanos += o.parseNanos;
            scoreNanos += o.scoreNanos;
            tallyNanos += o.tallyNanos;
            o.predicted.forEach((k, v) -> predicted.merge(k, v, Long::sum));
            o.comparable.forEach((k, v) -> comparable.merge(k, v, Long::sum));
            for (int i = 0; i < sources.length; i++) {
                sources[i] += o.sources[i];
            }
        }
    }

    private Tally run(FrozenModel m, ExecutorService pool) throws IOException, InterruptedException, ExecutionException {
        BlockingQueue<String[]> queue = new ArrayBlockingQueue<>(2 * threads + 2);
        List<Future<Tally>> results = new ArrayList<>();
        {
            for (int t = 0; t < threads; t++) {
                results.add(pool.submit(() -> work(m.newPredictor(), queue)));
            }
            try (BufferedReader r = Files.newBufferedReader(candidates, StandardCharsets.UTF_8)) {
                String[] block = new String[BLOCK];
                int fill = 0;
                String line;
                while ((line = r.readLine()) != null) {
                    block[fill++] = line;
                    if (fill == BLOCK) {
                        queue.put(block);
                        block = new String[BLOCK];
                        fill = 0;
                    }
                }
                if (fill > 0) {
                    queue.put(java.util.Arrays.copyOf(block, fill));
                }
            } finally {
                for (int t = 0; t < threads; t++) {
                    queue.put(END);
                }
            }
            Tally total = new Tally();
            for (Future<Tally> f : results) {
                total.add(f.get());
            }
            return total;
        }
    }

    private static Tally work(Predictor p, BlockingQueue<String[]> queue) throws InterruptedException {
        Tally tally = new Tally();
        ThreadMXBean cpu = ManagementFactory.getThreadMXBean();
        org.winnow.geometry.Configuration[] configs = new org.winnow.geometry.Configuration[BLOCK];
        long[] chis = new long[BLOCK];
        int[] h11s = new int[BLOCK];
        byte[] sourceOf = new byte[BLOCK];
        // Per block: parse it all, score it all, tally it all, each step timed on this thread's CPU clock,
        // so that the split says what a worker's time went to without a clock read per candidate.
        while (true) {
            String[] block = queue.take();
            if (block == END) {
                break;
            }
            long t0 = cpu.getCurrentThreadCpuTime();
            for (int i = 0; i < block.length; i++) {
                CandidateLine c = CandidateLine.parse(block[i], 0);
                configs[i] = c.config();
                chis[i] = c.chi();
            }
            long t1 = cpu.getCurrentThreadCpuTime();
            for (int i = 0; i < block.length; i++) {
                h11s[i] = p.score(configs[i], chis[i]);
                sourceOf[i] = (byte) p.estimateSource().ordinal();
            }
            long t2 = cpu.getCurrentThreadCpuTime();
            for (int i = 0; i < block.length; i++) {
                int h11 = h11s[i];
                RefinedH11Estimator.Source source = RefinedH11Estimator.Source.values()[sourceOf[i]];
                tally.predicted.merge(h11, 1L, Long::sum);
                tally.comparable.merge(source == RefinedH11Estimator.Source.FIRST_PAGE ? h11 : -1, 1L, Long::sum);
                tally.sources[source.ordinal()]++;
            }
            long t3 = cpu.getCurrentThreadCpuTime();
            tally.parseNanos += t1 - t0;
            tally.scoreNanos += t2 - t1;
            tally.tallyNanos += t3 - t2;
        }
        return tally;
    }

    private void writePredictions(FrozenModel m) throws IOException {
        Predictor p = m.newPredictor();
        try (BufferedReader r = Files.newBufferedReader(candidates, StandardCharsets.UTF_8);
                BufferedWriter w = Files.newBufferedWriter(predictions, StandardCharsets.UTF_8)) {
            String line;
            int number = 0;
            while ((line = r.readLine()) != null) {
                CandidateLine c = CandidateLine.parse(line, ++number);
                w.write(Integer.toString(p.score(c.config(), c.chi())));
                w.write('\n');
            }
        }
    }
}
