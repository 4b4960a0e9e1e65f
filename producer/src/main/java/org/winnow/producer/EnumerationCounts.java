package org.winnow.producer;

/**
 * Number of emitted matrices per number of rows.
 *
 * @param byRows entry m is the count of matrices with m rows (index 0 unused)
 */
public record EnumerationCounts(long[] byRows) {
    public EnumerationCounts {
        byRows = byRows.clone();
    }

    /** Count of matrices with {@code rows} rows. */
    public long rows(int rows) {
        return rows < byRows.length ? byRows[rows] : 0;
    }

    /** Sum over all row numbers. */
    public long total() {
        long s = 0;
        for (long v : byRows) {
            s += v;
        }
        return s;
    }

    @Override
    public long[] byRows() {
        return byRows.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof EnumerationCounts other && java.util.Arrays.equals(byRows, other.byRows);
    }

    @Override
    public int hashCode() {
        return java.util.Arrays.hashCode(byRows);
    }

    @Override
    public String toString() {
        return "EnumerationCounts" + java.util.Arrays.toString(byRows);
    }
}
