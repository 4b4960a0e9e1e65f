package org.winnow.geometry.cohomology;

import org.winnow.geometry.Checks;

/**
 * The compositions of {@code s} into {@code parts} nonnegative parts, in descending lexicographic
 * order ({@code (s,0,...,0)} first), with constant-time-per-part ranking.
 *
 * <p>Ranking uses the hockey-stick identity: among compositions sharing a prefix, those whose next
 * part exceeds {@code c_i} number {@code C(t + P - 1, P - 1)} with {@code t = rem - c_i - 1} and P
 * the parts still open, so the rank is a sum of one table entry per part.
 */
public final class Compositions {
    private final int parts;
    private final int sum;
    private final int[][] elements;
    /** count[p][t] = number of compositions of t into p parts, for p = 0..parts, t = 0..sum. */
    private final long[][] count;

    private Compositions(int parts, int sum) {
        this.parts = parts;
        this.sum = sum;
        this.count = new long[parts + 1][sum + 1];
        for (int p = 1; p <= parts; p++) {
            for (int t = 0; t <= sum; t++) {
                long c = p == 1 ? 1 : count[p - 1][t] + (t > 0 ? count[p][t - 1] : 0);
                Checks.requireArgument(c <= Integer.MAX_VALUE, "too many compositions of %d into %d parts", sum, parts);
                count[p][t] = c;
            }
        }
        int size = (int) count[parts][sum];
        this.elements = new int[size][];
        int[] current = new int[parts];
        int[] next = {0};
        fill(current, 0, sum, next);
    }

    /**
     * Built lists, shared: they are immutable, and the Hodge engine asks for the same few (parts, sum)
     * pairs for every bundle of every configuration. Only small lists are kept, and only so many.
     */
    private static final java.util.concurrent.ConcurrentHashMap<Long, Compositions> SHARED =
            new java.util.concurrent.ConcurrentHashMap<>();
    private static final int SHARED_MAX_ENTRIES = 4096;
    private static final long SHARED_MAX_SIZE = 1 << 14;

    /** The compositions of {@code sum >= 0} into {@code parts >= 1} parts. */
    public static Compositions of(int parts, int sum) {
        if (parts < 1 || sum < 0) {
            Checks.requireArgument(parts >= 1, "parts must be at least 1: %d", parts);
            Checks.requireArgument(sum >= 0, "sum must be nonnegative: %d", sum);
        }
        long key = ((long) parts << 32) | sum;
        Compositions shared = SHARED.get(key);
        if (shared != null) {
            return shared;
        }
        Compositions made = new Compositions(parts, sum);
        if (made.size() <= SHARED_MAX_SIZE && SHARED.size() < SHARED_MAX_ENTRIES) {
            SHARED.putIfAbsent(key, made);
        }
        return made;
    }

    private void fill(int[] current, int pos, int rem, int[] next) {
        if (pos == parts - 1) {
            current[pos] = rem;
            elements[next[0]++] = current.clone();
            return;
        }
        for (int v = rem; v >= 0; v--) {
            current[pos] = v;
            fill(current, pos + 1, rem - v, next);
        }
    }

    public int parts() {
        return parts;
    }

    public int sum() {
        return sum;
    }

    /** Number of compositions. */
    public int size() {
        return elements.length;
    }

    /** The composition with the given rank (shared array: do not modify). */
    int[] elementShared(int rank) {
        return elements[rank];
    }

    /** A copy of the composition with the given rank. */
    public int[] element(int rank) {
        return elements[rank].clone();
    }

    /**
     * The rank of the composition stored in {@code c[offset .. offset+parts)}, or -1 if it is not a
     * composition of {@link #sum()} (negative part or wrong total).
     */
    public int rank(int[] c, int offset) {
        return rank(c, offset, false);
    }

    /**
     * As {@link #rank(int[], int)}, of the composition {@code -c_i - 1} when {@code negated} (the shifted
     * exponents of a top-degree factor), so that callers need not copy.
     */
    int rank(int[] c, int offset, boolean negated) {
        long rank = 0;
        int rem = sum;
        for (int i = 0; i < parts - 1; i++) {
            int v = negated ? -c[offset + i] - 1 : c[offset + i];
            if (v < 0 || v > rem) {
                return -1;
            }
            int t = rem - v - 1;
            if (t >= 0) {
                rank += count[parts - i][t];
            }
            rem -= v;
        }
        int last = negated ? -c[offset + parts - 1] - 1 : c[offset + parts - 1];
        if (last != rem) {
            return -1;
        }
        return (int) rank;
    }
}
