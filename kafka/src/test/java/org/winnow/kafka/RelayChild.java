package org.winnow.kafka;

/**
 * A relay in a JVM of its own, for the fault tests that kill it: {@code bootstrap runId instanceId
 * microsPerRecord}. The pause per record stands in for scoring work, so that kills land inside open
 * transactions rather than between them. It runs until killed, or stops cleanly on SIGTERM.
 */
public final class RelayChild {
    private RelayChild() {
    }

    public static void main(String[] args) {
        RunTopics run = new RunTopics(args[1]);
        ExactlyOnceRelay<org.winnow.geometry.Configuration, String> relay =
                RelayFixtures.relay(args[0], run, args[2], Long.parseLong(args[3]) * 1000L);
        Thread main = Thread.currentThread();
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            relay.stop();
            try {
                main.join(10_000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }));
        try {
            relay.run();
        } finally {
            relay.close();
        }
    }
}
