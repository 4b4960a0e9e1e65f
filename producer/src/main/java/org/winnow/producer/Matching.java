package org.winnow.producer;

import org.winnow.geometry.Configuration;

/**
 * Bipartite b-matching between demand units (copies of columns) and rows with capacities: can
 * every unit be given a row of its column's support without exceeding any capacity? By Hall's
 * theorem for b-matchings this holds iff every set S of columns (counted with multiplicity) has
 * {@code sum of capacities over N(S) >= |S|}. Augmenting paths over units; reusable, not
 * thread-safe.
 */
final class Matching {
    static final int MAX_UNITS = Configuration.MAX_COLS + 8;

    /** Support of each unit as a row bit mask. */
    final int[] support = new int[MAX_UNITS];
    final int[] capacity = new int[Configuration.MAX_ROWS];
    private final int[] owner = new int[MAX_UNITS];
    private final int[] load = new int[Configuration.MAX_ROWS];
    private final int[] savedOwner = new int[MAX_UNITS];
    private final int[] savedLoad = new int[Configuration.MAX_ROWS];
    private int rows;
    private int units;
    private int savedUnits;
    private int visited;

    /** Starts an empty matching over {@code rows} rows; set {@link #capacity} before adding units. */
    void reset(int rows) {
        this.rows = rows;
        this.units = 0;
        for (int r = 0; r < rows; r++) {
            load[r] = 0;
        }
    }

    /** Adds one unit with the given support and tries to place it; false if no placement exists. */
    boolean add(int supportMask) {
        int u = units++;
        support[u] = supportMask;
        owner[u] = -1;
        visited = 0;
        return augment(u);
    }

    /** Remembers the current matching so that units added later can be taken back by {@link #restore}. */
    void save() {
        savedUnits = units;
        System.arraycopy(owner, 0, savedOwner, 0, units);
        System.arraycopy(load, 0, savedLoad, 0, rows);
    }

    void restore() {
        units = savedUnits;
        System.arraycopy(savedOwner, 0, owner, 0, units);
        System.arraycopy(savedLoad, 0, load, 0, rows);
    }

    private boolean augment(int u) {
        int candidates = support[u] & ~visited;
        while (candidates != 0) {
            int r = Integer.numberOfTrailingZeros(candidates);
            candidates &= candidates - 1;
            if ((visited & (1 << r)) != 0) {
                continue;
            }
            visited |= 1 << r;
            if (load[r] < capacity[r]) {
                owner[u] = r;
                load[r]++;
                return true;
            }
            for (int v = 0; v < units; v++) {
                if (v != u && owner[v] == r && augment(v)) {
                    // v moved away from r (its new row took the load), u takes v's place on r
                    load[r]--;
                    owner[u] = r;
                    load[r]++;
                    return true;
                }
            }
        }
        return false;
    }
}
