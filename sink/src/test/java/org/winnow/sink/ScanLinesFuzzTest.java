package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.random.RandomGenerator;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.PredictedValue;
import org.winnow.testsupport.Damage;

/**
 * Seeded fuzzing of the survivor and reject line parsers (format 2, and format 1, which is still read): the
 * data lines of a real scan's files edited at random (characters inserted, deleted, replaced, cut; tabs,
 * signs, huge and non-ASCII numbers, NaN and basis words swapped in). Each edited line must either parse into
 * a record whose values keep their promises (novelty and every confidence in [0, 1], each value inside its
 * basis's interval, h11 an int) or be refused with an {@link IllegalArgumentException} whose message is one
 * short line; nothing else may come out. {@code -Dwinnow.fuzz.inputs=N} scales the run (N / 5, 2 x 10^4 by
 * default).
 */
class ScanLinesFuzzTest {
    private static final String[] TOKENS = {"\t", "-", "-1", "0", "1", "1.5", "NaN", "Infinity", "1e400", "-0.0",
        "9223372036854775807", "9223372036854775808", "2147483648", "\uFF15", " ", "proved", "bounded", "bounded 3..2",
        "bounded 1..9", "estimated", "kept-in-range", "predicted-h11-out-of-range", "..", "\u0000", "x".repeat(2000)};

    @Test
    void everyEditedLineParsesKeepingItsPromisesOrIsRefusedInOneLine(@TempDir Path tmp) throws Exception {
        Fixtures.run(tmp, Fixtures.source(5, 400), new SinkOptions(37, true, 50, Duration.ofMillis(500)),
                CrashHook.NONE, -1, new SimpleMeterRegistry());
        List<String> survivors = dataLines(tmp, ScanFiles.SURVIVORS);
        List<String> rejects = dataLines(tmp, ScanFiles.REJECTS);
        assertTrue(survivors.size() > 50 && rejects.size() > 50, survivors.size() + " survivors, " + rejects.size());
        // Format-1 lines of both kinds, as an older scan wrote them.
        survivors.add("4:5\t-200\t1\t0.950000\t101\t0.120000\tkept-in-range\t2:3/2:3");
        rejects.add("4:5\t-200\t7\t0.950000\t-\t0.120000\tpredicted-h11-out-of-range");
        int inputs = Integer.getInteger("winnow.fuzz.inputs", 100_000) / 5;
        RandomGenerator rnd = new SplittableRandom(20261205L);
        int read = 0;
        int refused = 0;
        long start = System.nanoTime();
        for (int i = 0; i < inputs; i++) {
            boolean survivor = rnd.nextBoolean();
            List<String> seeds = survivor ? survivors : rejects;
            String line = edit(seeds.get(rnd.nextInt(seeds.size())), rnd);
            try {
                if (survivor) {
                    SurvivorLine s = SurvivorLine.parse(line);
                    check(i, s.novelty(), s.h11(), s.h11Value(), s.h21Value(), s.h31Value(), s.h22Value());
                    s.h21();
                } else {
                    RejectLine r = RejectLine.parse(line);
                    check(i, r.novelty(), Math.toIntExact(r.h11Value().value()), r.h11Value(), r.h21Value(),
                            r.h31Value(), r.h22Value());
                }
                read++;
            } catch (IllegalArgumentException e) {
                String m = String.valueOf(e.getMessage());
                assertTrue(!m.contains("\n") && m.length() < 400, "input " + i + ": " + m.length() + " characters: "
                        + m.substring(0, Math.min(300, m.length())));
                refused++;
            } catch (RuntimeException e) {
                fail("input " + i + " '" + line + "' threw " + e);
            }
        }
        assertTrue(refused > inputs / 2 && read > inputs / 50, "read " + read + ", refused " + refused);
        System.out.printf("survivor and reject line fuzz: %d inputs, %d read and checked, %d refused, %.1f s%n", inputs,
                read, refused, (System.nanoTime() - start) / 1e9);
    }

    private static void check(int input, double novelty, int h11, PredictedValue... values) {
        assertTrue(novelty >= 0 && novelty <= 1, "input " + input + ": novelty " + novelty);
        assertTrue(values[0] != null && h11 == values[0].value(), "input " + input + ": h11");
        for (PredictedValue v : values) {
            if (v != null) {
                assertTrue(v.confidence() >= 0 && v.confidence() <= 1 && v.lo() <= v.value() && v.value() <= v.hi(),
                        "input " + input + ": " + v);
            }
        }
    }

    private static List<String> dataLines(Path dir, String series) throws Exception {
        List<String> out = new ArrayList<>();
        try (Stream<Path> files = Files.list(dir)) {
            for (Path f : files.filter(p -> p.getFileName().toString().startsWith(series + "-")).sorted().toList()) {
                for (String l : Files.readAllLines(f)) {
                    if (!l.startsWith("#") && !l.startsWith("config\t")) {
                        out.add(l);
                    }
                }
            }
        }
        return out;
    }

    private static String edit(String seed, RandomGenerator rnd) {
        return Damage.text(seed, rnd, TOKENS, 3, 12);
    }
}
