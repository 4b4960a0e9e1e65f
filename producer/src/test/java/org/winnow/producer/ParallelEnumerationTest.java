package org.winnow.producer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.concurrent.CancellationException;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;

/** The enumeration on several threads gives the one-thread output, byte for byte and in order. */
class ParallelEnumerationTest {
    private final Enumerator enumerator = new Enumerator();

    /** Lines with their sequence numbers, so that order and numbering are compared too. */
    private List<String> lines(Bounds b, ExclusionSet rules, ShardSpec shard, int threads) {
        List<String> out = new ArrayList<>();
        long n = enumerator.run(b, rules, shard, threads, e -> out.add(e.sequence() + " " + e.toLine()));
        assertEquals(out.size(), n);
        return out;
    }

    @Test
    void threeFoldsAreIdenticalOnOneTwoAndThreeThreads() {
        Bounds b = Bounds.complete(3);
        List<String> one = lines(b, ExclusionSet.LOSSLESS, ShardSpec.ALL, 1);
        // 9,133 lossless three-folds (docs/enumeration.md, equal to the enumeration design's prototype).
        assertEquals(9133, one.size());
        assertEquals(one, lines(b, ExclusionSet.LOSSLESS, ShardSpec.ALL, 2));
        assertEquals(one, lines(b, ExclusionSet.LOSSLESS, ShardSpec.ALL, 3));
    }

    @Test
    void fourFoldsUpToFiveRowsAreIdenticalOnOneTwoAndThreeThreads() {
        Bounds b = Bounds.complete(4).withRows(1, 5);
        List<String> one = lines(b, ExclusionSet.LOSSLESS, ShardSpec.ALL, 1);
        // 35,166 = 7 + 149 + 1,332 + 7,237 + 26,441 (docs/enumeration.md, four-folds up to 6 rows).
        assertEquals(35166, one.size());
        assertEquals(one, lines(b, ExclusionSet.LOSSLESS, ShardSpec.ALL, 2));
        assertEquals(one, lines(b, ExclusionSet.LOSSLESS, ShardSpec.ALL, 3));
    }

    @Test
    void shardsOnSeveralThreadsAreDisjointAndCoverTheSpace() {
        Bounds b = Bounds.complete(3).withRows(1, 7);
        List<String> whole = new ArrayList<>();
        enumerator.run(b, ExclusionSet.SPLIT, ShardSpec.ALL, e -> whole.add(e.toLine()));
        for (int count : new int[] {2, 5}) {
            List<String> union = new ArrayList<>();
            for (ShardSpec s : ShardPlan.of(count).shards()) {
                List<String> one = new ArrayList<>();
                enumerator.run(b, ExclusionSet.SPLIT, s, e -> one.add(e.toLine()));
                List<String> three = new ArrayList<>();
                enumerator.run(b, ExclusionSet.SPLIT, s, 3, e -> three.add(e.toLine()));
                assertEquals(one, three, "shard " + s);
                union.addAll(three);
            }
            assertEquals(whole.size(), union.size(), count + " shards");
            assertEquals(new HashSet<>(whole), new HashSet<>(union), count + " shards");
        }
    }

    @Test
    void countsOnSeveralThreadsEqualTheOneThreadCounts() {
        for (int d = 2; d <= 3; d++) {
            for (ExclusionSet rules : new ExclusionSet[] {ExclusionSet.BASE, ExclusionSet.LOSSLESS}) {
                Bounds b = Bounds.complete(d).withRows(1, 7);
                EnumerationCounts one = enumerator.count(b, rules, ShardSpec.ALL);
                assertEquals(one, enumerator.count(b, rules, ShardSpec.ALL, 2, () -> false), d + " " + rules);
                assertEquals(one, enumerator.count(b, rules, ShardSpec.ALL, 3, () -> false), d + " " + rules);
            }
        }
    }

    @Test
    void aFailingConsumerStopsTheWorkers() throws InterruptedException {
        AtomicInteger seen = new AtomicInteger();
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> enumerator.run(Bounds.complete(3), ExclusionSet.BASE, ShardSpec.ALL, 2, m -> {
                    if (seen.incrementAndGet() == 1000) {
                        throw new IllegalStateException("consumer gave up");
                    }
                }));
        assertEquals("consumer gave up", e.getMessage());
        assertFalse(workersAlive(), "enumeration workers outlived the run");
        assertThrows(CancellationException.class, () -> enumerator.count(Bounds.complete(3), ExclusionSet.BASE, ShardSpec.ALL, 2,
                () -> seen.incrementAndGet() > 5000));
        assertFalse(workersAlive(), "counting workers outlived the count");
        assertThrows(IllegalArgumentException.class,
                () -> enumerator.run(Bounds.complete(3), ExclusionSet.BASE, ShardSpec.ALL, 0, m -> {}));
    }

    private static boolean workersAlive() {
        return Thread.getAllStackTraces().keySet().stream().anyMatch(t -> t.getName().startsWith("enumerate-") && t.isAlive());
    }

    @Test
    void anInterruptedCallerGetsACancellationAndItsFlagBack() {
        Thread.currentThread().interrupt();
        try {
            assertThrows(CancellationException.class,
                    () -> enumerator.run(Bounds.complete(3), ExclusionSet.BASE, ShardSpec.ALL, 2, m -> {}));
            assertTrue(Thread.interrupted(), "the interrupt flag is set again");
            assertFalse(workersAlive());
        } finally {
            Thread.interrupted();
        }
    }
}
