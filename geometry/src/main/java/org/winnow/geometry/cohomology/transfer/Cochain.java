package org.winnow.geometry.cohomology.transfer;

import java.util.Arrays;
import org.winnow.geometry.linalg.ModP;

/**
 * A sparse cochain of the double complex: packed cells ({@link CellLayout}) with coefficients mod p.
 *
 * <p>Entries live in dense parallel arrays (keys with a fixed stride, coefficients) and an
 * open-addressing index with linear probing points into them, so iteration is a linear scan and
 * {@link #clear} only touches the slots in use. Coefficients that cancel to zero stay as entries
 * with value 0; readers skip them.
 */
final class Cochain {
    private static final long MIX = 0x9E3779B97F4A7C15L;

    private final int stride;
    private long[] keys;
    private long[] values;
    private int[] slotOfEntry;
    private int[] index;
    private int mask;
    private int count;

    Cochain(int stride) {
        this.stride = stride;
        int capacity = 16;
        keys = new long[capacity * stride];
        values = new long[capacity];
        slotOfEntry = new int[capacity];
        index = new int[capacity * 2];
        mask = index.length - 1;
    }

    int stride() {
        return stride;
    }

    /** Number of entries, including cancelled ones. */
    int size() {
        return count;
    }

    long[] keys() {
        return keys;
    }

    long value(int entry) {
        return values[entry];
    }

    /** Adds {@code coefficient} (a residue in [0, p)) at the cell packed at {@code key[off..]}. */
    void add(long[] key, int off, long coefficient) {
        if (coefficient == 0) {
            return;
        }
        int slot = hash(key, off) & mask;
        while (true) {
            int e = index[slot] - 1;
            if (e < 0) {
                break;
            }
            if (sameKey(e, key, off)) {
                long v = values[e] + coefficient;
                values[e] = v >= ModP.P ? v - ModP.P : v;
                return;
            }
            slot = (slot + 1) & mask;
        }
        if (count == values.length) {
            grow();
            add(key, off, coefficient);
            return;
        }
        System.arraycopy(key, off, keys, count * stride, stride);
        values[count] = coefficient;
        slotOfEntry[count] = slot;
        index[slot] = ++count;
    }

    void clear() {
        for (int e = 0; e < count; e++) {
            index[slotOfEntry[e]] = 0;
        }
        count = 0;
    }

    /** True iff every coefficient is zero. */
    boolean isZero() {
        for (int e = 0; e < count; e++) {
            if (values[e] != 0) {
                return false;
            }
        }
        return true;
    }

    private boolean sameKey(int e, long[] key, int off) {
        int base = e * stride;
        for (int w = 0; w < stride; w++) {
            if (keys[base + w] != key[off + w]) {
                return false;
            }
        }
        return true;
    }

    private int hash(long[] key, int off) {
        long h = 0;
        for (int w = 0; w < stride; w++) {
            h = (h ^ key[off + w]) * MIX;
        }
        return (int) (h ^ (h >>> 29) ^ (h >>> 47));
    }

    private void grow() {
        int capacity = values.length * 2;
        keys = Arrays.copyOf(keys, capacity * stride);
        values = Arrays.copyOf(values, capacity);
        slotOfEntry = new int[capacity];
        index = new int[capacity * 2];
        mask = index.length - 1;
        for (int e = 0; e < count; e++) {
            int slot = hash(keys, e * stride) & mask;
            while (index[slot] != 0) {
                slot = (slot + 1) & mask;
            }
            index[slot] = e + 1;
            slotOfEntry[e] = slot;
        }
    }
}
