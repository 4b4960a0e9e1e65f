package org.winnow.pipeline.channel;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;

class BoundedChannelTest {
    @Test
    void manySendersAndReceivers_deliverEverythingOnce_andNeverExceedCapacity() throws Exception {
        BoundedChannel<Integer> ch = new BoundedChannel<>("t", 4, 3);
        List<Integer> got = Collections.synchronizedList(new ArrayList<>());
        List<Thread> threads = new ArrayList<>();
        for (int s = 0; s < 3; s++) {
            int base = s * 10_000;
            threads.add(new Thread(() -> {
                try {
                    for (int i = 0; i < 10_000; i++) {
                        ch.send(base + i);
                    }
                    ch.senderDone();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            }));
        }
        for (int r = 0; r < 2; r++) {
            threads.add(new Thread(() -> {
                try {
                    for (Integer x = ch.receive(); x != null; x = ch.receive()) {
                        got.add(x);
                    }
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            }));
        }
        threads.forEach(Thread::start);
        for (Thread t : threads) {
            t.join(30_000);
        }
        assertEquals(30_000, got.size());
        assertEquals(30_000, got.stream().distinct().count());
        assertTrue(ch.maxDepth() <= 4, "max depth " + ch.maxDepth());
        assertTrue(ch.maxDepth() >= 1);
    }

    @Test
    void sendBlocksWhileFull() throws Exception {
        BoundedChannel<Integer> ch = new BoundedChannel<>("t", 2, 1);
        ch.send(1);
        ch.send(2);
        CountDownLatch sent = new CountDownLatch(1);
        Thread t = new Thread(() -> {
            try {
                ch.send(3);
                sent.countDown();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
        t.start();
        assertTrue(!sent.await(200, TimeUnit.MILLISECONDS), "send returned although the channel was full");
        assertEquals(1, ch.receive());
        assertTrue(sent.await(5, TimeUnit.SECONDS));
        assertEquals(2, ch.depth());
    }

    @Test
    void failWakesABlockedReceiverWithTheCause() throws Exception {
        BoundedChannel<Integer> ch = new BoundedChannel<>("t", 2, 1);
        AtomicReference<Throwable> seen = new AtomicReference<>();
        Thread t = new Thread(() -> {
            try {
                ch.receive();
            } catch (Throwable e) {
                seen.set(e);
            }
        });
        t.start();
        Thread.sleep(50);
        IllegalStateException cause = new IllegalStateException("boom");
        ch.fail(cause);
        t.join(5000);
        assertTrue(seen.get() instanceof ChannelFailedException);
        assertEquals(cause, seen.get().getCause());
        assertThrows(ChannelFailedException.class, () -> ch.send(1));
    }

    @Test
    void endOfStreamOnlyAfterEverySenderIsDone() throws Exception {
        BoundedChannel<Integer> ch = new BoundedChannel<>("t", 8, 2);
        ch.send(7);
        ch.senderDone();
        assertEquals(7, ch.receive());
        ch.senderDone();
        assertNull(ch.receive());
        assertNull(ch.receive());
        assertThrows(IllegalStateException.class, ch::senderDone);
    }

    @Test
    void windowAdmitsOnlyWithinItsWidth() throws Exception {
        SequenceWindow w = new SequenceWindow(10, 3);
        w.admit(10);
        w.admit(12);
        CountDownLatch admitted = new CountDownLatch(1);
        Thread t = new Thread(() -> {
            try {
                w.admit(13);
                admitted.countDown();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
        t.start();
        assertTrue(!admitted.await(200, TimeUnit.MILLISECONDS));
        w.release(11);
        assertTrue(admitted.await(5, TimeUnit.SECONDS));
    }
}
