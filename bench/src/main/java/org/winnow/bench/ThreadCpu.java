package org.winnow.bench;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.function.Function;

/**
 * The CPU time of every thread of this process, native ones included (JIT compilers, GC workers, the
 * VM thread), read from Linux's {@code /proc/self/task/<tid>/schedstat} (nanoseconds on a CPU) and
 * {@code comm} (the thread's name, cut to 15 characters). The JVM's own beans see only Java threads,
 * and the process total alone cannot say how much of a run was scoring and how much was compiling or
 * collecting; this split can. A thread that ended between two snapshots drops out of the later one,
 * so a split is taken over threads that live through the timed window (the pool's workers, the
 * reader, the JIT and GC threads).
 *
 * <p>Where {@code /proc} is missing (not Linux) every snapshot is empty and the split prints
 * {@code unavailable}.
 */
final class ThreadCpu {
    private final Map<Long, Sample> byTid;

    private record Sample(String name, long nanos) {}

    private ThreadCpu(Map<Long, Sample> byTid) {
        this.byTid = byTid;
    }

    /** The CPU time of every thread alive now. */
    static ThreadCpu snapshot() {
        Map<Long, Sample> m = new TreeMap<>();
        Path tasks = Path.of("/proc/self/task");
        if (!Files.isDirectory(tasks)) {
            return new ThreadCpu(m);
        }
        try (DirectoryStream<Path> dir = Files.newDirectoryStream(tasks)) {
            for (Path t : dir) {
                try {
                    String comm = Files.readString(t.resolve("comm"), StandardCharsets.UTF_8).strip();
                    String sched = Files.readString(t.resolve("schedstat"), StandardCharsets.UTF_8).strip();
                    long nanos = Long.parseLong(sched.substring(0, sched.indexOf(' ')));
                    m.put(Long.parseLong(t.getFileName().toString()), new Sample(comm, nanos));
                } catch (IOException | RuntimeException e) {
                    // The thread ended while we read it: it is simply not in this snapshot.
                }
            }
        } catch (IOException e) {
            return new ThreadCpu(new TreeMap<>());
        }
        return new ThreadCpu(m);
    }

    /**
     * CPU seconds spent since {@code before}, summed per category that {@code category} gives a thread
     * name; threads born after {@code before} count from zero. Categories keep their first-seen order.
     */
    Map<String, Double> since(ThreadCpu before, Function<String, String> category) {
        Map<String, Double> out = new LinkedHashMap<>();
        for (Map.Entry<Long, Sample> e : byTid.entrySet()) {
            Sample old = before.byTid.get(e.getKey());
            long start = old != null && old.name.equals(e.getValue().name) ? old.nanos : 0;
            out.merge(category.apply(e.getValue().name), (e.getValue().nanos - start) / 1e9, Double::sum);
        }
        return out;
    }

    /**
     * The usual categories of a HotSpot process: {@code jit} (C1/C2 compiler threads), {@code gc} (G1's
     * workers, refinement and concurrent threads), {@code vm} (the VM thread, periodic task, service
     * threads), otherwise {@code other}; a name that {@code own} maps to non-null gets that instead.
     */
    static Function<String, String> hotspot(Function<String, String> own) {
        return name -> {
            String mine = own.apply(name);
            if (mine != null) {
                return mine;
            }
            if (name.startsWith("C1 Compiler") || name.startsWith("C2 Compiler")) {
                return "jit";
            }
            if (name.startsWith("GC Thread") || name.startsWith("G1 ")) {
                return "gc";
            }
            if (name.startsWith("VM ") || name.equals("Service Thread") || name.startsWith("Monitor Deflati")
                    || name.equals("Common-Cleaner") || name.equals("Signal Dispatch")
                    || name.equals("Reference Handl") || name.equals("Finalizer")) {
                return "vm";
            }
            return "other";
        };
    }

    /**
     * Follows the threads of a run that start and end inside it (a scan's source, workers and sink): a
     * daemon thread takes a snapshot every {@code periodMillis} and keeps each thread's last reading, so a
     * thread that ended counts with what it had used at the last reading before its end (at most one
     * period's worth is lost per thread).
     */
    static final class Tracker implements AutoCloseable {
        private final Map<Long, Sample> last = new java.util.concurrent.ConcurrentHashMap<>();
        private final Thread poller;
        private volatile boolean running = true;

        Tracker(long periodMillis) {
            poller = new Thread(() -> {
                while (running) {
                    last.putAll(snapshot().byTid);
                    try {
                        Thread.sleep(periodMillis);
                    } catch (InterruptedException e) {
                        return;
                    }
                }
            }, "cpu-tracker");
            poller.setDaemon(true);
            poller.start();
        }

        /** Stops polling and returns every thread seen, with its last reading (a final one included). */
        ThreadCpu stop() throws InterruptedException {
            running = false;
            poller.interrupt();
            poller.join();
            last.putAll(snapshot().byTid);
            return new ThreadCpu(new TreeMap<>(last));
        }

        @Override
        public void close() throws InterruptedException {
            stop();
        }
    }

    /** {@code name:seconds,...} with three decimals, or {@code unavailable} when nothing was read. */
    static String format(Map<String, Double> split) {
        if (split.isEmpty()) {
            return "unavailable";
        }
        StringBuilder b = new StringBuilder();
        for (Map.Entry<String, Double> e : split.entrySet()) {
            b.append(b.length() > 0 ? "," : "").append(e.getKey()).append(':')
                    .append(String.format(Locale.ROOT, "%.3f", e.getValue()));
        }
        return b.toString();
    }
}
