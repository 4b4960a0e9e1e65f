package org.winnow.bench;

import java.lang.management.ManagementFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.winnow.app.cli.WinnowCli;

/**
 * Where the CPU time of one {@code winnow scan} goes, by thread: the source (read, parse, validate,
 * canonical form, dedup, or the enumeration), the scorer workers (invariants, model, rules), the sink
 * (format, write, checkpoints), the JIT compilers, GC and the rest of the VM. The scan runs in this
 * JVM through the ordinary command line, optionally after an untimed warm-up scan of the same
 * arguments (to a directory of its own), so that the split can be read with and without the JIT's
 * one-off work. The scan's threads end with it, so their time is followed by a {@link ThreadCpu.Tracker}
 * reading every 100 ms (the tracker's own time is shown apart). Linux only ({@link ThreadCpu}).
 *
 * <p>Usage: {@code ScanCpuSplit [--warmup] SCAN-ARGUMENTS...} with every argument of {@code winnow scan}
 * but {@code --out}, which this tool sets. Prints the scan's own output, then one line
 * {@code wall_seconds=W cpu_seconds=C candidates_per_second=R} and one line
 * {@code cpu_split=kind:seconds,...}.
 */
public final class ScanCpuSplit {
    private ScanCpuSplit() {}

    public static void main(String[] args) throws Exception {
        boolean warmup = args.length > 0 && args[0].equals("--warmup");
        List<String> scan = new ArrayList<>(List.of(args).subList(warmup ? 1 : 0, args.length));
        Path dir = Files.createTempDirectory("winnow-scan-cpu-");
        if (warmup) {
            run(scan, dir.resolve("warmup"));
        }
        com.sun.management.OperatingSystemMXBean os =
                (com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean();
        ThreadCpu before = ThreadCpu.snapshot();
        ThreadCpu.Tracker tracker = new ThreadCpu.Tracker(100);
        long cpu0 = os.getProcessCpuTime();
        long t0 = System.nanoTime();
        Path out = dir.resolve("timed");
        run(scan, out);
        double wall = (System.nanoTime() - t0) / 1e9;
        double cpu = (os.getProcessCpuTime() - cpu0) / 1e9;
        ThreadCpu after = tracker.stop();
        long candidates = org.winnow.sink.Manifest.read(out.resolve(org.winnow.sink.ScanFiles.MANIFEST)).counts()
                .candidates();
        Map<String, Double> split = after.since(before, ThreadCpu.hotspot(name -> name.startsWith("winnow-scorer")
                ? "scorers" : name.equals("winnow-source") ? "source" : name.equals("winnow-sink") ? "sink"
                : name.equals("main") || name.equals("java") ? "main" : name.equals("cpu-tracker") ? "tracker" : null));
        System.out.printf(Locale.ROOT, "wall_seconds=%.3f cpu_seconds=%.3f candidates=%d candidates_per_second=%.1f%n",
                wall, cpu, candidates, candidates / wall);
        System.out.println("cpu_split=" + ThreadCpu.format(split));
    }

    private static void run(List<String> scan, Path out) {
        List<String> a = new ArrayList<>(List.of("scan"));
        a.addAll(scan);
        a.addAll(List.of("--out", out.toString()));
        int exit = WinnowCli.commandLine().execute(a.toArray(String[]::new));
        if (exit != 0) {
            throw new IllegalStateException("scan failed with exit " + exit);
        }
    }
}
