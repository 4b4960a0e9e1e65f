package org.winnow.pipeline;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import org.winnow.geometry.Checks;

/**
 * The keys a {@link Sequencer} has seen, held as 128-bit digests in one open-addressing table of
 * longs: 16 bytes a slot, at most 3/4 full, so 21 to 43 bytes a key whatever the key's length and with
 * no object per key (a {@code HashSet<String>} of canonical texts took several times that; the figures
 * are in docs/scan-pipeline.md). Two different keys share a digest with a probability of about
 * n^2 / 2^129, negligible for any file a scan reads (the argument of {@link CandidateKeys}).
 *
 * <p>The table grows by doubling up to a limit on the number of keys, chosen so that it fits in the
 * heap; one key more throws {@link KeyLimitException} with a message that says what to do, instead
 * of an {@link OutOfMemoryError} somewhere in the run. Not thread-safe.
 */
public final class SeenKeys {
    /** The largest table: 2^29 slots, a long array of 2^30 elements (8 GiB). */
    static final int MAX_SLOTS = 1 << 29;
    /** Bytes a slot takes. */
    static final int SLOT_BYTES = 16;

    private final long maxKeys;
    private final MessageDigest sha;
    private long[] table;
    private int mask;
    private long size;

    /** @param maxKeys the most keys the set will hold, at least 1 */
    public SeenKeys(long maxKeys) {
        Checks.requireArgument(maxKeys >= 1 && maxKeys <= MAX_SLOTS / 4 * 3,
                "the key limit must be in 1..%s: %s", MAX_SLOTS / 4 * 3, maxKeys);
        this.maxKeys = maxKeys;
        this.sha = sha256();
        this.table = new long[2 * 1024];
        this.mask = 1024 - 1;
    }

    /**
     * The most keys whose table fits in half of {@code heapBytes}, counting the moment of growth when
     * the old and the new table are both alive (24 bytes a slot of the new one).
     */
    public static long limitFor(long heapBytes) {
        long slots = Math.min(MAX_SLOTS, Long.highestOneBit(Math.max(1, heapBytes / 2 / (SLOT_BYTES + SLOT_BYTES / 2))));
        return Math.max(1, slots / 4 * 3);
    }

    /** The limit for this JVM's maximum heap. */
    public static long limitForThisHeap() {
        return limitFor(Runtime.getRuntime().maxMemory());
    }

    /** The most keys this set holds. */
    public long maxKeys() {
        return maxKeys;
    }

    /** Keys held. */
    public long size() {
        return size;
    }

    /**
     * Adds {@code key}.
     *
     * @return true iff it was not there before
     * @throws KeyLimitException when the key is new and the set already holds {@link #maxKeys()}
     */
    public boolean add(String key) {
        byte[] d = sha.digest(key.getBytes(StandardCharsets.UTF_8));
        long hi = word(d, 0);
        long lo = word(d, 8);
        if (hi == 0 && lo == 0) {
            lo = 1; // (0, 0) marks an empty slot
        }
        int i = find(table, mask, hi, lo);
        if (table[2 * i] == hi && table[2 * i + 1] == lo) {
            return false;
        }
        if (size >= maxKeys) {
            throw new KeyLimitException(maxKeys);
        }
        table[2 * i] = hi;
        table[2 * i + 1] = lo;
        size++;
        if (size * 4 > (long) (mask + 1) * 3 && mask + 1 < MAX_SLOTS) {
            grow();
        }
        return true;
    }

    /** The slot holding (hi, lo), or the empty slot where it belongs. */
    private static int find(long[] t, int mask, long hi, long lo) {
        int i = (int) (lo ^ (lo >>> 32)) & mask;
        while (true) {
            long h = t[2 * i];
            long l = t[2 * i + 1];
            if ((h == 0 && l == 0) || (h == hi && l == lo)) {
                return i;
            }
            i = (i + 1) & mask;
        }
    }

    private void grow() {
        int slots = (mask + 1) * 2;
        long[] next = new long[2 * slots];
        int nextMask = slots - 1;
        for (int i = 0; i <= mask; i++) {
            long h = table[2 * i];
            long l = table[2 * i + 1];
            if (h != 0 || l != 0) {
                int j = find(next, nextMask, h, l);
                next[2 * j] = h;
                next[2 * j + 1] = l;
            }
        }
        table = next;
        mask = nextMask;
    }

    private static long word(byte[] d, int from) {
        long w = 0;
        for (int i = from; i < from + 8; i++) {
            w = (w << 8) | (d[i] & 0xffL);
        }
        return w;
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
