package org.winnow.geometry.cohomology.transfer;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.BottBasis;
import org.winnow.geometry.cohomology.KoszulPage;

/**
 * The Koszul E1 page of {@code O_X(k)} with explicit Bott bases: the nonzero summands
 * {@code H^q(A, O(k - q_S))}, grouped by total degree {@code t = q - |S|}.
 *
 * <p>The vector space {@code V^t} of the transferred complex is the concatenation of the summands of
 * total degree t in increasing order of the subset bitmask S; {@link Summand#offset} is the first
 * index of a summand inside {@code V^t}.
 *
 * <p>The summands are those of the spectral-sequence page {@link KoszulPage}; this class adds the
 * explicit bases the transfer works in.
 */
public final class BottPage {
    /**
     * One nonzero E1 summand.
     *
     * @param subset the columns S as a bitmask (bit j for column j)
     * @param basis  the Bott basis of {@code H^q(A, O(k - q_S))}
     * @param offset first index of this summand inside {@code V^t}
     */
    public record Summand(int subset, BottBasis basis, int offset) {
        /** {@code p = |S|}. */
        public int column() {
            return Integer.bitCount(subset);
        }

        /** The cohomological degree q on the ambient space. */
        public int degree() {
            return basis.degree();
        }

        /** {@code t = q - p}. */
        public int totalDegree() {
            return basis.degree() - column();
        }

        /** The Bott type (bitmask over rows of the factors in top degree). */
        public int bottType() {
            return basis.bottMask();
        }
    }

    private final Configuration x;
    private final int[] twist;
    private final int minDegree;
    private final List<List<Summand>> byDegree;
    private final Map<Integer, Summand> bySubset;

    private BottPage(Configuration x, int[] twist, List<BottBasis> bases, List<Integer> subsets) {
        this.x = x;
        this.twist = twist.clone();
        int lo = Integer.MAX_VALUE;
        int hi = Integer.MIN_VALUE;
        for (int i = 0; i < bases.size(); i++) {
            int t = bases.get(i).degree() - Integer.bitCount(subsets.get(i));
            lo = Math.min(lo, t);
            hi = Math.max(hi, t);
        }
        minDegree = bases.isEmpty() ? 0 : lo;
        int levels = bases.isEmpty() ? 0 : hi - lo + 1;
        byDegree = new ArrayList<>();
        for (int t = 0; t < levels; t++) {
            byDegree.add(new ArrayList<>());
        }
        bySubset = new HashMap<>();
        int[] next = new int[levels];
        for (int i = 0; i < bases.size(); i++) {
            int level = bases.get(i).degree() - Integer.bitCount(subsets.get(i)) - minDegree;
            Summand s = new Summand(subsets.get(i), bases.get(i), next[level]);
            next[level] += s.basis().size();
            byDegree.get(level).add(s);
            bySubset.put(s.subset(), s);
        }
    }

    /**
     * The E1 page of {@code O_X(k)} with Bott bases.
     *
     * @throws IllegalArgumentException if {@code k} has the wrong length or a summand is too large for
     *                                  an explicit basis
     */
    public static BottPage of(Configuration x, int[] k) {
        Checks.requireArgument(k.length == x.rows(), "twist has %d entries for %d rows", k.length, x.rows());
        List<KoszulPage.Summand> found = new ArrayList<>(KoszulPage.of(x, k).summands());
        found.sort(Comparator.comparingInt(KoszulPage.Summand::subset));
        List<BottBasis> bases = new ArrayList<>();
        List<Integer> subsets = new ArrayList<>();
        int[] n = x.dims();
        for (KoszulPage.Summand s : found) {
            bases.add(BottBasis.of(n, s.degrees()));
            subsets.add(s.subset());
        }
        return new BottPage(x, k, bases, subsets);
    }

    public Configuration configuration() {
        return x;
    }

    /** A copy of the twist k. */
    public int[] twist() {
        return twist.clone();
    }

    /** The summands of total degree t (empty outside the page), ordered by subset. */
    public List<Summand> summands(int t) {
        int level = t - minDegree;
        return level < 0 || level >= byDegree.size() ? List.of() : List.copyOf(byDegree.get(level));
    }

    /** All summands, by increasing total degree. */
    public List<Summand> summands() {
        List<Summand> all = new ArrayList<>();
        byDegree.forEach(all::addAll);
        return all;
    }

    /** The summand at subset S, or null if {@code H^*(A, O(k - q_S)) = 0}. */
    public Summand summand(int subset) {
        return bySubset.get(subset);
    }

    /** {@code dim V^t = E_t}, the sum of the E1 dimensions in total degree t. */
    public int dimension(int t) {
        int level = t - minDegree;
        if (level < 0 || level >= byDegree.size()) {
            return 0;
        }
        int sum = 0;
        for (Summand s : byDegree.get(level)) {
            sum = Math.addExact(sum, s.basis().size());
        }
        return sum;
    }

    /** Lowest total degree with a summand (0 for an empty page). */
    public int minDegree() {
        return minDegree;
    }

    /** Highest total degree with a summand (-1 for an empty page). */
    public int maxDegree() {
        return minDegree + byDegree.size() - 1;
    }

    /** The alternating sum {@code sum_t (-1)^t E_t}, which equals {@code chi(X, O_X(k))}. */
    public long eulerCharacteristic() {
        long chi = 0;
        for (int t = minDegree; t <= maxDegree(); t++) {
            chi += (t % 2 == 0 ? 1 : -1) * (long) dimension(t);
        }
        return chi;
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("E1 of O_X" + Arrays.toString(twist) + ":");
        for (Summand s : summands()) {
            sb.append(String.format(" S=%s(p=%d,q=%d,dim=%d)", Integer.toBinaryString(s.subset()), s.column(),
                    s.degree(), s.basis().size()));
        }
        return sb.toString();
    }
}
