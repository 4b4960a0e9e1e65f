package org.winnow.app.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.random.RandomGenerator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.kafka.ClusterRefusedException;
import org.winnow.testsupport.Damage;

/**
 * Seeded fuzzing of the sink's Kafka offset log ({@value OffsetLog#FILE}): a log of four checkpoints edited at
 * random on the byte level. Looking up a checkpoint's offsets must give exactly the offsets appended for it,
 * or none (its line torn off, so the sink refuses to resume in one line), or a one-line refusal naming the file
 * and line; never other offsets, which would make a resumed sink skip records or wait for them forever.
 * {@code -Dwinnow.fuzz.inputs=N} scales the run (N / 5, 2 x 10^4 by default).
 */
class OffsetLogFuzzTest {
    private static final byte[][] TOKENS = {bytes("\t"), bytes("\n"), bytes("="), bytes(","), bytes("-1"), bytes("0"),
        bytes("9"), bytes("99999999999999999999"), bytes("\uFF15"), bytes(" "), {(byte) 0xFF}, bytes("0\t\t00000000\n")};

    @Test
    void everyEditedLogGivesTheCommittedOffsetsOrNoneOrARefusal(@TempDir Path dir) throws Exception {
        OffsetLog log = new OffsetLog(dir);
        Map<Long, Map<Integer, Long>> appended = new LinkedHashMap<>();
        appended.put(0L, Map.of());
        appended.put(50L, Map.of(0, 17L, 1, 20L, 2, 13L));
        appended.put(120L, Map.of(0, 41L, 1, 39L, 2, 40L));
        appended.put(400L, Map.of(0, 133L, 1, 140L, 2, 127L));
        for (var e : appended.entrySet()) {
            log.append(e.getKey(), e.getValue());
        }
        byte[] seed = Files.readAllBytes(dir.resolve(OffsetLog.FILE));
        Long[] seqs = appended.keySet().toArray(Long[]::new);
        for (Long s : seqs) {
            assertEquals(appended.get(s), log.lookup(s), "the undamaged log at " + s);
        }
        int inputs = Integer.getInteger("winnow.fuzz.inputs", 100_000) / 5;
        RandomGenerator rnd = new SplittableRandom(20261205L);
        String prefix = dir.resolve(OffsetLog.FILE) + ":";
        int same = 0;
        int none = 0;
        int refused = 0;
        for (int i = 0; i < inputs; i++) {
            byte[] input = edit(seed, rnd);
            long seq = seqs[rnd.nextInt(seqs.length)];
            try {
                Map<Integer, Long> found = log.lookup(input, seq);
                if (found == null) {
                    none++;
                } else {
                    assertEquals(appended.get(seq), found, "input " + i + " at " + seq);
                    same++;
                }
            } catch (ClusterRefusedException e) {
                String m = e.getMessage();
                assertTrue(m.matches("\\Q" + prefix + "\\E\\d+: damaged Kafka offsets [^\\n]+") && m.length() < 400,
                        "input " + i + ": " + m);
                refused++;
            } catch (RuntimeException e) {
                fail("input " + i + " threw " + e);
            }
        }
        assertTrue(refused > inputs / 2 && same > 0 && none > 0, same + " same, " + none + " none, " + refused + " refused");
        System.out.printf("offset log fuzz: %d inputs, %d same offsets, %d none, %d refused%n", inputs, same, none, refused);
    }

    @Test
    void aDigitChangedInAnOffsetIsRefusedNamingTheLine(@TempDir Path dir) throws Exception {
        OffsetLog log = new OffsetLog(dir);
        log.append(0, Map.of());
        log.append(50, Map.of(0, 17L, 1, 20L));
        Path file = dir.resolve(OffsetLog.FILE);
        Files.writeString(file, Files.readString(file).replace("1=20", "1=90"));
        ClusterRefusedException e = assertThrows(ClusterRefusedException.class, () -> log.lookup(50));
        assertTrue(e.getMessage().startsWith(file + ":2: damaged Kafka offsets '50\\u00090=17,1=90\\u0009"), e.getMessage());
        Files.writeString(file, "0\t\n");
        e = assertThrows(ClusterRefusedException.class, () -> log.lookup(0));
        assertTrue(e.getMessage().endsWith("(an older winnow sink wrote no CRC; give this run a new directory)"),
                e.getMessage());
        Files.writeString(file, "");
        assertNull(log.lookup(50), "an empty log has no offsets for a checkpoint");
    }

    private static byte[] edit(byte[] seed, RandomGenerator rnd) {
        return Damage.bytes(seed, rnd, TOKENS, 2, 6);
    }

    private static byte[] bytes(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
