package org.winnow.pipeline.local;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;

/**
 * Backpressure keeps the heap bounded: a fast source in front of a sink that stalls and then lags pushes
 * 150,000 candidates of 12 x 16 matrices (about 1 KB each with key and record, some 150 MB in all)
 * through a child JVM with a 24 MB heap, which only works if the backlog stays within the queues and
 * the window. The source declares its items distinct, as an enumeration does, so the sequencer keeps no
 * set of seen keys. (A control run with unbounded queues was tried: whether it runs out of memory depends
 * on how fast the source gets CPU on a loaded machine, so it is not part of the test.)
 */
class BoundedMemoryTest {
    private static final int COUNT = 150_000;

    private record Child(int exit, String out) {}

    private static Child child(int capacity, int window) throws IOException, InterruptedException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Process p = new ProcessBuilder(List.of(java, "-Xmx24m", "-XX:+UseSerialGC", "-XX:+ExitOnOutOfMemoryError", "-cp",
                System.getProperty("java.class.path"), BoundedMemoryMain.class.getName(), Integer.toString(COUNT),
                Integer.toString(capacity), Integer.toString(window))).redirectErrorStream(true).start();
        byte[] out = p.getInputStream().readAllBytes();
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "child did not finish");
        return new Child(p.exitValue(), new String(out, StandardCharsets.UTF_8));
    }

    @Test
    void aSlowSinkHoldsTheSourceBackInsteadOfFillingTheHeap() throws Exception {
        Child bounded = child(64, 256);
        assertEquals(0, bounded.exit(), bounded.out());
        String[] f = bounded.out().trim().split(" ");
        assertEquals("done", f[0], bounded.out());
        assertEquals(COUNT, Long.parseLong(f[1]));
        assertTrue(Integer.parseInt(f[2]) <= 64 && Integer.parseInt(f[3]) <= 64 && Integer.parseInt(f[4]) <= 256,
                bounded.out());
    }
}
