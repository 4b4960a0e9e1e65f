package org.winnow.geometry.invariants;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.lang.management.ManagementFactory;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/**
 * The scorer calls the Calabi-Yau paths millions of times: once the workspace has grown they must
 * not allocate. Measured with the JVM's per-thread allocation counter (common practice, no source).
 */
class HotPathAllocationTest {
    @Test
    void calabiYauPathsAllocateNothingOnceWarm() {
        java.lang.management.ThreadMXBean bean = ManagementFactory.getThreadMXBean();
        Assumptions.assumeTrue(bean instanceof com.sun.management.ThreadMXBean, "no allocation counter on this JVM");
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) bean;
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(11L));
        Configuration[] three = new Configuration[200];
        Configuration[] other = new Configuration[200];
        for (int i = 0; i < three.length; i++) {
            three[i] = gen.calabiYau(3, 8, 3);
            other[i] = gen.calabiYau(1 + (i % 4 == 2 ? 3 : i % 4), 6, 3);
        }
        InvariantCalculator calc = new InvariantCalculator();
        long[] c2J = new long[Configuration.MAX_ROWS];
        long sink = run(calc, three, other, c2J);
        long id = Thread.currentThread().getId();
        long before = threads.getThreadAllocatedBytes(id);
        sink += run(calc, three, other, c2J);
        long allocated = threads.getThreadAllocatedBytes(id) - before;
        // A few hundred bytes of slack for the counter itself; 400 calls that each allocated
        // even one small object would exceed it.
        assertTrue(allocated < 2_000, "allocated " + allocated + " bytes in 400 calls (checksum " + sink + ")");
    }

    private static long run(InvariantCalculator calc, Configuration[] three, Configuration[] other, long[] c2J) {
        long sink = 0;
        for (int i = 0; i < three.length; i++) {
            sink += calc.threefold(three[i], c2J);
            sink += calc.intersections().triple(0, 0, 0);
            sink += calc.chi(other[i]);
        }
        return sink;
    }
}
