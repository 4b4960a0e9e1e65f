package org.winnow.producer;

/**
 * The tests on a complete matrix: strict Hall (B3) and the identity flags (§3 of the enumeration
 * design). Works on the generator's arrays directly; reusable, not thread-safe.
 */
final class LeafChecks {
    private final Matching matching = new Matching();
    private final int[] colSupport = new int[Matching.MAX_UNITS];
    private final int[] restricted = new int[Matching.MAX_UNITS];

    /**
     * Strict Hall: every non-empty set S of columns has {@code sum_{r in N(S)} n_r >= |S| + 1}.
     * Equivalent to K b-matchings, one per column j0, with demand 2 at j0 and 1 elsewhere into
     * rows of capacity n_r; they share the demand-1 matching, so each needs one augmentation.
     */
    boolean strictHall(int[] n, int[][] q, int m, int k) {
        supports(q, m, k);
        matching.reset(m);
        for (int r = 0; r < m; r++) {
            matching.capacity[r] = n[r];
        }
        for (int j = 0; j < k; j++) {
            if (!matching.add(colSupport[j])) {
                return false;
            }
        }
        matching.save();
        for (int j = 0; j < k; j++) {
            boolean ok = matching.add(colSupport[j]);
            matching.restore();
            if (!ok) {
                return false;
            }
        }
        return true;
    }

    /** The identity flags as a mask of {@link Flag#bit()}. */
    int flags(int[] n, int[][] q, int m, int k) {
        return flags(n, q, m, k, 0);
    }

    /**
     * The identity flags, except that Ek is not tested (and its bit not set) when a flag in {@code dropMask}
     * already holds: the caller drops such a matrix anyway.
     */
    int flags(int[] n, int[][] q, int m, int k, int dropMask) {
        supports(q, m, k);
        int flags = 0;
        for (int j = 0; j < k; j++) {
            int s = colSupport[j];
            if (Integer.bitCount(s) == 1) {
                int r = Integer.numberOfTrailingZeros(s);
                if (q[r][j] == 2 && n[r] == 2) {
                    flags |= Flag.C.bit();
                } else if (q[r][j] == 2 && n[r] == 3) {
                    flags |= Flag.Q3S.bit();
                }
            }
        }
        for (int r = 0; r < m && (flags & Flag.Q3P.bit()) == 0; r++) {
            if (n[r] != 1) {
                continue;
            }
            for (int p = r + 1; p < m; p++) {
                if (n[p] == 1 && java.util.Arrays.equals(q[r], 0, k, q[p], 0, k)) {
                    flags |= Flag.Q3P.bit();
                    break;
                }
            }
        }
        if (!connected(m, k)) {
            flags |= Flag.BD.bit();
        }
        if ((flags & dropMask) != 0) {
            // Dropped whatever Ek says: skip its b-matchings, the costliest check of a leaf.
            return flags;
        }
        for (int a = 0; a < m; a++) {
            if (isZeroOne(q[a], k) && ineffectiveSplit(n, q, m, k, a)) {
                flags |= Flag.EK.bit();
                break;
            }
        }
        return flags;
    }

    private void supports(int[][] q, int m, int k) {
        for (int j = 0; j < k; j++) {
            int s = 0;
            for (int r = 0; r < m; r++) {
                if (q[r][j] != 0) {
                    s |= 1 << r;
                }
            }
            colSupport[j] = s;
        }
    }

    private boolean connected(int m, int k) {
        int reached = 1;
        int frontier = 1;
        while (frontier != 0) {
            int next = 0;
            for (int j = 0; j < k; j++) {
                if ((colSupport[j] & frontier) != 0) {
                    next |= colSupport[j];
                }
            }
            frontier = next & ~reached;
            reached |= next;
        }
        return reached == (1 << m) - 1;
    }

    private static boolean isZeroOne(int[] row, int k) {
        for (int j = 0; j < k; j++) {
            if (row[j] > 1) {
                return false;
            }
        }
        return true;
    }

    /**
     * Ek(a) for a 0/1 row a (enumeration design §3.6): the split is ineffective iff for every
     * 4-multiset M of the split columns with no column more than twice, the configuration without
     * row a, with the other columns and M (restricted to the other rows), has no b-matching into
     * capacities n_r. The other columns are matched once; each M only adds its four units.
     */
    private boolean ineffectiveSplit(int[] n, int[][] q, int m, int k, int a) {
        int others = ((1 << m) - 1) & ~(1 << a);
        matching.reset(m);
        for (int r = 0; r < m; r++) {
            matching.capacity[r] = r == a ? 0 : n[r];
        }
        int s = 0;
        for (int j = 0; j < k; j++) {
            int sup = colSupport[j] & others;
            if (q[a][j] == 1) {
                restricted[s++] = sup;
            } else if (!matching.add(sup)) {
                return true;
            }
        }
        matching.save();
        // multisets i <= j <= l <= p of split indices with no index used more than twice
        for (int i = 0; i < s; i++) {
            for (int j = i; j < s; j++) {
                for (int l = j; l < s; l++) {
                    if (i == l) {
                        continue;
                    }
                    for (int p = l; p < s; p++) {
                        if (j == p) {
                            continue;
                        }
                        boolean ok = matching.add(restricted[i]) && matching.add(restricted[j])
                                && matching.add(restricted[l]) && matching.add(restricted[p]);
                        matching.restore();
                        if (ok) {
                            return false;
                        }
                    }
                }
            }
        }
        return true;
    }
}
