package org.winnow.app.cluster;

import java.lang.management.ManagementFactory;
import java.util.Locale;

/**
 * How long a test of child JVMs may wait for them: a bound set for an idle machine, stretched by the
 * machine's load per processor (its one-minute load average), re-read at every check. Two cores under a
 * load of 20 run each JVM about ten times slower than idle, and a fixed bound then fails a correct run
 * ("the stages did not join"); a stretched bound still fails a hung one, only later. The stretch is capped,
 * so a hang is always reported.
 */
final class LoadSlack {
    /** The largest stretch: a bound never grows beyond this many times its idle value. */
    static final double MAX_STRETCH = 8;

    private final long startNanos;
    private final double baseSeconds;

    private LoadSlack(double baseSeconds) {
        this.startNanos = System.nanoTime();
        this.baseSeconds = baseSeconds;
    }

    /** A wait that starts now, with {@code baseSeconds} allowed on an idle machine. */
    static LoadSlack of(double baseSeconds) {
        return new LoadSlack(baseSeconds);
    }

    /** The stretch now: the load per processor, at least 1 and at most {@link #MAX_STRETCH}. */
    static double stretch() {
        double load = ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
        int processors = Runtime.getRuntime().availableProcessors();
        // A platform without a load average reports a negative value: no stretch, then.
        return load < 0 ? 1 : Math.min(MAX_STRETCH, Math.max(1, load / processors));
    }

    /** {@code baseSeconds} stretched by the load now, in whole seconds, for a single blocking wait. */
    static int seconds(int baseSeconds) {
        return (int) Math.ceil(baseSeconds * stretch());
    }

    /** True while the wait is within its stretched bound. */
    boolean within() {
        return (System.nanoTime() - startNanos) / 1e9 < baseSeconds * stretch();
    }

    /** What was waited and allowed, for the failure message. */
    String describe() {
        return String.format(Locale.ROOT, "waited %.0f s, allowed %.0f s x %.1f (load %.1f on %d processors)",
                (System.nanoTime() - startNanos) / 1e9, baseSeconds, stretch(),
                ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage(),
                Runtime.getRuntime().availableProcessors());
    }
}
