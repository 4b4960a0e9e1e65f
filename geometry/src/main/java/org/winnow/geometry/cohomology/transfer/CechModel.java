package org.winnow.geometry.cohomology.transfer;

import org.winnow.geometry.linalg.ModP;

/**
 * The multi-Cech model of one Koszul summand and its explicit contraction onto Bott representatives.
 *
 * <p>Per factor {@code P^n}, with {@code eps(v, tau) = (-1)^{#{i in tau : i < v}}} and
 * {@code N = neg(b)}:
 * <ul>
 *   <li>differential {@code delta(e_tau x^b) = sum_{j not in tau} eps(j, tau) e_{tau + j} x^b};
 *   <li>{@code pi(e_{0} x^b) = [x^b]} if {@code N} is empty, {@code pi(e_all x^b) = [x^b]} if
 *       {@code N} is everything, else 0; {@code iota[x^b] = sum_i e_i x^b}, resp. {@code e_all x^b};
 *   <li>homotopy {@code h(e_sigma x^b) = eps(v, sigma - v) e_{sigma - v} x^b} for the smallest
 *       {@code v} not in {@code N}, when {@code v in sigma} and {@code sigma != {v}}; else 0 (and 0 if
 *       {@code N} is everything). As every index below v lies in {@code N}, hence in sigma,
 *       {@code eps(v, sigma - v) = (-1)^v}.
 * </ul>
 * They satisfy {@code delta h + h delta = 1 - iota pi}, {@code h iota = 0}, {@code pi h = 0},
 * {@code h h = 0}. On the tensor product (Koszul signs, {@code deg} = Cech degree of a factor):
 * {@code Pi = (x) pi_r}, {@code iota = (x) iota_r} and
 * {@code H = sum_r (-1)^{deg_1 + ... + deg_{r-1}} (iota pi)_1 (x) ... (x) (iota pi)_{r-1} (x) h_r (x) 1 ... 1}.
 *
 * <p>A factor in the state {@link CellTerm#LIFTED} stands for {@code sum_i e_i x^b}; on it
 * {@code h = 0}, {@code iota pi = 1}, {@code delta = 0}, so it never needs expanding.
 *
 * <p>Not thread-safe: owns scratch space.
 */
final class CechModel {
    private final CellLayout layout;
    private final CellTerm scratch;
    private final long[] buffer;

    CechModel(CellLayout layout) {
        this.layout = layout;
        this.scratch = layout.newTerm();
        this.buffer = new long[layout.stride()];
    }

    CellLayout layout() {
        return layout;
    }

    /** Cech degree {@code sum_r (|sigma_r| - 1)}. */
    int degree(CellTerm t) {
        int d = 0;
        for (int r = 0; r < t.sigma.length; r++) {
            d += factorDegree(t.sigma[r]);
        }
        return d;
    }

    /** Bitmask of the coordinates of factor r with a negative exponent. */
    int negatives(CellTerm t, int r) {
        int off = layout.offset(r);
        int mask = 0;
        for (int i = 0; i < layout.size(r); i++) {
            if (t.exp[off + i] < 0) {
                mask |= 1 << i;
            }
        }
        return mask;
    }

    /** Adds {@code coefficient * H(t)} to {@code out}. */
    void addHomotopy(CellTerm t, long coefficient, Cochain out) {
        CellTerm s = scratch;
        s.copyFrom(t);
        boolean negative = false;
        for (int r = 0; r < s.sigma.length; r++) {
            int sigma = s.sigma[r];
            if (sigma != CellTerm.LIFTED) {
                int full = (1 << layout.size(r)) - 1;
                int neg = negatives(s, r);
                if (neg != full) {
                    int v = Integer.numberOfTrailingZeros(~neg);
                    int bit = 1 << v;
                    if ((sigma & bit) != 0 && sigma != bit) {
                        s.sigma[r] = sigma & ~bit;
                        layout.pack(s, buffer, 0);
                        boolean flip = negative ^ ((v & 1) == 1);
                        out.add(buffer, 0, flip ? ModP.neg(coefficient) : coefficient);
                        s.sigma[r] = sigma;
                    }
                }
                if (!retractFactor(s, r)) {
                    return;
                }
            }
            negative ^= (factorDegree(s.sigma[r]) & 1) == 1;
        }
    }

    /** Adds {@code coefficient * delta_C(t)} to {@code out} (the Cech differential, Koszul signs). */
    void addDifferential(CellTerm t, long coefficient, Cochain out) {
        CellTerm s = scratch;
        s.copyFrom(t);
        boolean negative = false;
        for (int r = 0; r < s.sigma.length; r++) {
            int sigma = s.sigma[r];
            if (sigma != CellTerm.LIFTED) {
                for (int j = 0; j < layout.size(r); j++) {
                    int bit = 1 << j;
                    if ((sigma & bit) == 0) {
                        s.sigma[r] = sigma | bit;
                        layout.pack(s, buffer, 0);
                        boolean flip = negative ^ ((Integer.bitCount(sigma & (bit - 1)) & 1) == 1);
                        out.add(buffer, 0, flip ? ModP.neg(coefficient) : coefficient);
                    }
                }
                s.sigma[r] = sigma;
            }
            negative ^= (factorDegree(sigma) & 1) == 1;
        }
    }

    /**
     * Applies {@code iota pi} factor by factor in place: on success every factor is in Bott form
     * ({@link CellTerm#LIFTED} with non-negative exponents, or {@code sigma = all} with all exponents
     * negative) and {@code t} is the representative of the Bott vector {@code Pi(t)}; returns false
     * iff {@code Pi(t) = 0} (then t is left partly normalised).
     */
    boolean toBottForm(CellTerm t) {
        for (int r = 0; r < t.sigma.length; r++) {
            if (t.sigma[r] != CellTerm.LIFTED && !retractFactor(t, r)) {
                return false;
            }
        }
        return true;
    }

    /** Bitmask of the factors in the top-degree (inverse monomial) state; t must be in Bott form. */
    static int bottType(CellTerm t) {
        int type = 0;
        for (int r = 0; r < t.sigma.length; r++) {
            if (t.sigma[r] != CellTerm.LIFTED) {
                type |= 1 << r;
            }
        }
        return type;
    }

    /** {@code iota pi} on factor r of a real cell, in place; false iff it is zero. */
    private boolean retractFactor(CellTerm t, int r) {
        int sigma = t.sigma[r];
        int neg = negatives(t, r);
        if (neg == 0 && sigma == 1) {
            t.sigma[r] = CellTerm.LIFTED;
            return true;
        }
        int full = (1 << layout.size(r)) - 1;
        return neg == full && sigma == full;
    }

    private static int factorDegree(int sigma) {
        return sigma == CellTerm.LIFTED ? 0 : Integer.bitCount(sigma) - 1;
    }
}
