package org.winnow.app.scan;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.SeenKeys;

/**
 * An input file with more lines than the duplicate check can hold in the heap is refused at startup
 * with one line, in a child JVM with a small heap, instead of running out of memory later.
 */
class InputHeapLimitTest {
    @Test
    void aFileTooLargeForTheHeapsDuplicateCheckIsRefusedAtStartup(@TempDir Path dir) throws Exception {
        long heap = 24L << 20;
        // maxMemory() reports a little less than -Xmx, so the child's limit is at most this one.
        long lines = SeenKeys.limitFor(heap) + 1;
        Path input = dir.resolve("big.txt");
        try (BufferedWriter w = Files.newBufferedWriter(input)) {
            for (long i = 0; i < lines; i++) {
                w.write("4:5\n");
            }
        }
        Path log = dir.resolve("child.log");
        Path out = dir.resolve("out");
        int exit = ChildJvm.run(log, List.of("-Xmx24m"), List.of("scan", "--model", dir.resolve("never-read.wnm").toString(),
                "--input", input.toString(), "--out", out.toString()));
        String text = Files.readString(log);
        assertEquals(2, exit, text);
        assertEquals(1, text.lines().count(), text);
        assertTrue(text.startsWith("winnow scan: --input " + input + ": "), text);
        assertTrue(text.contains("distinct candidates") && text.contains("raise -Xmx"), text);
        assertFalse(Files.exists(out));
    }
}
