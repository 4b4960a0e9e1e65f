package org.winnow.geometry.cohomology.transfer;

import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * Packs a {@link CellTerm} into a fixed number of {@code long}s: the subset S in the low bits of the
 * first word, then per factor the sigma bitmask and the exponents, each exponent biased by the
 * factor's lowest reachable value so that it is stored non-negative.
 *
 * <p>Bounds. Negative exponents only come from the inverse monomials of {@code H^{n_r}} classes and
 * only grow under multiplication, so in factor r every exponent is at least
 * {@code lo_r = min(0, min_k (k_r - sum_j q[r][j]) + n_r)} (the most negative entry of an inverse
 * monomial of total degree {@code k_r - sum_j q[r][j]}, the degree at S = all columns), and at most
 * {@code max_k k_r - n_r lo_r} (the total degree never exceeds {@code k_r}, the other entries are at
 * least {@code lo_r}). Because the bias makes every field non-negative and results stay within the
 * bounds, multiplying by a monomial is a plain addition of its raw packed exponents
 * ({@link #packMonomial}): no carry crosses a field.
 */
final class CellLayout {
    private final int factors;
    private final int cols;
    private final int[] size;
    private final int[] offset;
    private final int stride;
    private final int[] sigmaWord;
    private final int[] sigmaShift;
    private final int[] expWord;
    private final int[] expShift;
    private final long[] expMask;
    private final int[] expLo;
    private final int[] expHi;

    private CellLayout(Configuration x, int[] lo, int[] hi) {
        factors = x.rows();
        cols = x.cols();
        size = new int[factors];
        offset = new int[factors];
        int coordinates = 0;
        for (int r = 0; r < factors; r++) {
            size[r] = x.n(r) + 1;
            offset[r] = coordinates;
            coordinates += size[r];
        }
        sigmaWord = new int[factors];
        sigmaShift = new int[factors];
        expWord = new int[coordinates];
        expShift = new int[coordinates];
        expMask = new long[coordinates];
        expLo = new int[coordinates];
        expHi = new int[coordinates];
        int word = 0;
        int bit = cols;
        for (int r = 0; r < factors; r++) {
            if (bit + size[r] > 64) {
                word++;
                bit = 0;
            }
            sigmaWord[r] = word;
            sigmaShift[r] = bit;
            bit += size[r];
            int width = 64 - Long.numberOfLeadingZeros(Math.max(1, hi[r] - lo[r]));
            for (int i = 0; i < size[r]; i++) {
                int c = offset[r] + i;
                if (bit + width > 64) {
                    word++;
                    bit = 0;
                }
                expWord[c] = word;
                expShift[c] = bit;
                expMask[c] = (1L << width) - 1;
                expLo[c] = lo[r];
                expHi[c] = hi[r];
                bit += width;
            }
        }
        stride = word + 1;
    }

    /** A layout that can hold every cell reachable from the E1 pages of the given twists. */
    static CellLayout of(Configuration x, int[]... twists) {
        Checks.requireArgument(twists.length > 0, "at least one twist is needed");
        int m = x.rows();
        for (int r = 0; r < m; r++) {
            Checks.requireArgument(x.n(r) <= 30, "row %d: P^%d is too large for a Cech cell bitmask (at most P^30)",
                    r + 1, x.n(r));
        }
        int[] lo = new int[m];
        int[] hi = new int[m];
        for (int r = 0; r < m; r++) {
            int minTwist = Integer.MAX_VALUE;
            int maxTwist = Integer.MIN_VALUE;
            for (int[] k : twists) {
                Checks.requireArgument(k.length == m, "twist has %d entries for %d rows", k.length, m);
                minTwist = Math.min(minTwist, k[r]);
                maxTwist = Math.max(maxTwist, k[r]);
            }
            lo[r] = Math.min(0, minTwist - x.rowSum(r) + x.n(r));
            hi[r] = Math.max(0, maxTwist) - x.n(r) * lo[r];
        }
        return new CellLayout(x, lo, hi);
    }

    int factors() {
        return factors;
    }

    int coordinates() {
        return expWord.length;
    }

    int size(int r) {
        return size[r];
    }

    int offset(int r) {
        return offset[r];
    }

    /** Number of {@code long}s per packed cell. */
    int stride() {
        return stride;
    }

    CellTerm newTerm() {
        return new CellTerm(factors, expWord.length);
    }

    void pack(CellTerm t, long[] dst, int off) {
        for (int w = 0; w < stride; w++) {
            dst[off + w] = 0L;
        }
        dst[off] = t.subset;
        for (int r = 0; r < factors; r++) {
            dst[off + sigmaWord[r]] |= (long) t.sigma[r] << sigmaShift[r];
        }
        for (int c = 0; c < expWord.length; c++) {
            int e = t.exp[c];
            if (e < expLo[c] || e > expHi[c]) {
                throw new IllegalStateException("exponent " + e + " outside the layout bounds ["
                        + expLo[c] + ", " + expHi[c] + "]");
            }
            dst[off + expWord[c]] |= (long) (e - expLo[c]) << expShift[c];
        }
    }

    void unpack(long[] src, int off, CellTerm t) {
        t.subset = (int) (src[off] & ((1L << cols) - 1));
        for (int r = 0; r < factors; r++) {
            t.sigma[r] = (int) ((src[off + sigmaWord[r]] >>> sigmaShift[r]) & ((1L << size[r]) - 1));
        }
        for (int c = 0; c < expWord.length; c++) {
            t.exp[c] = (int) ((src[off + expWord[c]] >>> expShift[c]) & expMask[c]) + expLo[c];
        }
    }

    /**
     * The raw (unbiased) exponents of a monomial at the exponent fields; adding it to a packed cell
     * multiplies the cell by the monomial.
     */
    long[] packMonomial(int[] exponents) {
        long[] packed = new long[stride];
        for (int c = 0; c < expWord.length; c++) {
            packed[expWord[c]] += (long) exponents[c] << expShift[c];
        }
        return packed;
    }
}
