package org.winnow.pipeline;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.metrics.SourceMetrics;

/** The compact duplicate check against a plain {@code HashSet} as the oracle. */
class SeenKeysTest {
    @Test
    void agreesWithAHashSetThroughManyGrowths() {
        SplittableRandom rnd = new SplittableRandom(17);
        SeenKeys seen = new SeenKeys(1_000_000);
        Set<String> oracle = new HashSet<>();
        for (int i = 0; i < 60_000; i++) {
            // Short keys from a small alphabet repeat often; long ones are hashed keys.
            String key = rnd.nextInt(4) == 0 ? CandidateKeys.of("x".repeat(70) + rnd.nextInt(5_000))
                    : Integer.toString(rnd.nextInt(40_000), 7);
            assertEquals(oracle.add(key), seen.add(key), key);
        }
        assertEquals(oracle.size(), seen.size());
        assertTrue(oracle.size() > 20_000, "too few distinct keys to grow the table: " + oracle.size());
        for (String k : oracle) {
            assertFalse(seen.add(k), k);
        }
    }

    @Test
    void oneDistinctKeyPastTheLimitIsRefusedWithAMessageThatSaysWhatToDo() {
        SeenKeys seen = new SeenKeys(3);
        assertTrue(seen.add("4:5"));
        assertTrue(seen.add("2:3/2:3"));
        assertTrue(seen.add("5:3,3"));
        assertFalse(seen.add("4:5"), "a repeat is not a new key");
        KeyLimitException e = assertThrows(KeyLimitException.class, () -> seen.add("5:4,2"));
        assertEquals(3, e.limit());
        assertTrue(e.getMessage().startsWith("more than 3 distinct candidates"), e.getMessage());
        assertTrue(e.getMessage().contains("raise -Xmx"), e.getMessage());
        assertEquals(3, seen.size());
    }

    @Test
    void theLimitsTableFitsInHalfTheHeapAndTwiceItWouldNot() {
        for (long heap : new long[] {16L << 20, 100L << 20, 2L << 30, 4L << 30, 24L << 30}) {
            long limit = SeenKeys.limitFor(heap);
            long slots = 1024;
            while (limit * 4 > slots * 3) {
                slots *= 2;
            }
            // When the table last grew, the old (slots / 2) and the new table were both alive.
            long peak = slots * SeenKeys.SLOT_BYTES + slots / 2 * SeenKeys.SLOT_BYTES;
            assertTrue(peak <= heap / 2, heap + ": peak " + peak);
            assertTrue(slots == SeenKeys.MAX_SLOTS || 2 * peak > heap / 2, heap + ": limit " + limit + " is too cautious");
        }
    }

    @Test
    void theSequencerStopsAtItsKeyLimitButNotOnRepeats() throws Exception {
        List<Candidate> sent = new ArrayList<>();
        Sequencer s = new Sequencer(0, 0, BadInputPolicy.SKIP, sent::add, new SourceMetrics(new SimpleMeterRegistry()), 2L);
        for (String t : List.of("4:5", "2:3/2:3", "4:5", "2:3/2:3")) {
            Configuration c = Configuration.parse(t).canonical();
            s.item(c, c.toText());
        }
        assertEquals(2, sent.size());
        assertEquals(2, s.report().duplicates());
        Configuration third = Configuration.parse("5:3,3");
        assertThrows(KeyLimitException.class, () -> s.item(third, third.toText()));
    }
}
