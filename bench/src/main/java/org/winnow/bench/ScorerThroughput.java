package org.winnow.bench;

import java.io.BufferedReader;
import java.io.BufferedWriter;
import com.sun.management.OperatingSystemMXBean;
import java.io.IOException;
import java.lang.management.ManagementFactory;
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
 * does not distort much), the histogram of predicted h11, the candidates per source of the anchor
 * ({@link RefinedH11Estimator.Source}: the first page, or the Hodge engine where the first page is
 * unsettled) and the histogram that a scorer deferring the unsettled candidates prints (those as -1,
 * as the numpy port does), so that a driver can check that both scorers agree on the whole file.
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
        long cpuStart = os.getProcessCpuTime();
        long start = System.nanoTime();
        Tally tally = run(m);
        double seconds = (System.nanoTime() - start) / 1e9;
        double cpu = (os.getProcessCpuTime() - cpuStart) / 1e9;
        long n = tally.predicted.values().stream().mapToLong(Long::longValue).sum();
        System.out.printf("candidates=%d seconds=%.3f rate=%.1f cpu_seconds=%.3f cpu_rate=%.1f%n", n, seconds,
                n / seconds, cpu, n / cpu);
        System.out.println("histogram=" + tally.predicted);
        System.out.println("comparable=" + tally.comparable);
        StringBuilder sources = new StringBuilder("sources=");
        for (RefinedH11Estimator.Source source : RefinedH11Estimator.Source.values()) {
            sources.append(source.ordinal() > 0 ? "," : "").append(source.name().toLowerCase(Locale.ROOT)).append(':')
                    .append(tally.sources[source.ordinal()]);
        }
        System.out.println(sources);
        return 0;
    }

    /** Per worker, then summed: predicted h11, the deferring scorer's view, and the anchor's sources. */
    private static final class Tally {
        final Map<Integer, Long> predicted = new TreeMap<>();
        final Map<Integer, Long> comparable = new TreeMap<>();
        final long[] sources = new long[RefinedH11Estimator.Source.values().length];

        void add(Tally o) {
            o.predicted.forEach((k, v) -> predicted.merge(k, v, Long::sum));
            o.comparable.forEach((k, v) -> comparable.merge(k, v, Long::sum));
            for (int i = 0; i < sources.length; i++) {
                sources[i] += o.sources[i];
            }
        }
    }

    private Tally run(FrozenModel m) throws IOException, InterruptedException, ExecutionException {
        BlockingQueue<String[]> queue = new ArrayBlockingQueue<>(2 * threads + 2);
        ExecutorService pool = Executors.newFixedThreadPool(threads);
        List<Future<Tally>> results = new ArrayList<>();
        try {
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
        } finally {
            pool.shutdownNow();
        }
    }

    private static Tally work(Predictor p, BlockingQueue<String[]> queue) throws InterruptedException {
        Tally tally = new Tally();
        while (true) {
            String[] block = queue.take();
            if (block == END) {
                break;
            }
            for (String line : block) {
                CandidateLine c = CandidateLine.parse(line, 0);
                int h11 = p.score(c.config(), c.chi());
                RefinedH11Estimator.Source source = p.estimateSource();
                tally.predicted.merge(h11, 1L, Long::sum);
                tally.comparable.merge(source == RefinedH11Estimator.Source.FIRST_PAGE ? h11 : -1, 1L, Long::sum);
                tally.sources[source.ordinal()]++;
            }
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
