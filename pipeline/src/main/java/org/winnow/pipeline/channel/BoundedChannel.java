package org.winnow.pipeline.channel;

import java.util.ArrayDeque;
import java.util.concurrent.locks.Condition;
import java.util.concurrent.locks.ReentrantLock;
import org.winnow.geometry.Checks;

/**
 * A bounded many-to-many hand-over between threads. {@link #send} blocks while the channel holds
 * {@link #capacity()} records, which is what keeps a fast producer from filling the heap in front of
 * a slow consumer.
 *
 * <p>End of stream: the channel is created for a known number of senders; each calls
 * {@link #senderDone()} once, and after the last one {@link #receive()} drains what is left and then
 * returns null to every receiver. {@link #fail} wakes every blocked thread with a
 * {@link ChannelFailedException}, so that one failing thread stops the whole run promptly.
 *
 * <p>Thread-safe. A lock with two conditions rather than a {@code java.util.concurrent} queue,
 * because the end-of-stream and failure signals must be ordered with the records.
 */
public final class BoundedChannel<T> {
    private final String name;
    private final int capacity;
    private final ArrayDeque<T> items;
    private final ReentrantLock lock = new ReentrantLock();
    private final Condition notFull = lock.newCondition();
    private final Condition notEmpty = lock.newCondition();
    private int openSenders;
    private int maxDepth;
    private Throwable failure;

    /**
     * @param name     for messages and metric tags
     * @param capacity the most records held at once, at least 1
     * @param senders  how many threads will send, at least 1
     */
    public BoundedChannel(String name, int capacity, int senders) {
        Checks.requireArgument(capacity >= 1, "channel capacity must be at least 1: %s", capacity);
        Checks.requireArgument(senders >= 1, "a channel needs at least one sender: %s", senders);
        this.name = name;
        this.capacity = capacity;
        this.items = new ArrayDeque<>(Math.min(capacity, 1 << 16));
        this.openSenders = senders;
    }

    /** Adds a record, blocking while the channel is full. */
    public void send(T item) throws InterruptedException {
        lock.lockInterruptibly();
        try {
            while (items.size() >= capacity && failure == null) {
                notFull.await();
            }
            checkFailure();
            Checks.requireState(openSenders > 0, "%s: send after every sender was done", name);
            items.addLast(item);
            maxDepth = Math.max(maxDepth, items.size());
            notEmpty.signal();
        } finally {
            lock.unlock();
        }
    }

    /** Takes the oldest record, blocking while empty; null once every sender is done and all is taken. */
    public T receive() throws InterruptedException {
        lock.lockInterruptibly();
        try {
            while (items.isEmpty() && openSenders > 0 && failure == null) {
                notEmpty.await();
            }
            checkFailure();
            T item = items.pollFirst();
            if (item != null) {
                notFull.signal();
            }
            return item;
        } finally {
            lock.unlock();
        }
    }

    /** Called once by each sender after its last {@link #send}. */
    public void senderDone() {
        lock.lock();
        try {
            Checks.requireState(openSenders > 0, "%s: more senders done than declared", name);
            openSenders--;
            if (openSenders == 0) {
                notEmpty.signalAll();
            }
        } finally {
            lock.unlock();
        }
    }

    /** Fails the channel: every blocked and every later call throws {@link ChannelFailedException}. */
    public void fail(Throwable cause) {
        lock.lock();
        try {
            if (failure == null) {
                failure = cause;
            }
            notFull.signalAll();
            notEmpty.signalAll();
        } finally {
            lock.unlock();
        }
    }

    private void checkFailure() {
        if (failure != null) {
            throw new ChannelFailedException(name, failure);
        }
    }

    /** The channel's name. */
    public String name() {
        return name;
    }

    /** The most records the channel holds at once. */
    public int capacity() {
        return capacity;
    }

    /** How many records it holds now. */
    public int depth() {
        lock.lock();
        try {
            return items.size();
        } finally {
            lock.unlock();
        }
    }

    /** The largest depth seen so far; never above {@link #capacity()}. */
    public int maxDepth() {
        lock.lock();
        try {
            return maxDepth;
        } finally {
            lock.unlock();
        }
    }
}
