package org.winnow.geometry.cohomology;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * The E1 page of the Koszul spectral sequence of {@code O_X(k)} for the complete intersection X of a
 * configuration: {@code E1(p, q) = (+)_{|S| = p} H^q(A, O(k - q_S))}, converging to
 * {@code H^{q-p}(X, O_X(k))}.
 *
 * <p>Only the nonzero summands are kept. They are found by a depth-first search over the columns
 * that carries the residual degree {@code k - q_S}; a branch is pruned as soon as some row is dead:
 * its residual lies in {@code [-n_r, -1]} (where every factor cohomology vanishes) and subtracting all
 * not yet decided column degrees of that row cannot push it below {@code -n_r}. Degrees only
 * decrease along the search, so no pruned branch has a nonzero leaf.
 */
public final class KoszulPage {
    /**
     * One nonzero Koszul summand.
     *
     * @param subset   the column set S as a bitmask (bit j for column j)
     * @param p        {@code |S|}
     * @param q        the cohomological degree on A
     * @param dim      {@code h^q(A, O(k - q_S))}
     * @param bottMask the Bott type of {@code O(k - q_S)}
     * @param degrees  {@code k - q_S}
     */
    public record Summand(int subset, int p, int q, long dim, int bottMask, int[] degrees) {
        public Summand {
            degrees = degrees.clone();
        }

        /** The total degree {@code q - p}: the summand contributes to {@code H^{q-p}(X, O_X(k))}. */
        public int t() {
            return q - p;
        }

        @Override
        public int[] degrees() {
            return degrees.clone();
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Summand s && s.subset == subset && s.q == q && s.dim == dim && Arrays.equals(s.degrees, degrees);
        }

        @Override
        public int hashCode() {
            return 31 * subset + Arrays.hashCode(degrees);
        }
    }

    /** A position {@code (p, q)} of the page. */
    public record Position(int p, int q) implements Comparable<Position> {
        /** The total degree {@code q - p}. */
        public int t() {
            return q - p;
        }

        @Override
        public int compareTo(Position o) {
            return p != o.p ? Integer.compare(p, o.p) : Integer.compare(q, o.q);
        }
    }

    private final Configuration config;
    private final int[] k;
    private final List<Summand> summands;
    private final Map<Position, List<Summand>> byPosition;

    private KoszulPage(Configuration config, int[] k, List<Summand> summands) {
        this.config = config;
        this.k = k;
        this.summands = Collections.unmodifiableList(summands);
        Map<Position, List<Summand>> map = new TreeMap<>();
        for (Summand s : summands) {
            map.computeIfAbsent(new Position(s.p(), s.q()), x -> new ArrayList<>()).add(s);
        }
        for (List<Summand> list : map.values()) {
            list.sort(Comparator.comparingInt(Summand::subset));
        }
        map.replaceAll((x, list) -> List.copyOf(list));
        this.byPosition = Collections.unmodifiableMap(map);
    }

    /**
     * The E1 page of {@code O_X(k)}.
     *
     * @throws IllegalArgumentException if {@code k} has the wrong length
     * @throws ArithmeticException      if some summand's dimension exceeds {@code Long.MAX_VALUE}
     */
    public static KoszulPage of(Configuration config, int[] k) {
        int m = config.rows();
        int cols = config.cols();
        Checks.requireArgument(k.length == m, "line bundle degree has %d entries for %d rows", k.length, m);
        int[] n = config.dims();
        int[][] q = config.degrees();
        int[][] rem = new int[cols + 1][m];
        for (int j = cols - 1; j >= 0; j--) {
            for (int r = 0; r < m; r++) {
                rem[j][r] = rem[j + 1][r] + q[r][j];
            }
        }
        List<Summand> out = new ArrayList<>();
        search(n, q, rem, 0, 0, 0, k.clone(), out);
        return new KoszulPage(config, k.clone(), out);
    }

    private static void search(int[] n, int[][] q, int[][] rem, int j, int subset, int p, int[] residual,
            List<Summand> out) {
        int m = n.length;
        for (int r = 0; r < m; r++) {
            int v = residual[r];
            if (v <= -1 && v >= -n[r] && v - rem[j][r] > -n[r] - 1) {
                return;
            }
        }
        if (j == q[0].length) {
            AmbientCohomology h = AmbientCohomology.of(n, residual);
            if (!h.isZero()) {
                out.add(new Summand(subset, p, h.degree(), h.dimensionExact(), h.bottMask(), residual));
            }
            return;
        }
        search(n, q, rem, j + 1, subset, p, residual, out);
        int[] next = residual.clone();
        for (int r = 0; r < m; r++) {
            next[r] -= q[r][j];
        }
        search(n, q, rem, j + 1, subset | (1 << j), p + 1, next, out);
    }

    /** The configuration. */
    public Configuration configuration() {
        return config;
    }

    /** A copy of the line bundle degree k. */
    public int[] bundle() {
        return k.clone();
    }

    /** All nonzero summands, in search order. */
    public List<Summand> summands() {
        return summands;
    }

    /** The nonzero positions in increasing (p, q) order. */
    public List<Position> positions() {
        return List.copyOf(byPosition.keySet());
    }

    /** The summands at a position, ordered by their column set; empty if the position is zero. */
    public List<Summand> summandsAt(Position x) {
        return byPosition.getOrDefault(x, List.of());
    }

    /** The E1 dimension at a position. */
    public long dimension(Position x) {
        long s = 0;
        for (Summand sm : summandsAt(x)) {
            s = Math.addExact(s, sm.dim());
        }
        return s;
    }

    /**
     * The E1 page as input for {@link SpectralBounds}: positions of adjacent total degrees are
     * joinable iff the source has the larger p, except that when p drops by exactly one only d1 can
     * join them, and d1 is multiplication by some {@code f_j} from summand S to {@code S - {j}},
     * which preserves the cohomological degree of every factor (Kunneth), hence vanishes unless
     * both summands have the same Bott type.
     */
    public SpectralBounds.Page e1() {
        Map<Position, Long> dims = new TreeMap<>();
        for (Position x : byPosition.keySet()) {
            dims.put(x, dimension(x));
        }
        Map<Position, Long> frozen = Collections.unmodifiableMap(dims);
        int d = config.dimension();
        return new SpectralBounds.Page() {
            @Override
            public int dimension() {
                return d;
            }

            @Override
            public Map<Position, Long> dims() {
                return frozen;
            }

            @Override
            public boolean joinable(Position from, Position to) {
                if (from.p() <= to.p()) {
                    return false;
                }
                return from.p() > to.p() + 1 || sameTypeFace(from, to);
            }
        };
    }

    /** True iff some summand S at {@code from} and some {@code S - {j}} at {@code to} share a Bott type. */
    private boolean sameTypeFace(Position from, Position to) {
        for (Summand s : summandsAt(from)) {
            for (Summand t : summandsAt(to)) {
                int removed = s.subset() & ~t.subset();
                if ((t.subset() & ~s.subset()) == 0 && Integer.bitCount(removed) == 1 && s.bottMask() == t.bottMask()) {
                    return true;
                }
            }
        }
        return false;
    }

    /** {@code sum_t (-1)^t E_t}: the holomorphic Euler characteristic {@code chi(X, O_X(k))}. */
    public long eulerCharacteristic() {
        long chi = 0;
        for (Summand s : summands) {
            chi = (s.t() & 1) == 0 ? Math.addExact(chi, s.dim()) : Math.subtractExact(chi, s.dim());
        }
        return chi;
    }
}
