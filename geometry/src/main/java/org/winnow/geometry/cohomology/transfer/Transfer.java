package org.winnow.geometry.cohomology.transfer;

import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.BottBasis;
import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.Polynomial;
import org.winnow.geometry.linalg.ModP;
import org.winnow.geometry.linalg.ModPMatrix;

/**
 * The perturbation series on the Koszul x Cech double complex for one cell layout.
 *
 * <p>Sign conventions. The total differential is {@code D = t + (-1)^p delta_C} (t the Koszul
 * differential {@code e_S -> sum_i (-1)^{i-1} f_{j_i} e_{S - j_i}}); the column differential
 * {@code (-1)^p delta_C} is contracted by {@code H' = (-1)^p H} with
 * {@code d H' + H' d = 1 - iota Pi}. The perturbation lemma for a strong deformation retract is
 * stated for a homotopy with {@code d h + h d = iota Pi - 1}, so we use {@code h = -H' = (-1)^{p+1} H},
 * and then, with no further signs,
 * <pre>
 *   d_inf    = sum_k Pi t (h t)^k iota,
 *   iota_inf = sum_k (h t)^k iota,
 *   Pi_inf   = sum_k Pi (t h)^k.
 * </pre>
 * (The design writes the series with {@code H'}; that changes the k-th term by {@code (-1)^k}, i.e.
 * conjugates {@code d_inf} by the diagonal signs {@code (-1)^p} on V and {@code iota_inf},
 * {@code Pi_inf} by the column signs: ranks, kernels and transferred maps agree up to that change of
 * basis, so either form gives the same cohomology and the same rho. The form here is the one for
 * which {@code iota_inf} is literally a chain map into {@code (C, D)}.)
 *
 * <p>Not thread-safe: owns scratch cochains.
 */
final class Transfer {
    private final Configuration x;
    private final CellLayout layout;
    private final CechModel model;
    private final int stride;
    private final long[][][] fMonomials;
    private final long[][] fCoefficients;
    private final int[][][] fExponents;
    private final CellTerm term;
    private final CellTerm product;
    private final long[] buffer;
    private final int[] total;
    private final int[] deficit;
    private final int[] room;

    Transfer(Configuration x, DefiningPolynomials f, CellLayout layout) {
        this.x = x;
        this.layout = layout;
        this.model = new CechModel(layout);
        this.stride = layout.stride();
        this.fMonomials = new long[x.cols()][][];
        this.fCoefficients = new long[x.cols()][];
        this.fExponents = new int[x.cols()][][];
        for (int j = 0; j < x.cols(); j++) {
            Polynomial p = f.polynomial(j);
            fMonomials[j] = packMonomials(p);
            fCoefficients[j] = coefficients(p);
            fExponents[j] = new int[p.terms()][];
            for (int m = 0; m < p.terms(); m++) {
                fExponents[j][m] = p.monomial(m);
            }
        }
        this.term = layout.newTerm();
        this.product = layout.newTerm();
        this.buffer = new long[stride];
        this.total = new int[x.rows()];
        this.deficit = new int[x.rows()];
        this.room = new int[x.rows()];
    }

    CellLayout layout() {
        return layout;
    }

    CechModel model() {
        return model;
    }

    /** A polynomial with its monomials packed for this layout, for {@link #multiply}. */
    record PackedPolynomial(long[][] monomials, long[] coefficients) {}

    PackedPolynomial pack(Polynomial p) {
        return new PackedPolynomial(packMonomials(p), coefficients(p));
    }

    /** The matrix of {@code d_inf : V^t -> V^{t+1}} of the page (rows {@code V^{t+1}}). */
    ModPMatrix differential(BottPage page, int t) {
        int rows = page.dimension(t + 1);
        int cols = page.dimension(t);
        ModPMatrix out = new ModPMatrix(rows, cols);
        if (rows == 0 || cols == 0) {
            return out;
        }
        Reach reach = Reach.of(t + 1, page);
        Cochain current = new Cochain(stride);
        Cochain next = new Cochain(stride);
        long[] column = new long[rows];
        for (BottPage.Summand s : page.summands(t)) {
            for (int i = 0; i < s.basis().size(); i++) {
                java.util.Arrays.fill(column, 0);
                current.clear();
                addBottVector(s, i, 1, current);
                while (current.size() > 0) {
                    next.clear();
                    koszul(current, next, reach);
                    projectInto(next, page, column);
                    current.clear();
                    homotopy(next, current, reach, true);
                }
                int col = s.offset() + i;
                for (int r = 0; r < rows; r++) {
                    if (column[r] != 0) {
                        out.set(r, col, column[r]);
                    }
                }
            }
        }
        return out;
    }

    /**
     * {@code iota_inf} of basis vector {@code index} of summand {@code s}, keeping only the terms that
     * can still reach a summand of {@code targets} (terms of {@code targets} are checked with
     * {@code S'' subset of S}, the continuation with proper subsets).
     */
    Cochain lift(BottPage.Summand s, int index, Reach targets) {
        Cochain out = new Cochain(stride);
        Cochain current = new Cochain(stride);
        Cochain next = new Cochain(stride);
        addBottVector(s, index, 1, current);
        while (current.size() > 0) {
            addReaching(current, out, targets);
            next.clear();
            koszul(current, next, targets);
            current.clear();
            homotopy(next, current, targets, false);
        }
        return out;
    }

    /** {@code g * c} for a packed polynomial g (column-preserving chain map, no signs). */
    Cochain multiply(Cochain c, PackedPolynomial g) {
        Cochain out = new Cochain(stride);
        long[] keys = c.keys();
        for (int e = 0; e < c.size(); e++) {
            long v = c.value(e);
            if (v == 0) {
                continue;
            }
            int base = e * stride;
            for (int m = 0; m < g.monomials().length; m++) {
                long[] mono = g.monomials()[m];
                for (int w = 0; w < stride; w++) {
                    buffer[w] = keys[base + w] + mono[w];
                }
                out.add(buffer, 0, ModP.mul(v, g.coefficients()[m]));
            }
        }
        return out;
    }

    /** {@code Pi_inf(c)} as a vector of {@code V^t} of the page, where c has total degree t. */
    long[] project(Cochain c, BottPage page, int t) {
        long[] vector = new long[page.dimension(t)];
        Reach reach = Reach.of(t, page);
        projectInto(c, page, vector);
        Cochain current = c;
        Cochain after = new Cochain(stride);
        Cochain next = new Cochain(stride);
        while (true) {
            after.clear();
            homotopy(current, after, reach, true);
            if (after.size() == 0) {
                return vector;
            }
            next.clear();
            koszul(after, next, reach);
            projectInto(next, page, vector);
            Cochain swap = current == c ? new Cochain(stride) : current;
            current = next;
            next = swap;
        }
    }

    /** Adds {@code coefficient * iota(v)} for basis vector {@code index} of summand {@code s}. */
    void addBottVector(BottPage.Summand s, int index, long coefficient, Cochain out) {
        BottBasis basis = s.basis();
        int[] e = basis.exponents(index);
        term.subset = s.subset();
        System.arraycopy(e, 0, term.exp, 0, e.length);
        int type = basis.bottMask();
        for (int r = 0; r < layout.factors(); r++) {
            term.sigma[r] = (type & (1 << r)) != 0 ? (1 << layout.size(r)) - 1 : CellTerm.LIFTED;
        }
        layout.pack(term, buffer, 0);
        out.add(buffer, 0, coefficient);
    }

    /**
     * Adds the Koszul differential t of {@code in} to {@code out}, keeping only products that can
     * still reach a target of {@code reach} (checked before insertion: most products cannot, and
     * inserting them is the dominant cost otherwise).
     */
    void koszul(Cochain in, Cochain out, Reach reach) {
        long[] keys = in.keys();
        int coordinates = layout.coordinates();
        for (int e = 0; e < in.size(); e++) {
            long v = in.value(e);
            if (v == 0) {
                continue;
            }
            int base = e * stride;
            layout.unpack(keys, base, term);
            int subset = term.subset;
            product.copyFrom(term);
            for (int rest = subset; rest != 0; rest &= rest - 1) {
                int j = Integer.numberOfTrailingZeros(rest);
                boolean odd = (Integer.bitCount(subset & ((1 << j) - 1)) & 1) == 1;
                product.subset = subset & ~(1 << j);
                long[][] monos = fMonomials[j];
                int[][] exps = fExponents[j];
                long[] coeffs = fCoefficients[j];
                for (int m = 0; m < monos.length; m++) {
                    int[] c = exps[m];
                    for (int i = 0; i < coordinates; i++) {
                        product.exp[i] = term.exp[i] + c[i];
                    }
                    if (!reaches(product, reach, false)) {
                        continue;
                    }
                    long[] mono = monos[m];
                    for (int w = 0; w < stride; w++) {
                        buffer[w] = keys[base + w] + mono[w];
                    }
                    buffer[0] -= 1L << j;
                    long coefficient = ModP.mul(v, coeffs[m]);
                    out.add(buffer, 0, odd ? ModP.neg(coefficient) : coefficient);
                }
            }
        }
    }

    /** Adds {@code h(in)}, {@code h = (-1)^{p+1} H}, keeping terms that can still reach a target. */
    void homotopy(Cochain in, Cochain out, Reach reach, boolean strict) {
        long[] keys = in.keys();
        for (int e = 0; e < in.size(); e++) {
            long v = in.value(e);
            if (v == 0) {
                continue;
            }
            layout.unpack(keys, e * stride, term);
            if (!reaches(term, reach, strict)) {
                continue;
            }
            boolean even = (Integer.bitCount(term.subset) & 1) == 0;
            model.addHomotopy(term, even ? ModP.neg(v) : v, out);
        }
    }

    /** Adds {@code Pi(in)} to the vector of {@code V^t}. */
    void projectInto(Cochain in, BottPage page, long[] vector) {
        long[] keys = in.keys();
        for (int e = 0; e < in.size(); e++) {
            long v = in.value(e);
            if (v == 0) {
                continue;
            }
            layout.unpack(keys, e * stride, term);
            BottPage.Summand s = page.summand(term.subset);
            if (s == null || s.degree() != model.degree(term) || !model.toBottForm(term)) {
                continue;
            }
            int index = s.basis().indexOf(term.exp);
            if (index < 0) {
                throw new IllegalStateException("a Bott-form cell is not in the basis of its summand");
            }
            int at = s.offset() + index;
            vector[at] = ModP.add(vector[at], v);
        }
    }

    private void addReaching(Cochain in, Cochain out, Reach targets) {
        long[] keys = in.keys();
        for (int e = 0; e < in.size(); e++) {
            long v = in.value(e);
            if (v == 0) {
                continue;
            }
            layout.unpack(keys, e * stride, term);
            if (reaches(term, targets, false)) {
                out.add(keys, e * stride, v);
            }
        }
    }

    /** {@link Reach#reaches} for an unpacked term. */
    private boolean reaches(CellTerm term, Reach reach, boolean strict) {
        int top = 0;
        for (int r = 0; r < layout.factors(); r++) {
            int off = layout.offset(r);
            int sum = 0;
            int neg = 0;
            int slack = 0;
            boolean allNegative = true;
            for (int i = 0; i < layout.size(r); i++) {
                int e = term.exp[off + i];
                sum += e;
                if (e < 0) {
                    neg -= e;
                } else {
                    allNegative = false;
                }
                slack += -1 - e;
            }
            total[r] = sum;
            deficit[r] = neg;
            room[r] = slack;
            if (allNegative && term.sigma[r] == (1 << layout.size(r)) - 1) {
                top |= 1 << r;
            }
        }
        return reach.reaches(term.subset, top, total, deficit, room, strict);
    }

    private long[][] packMonomials(Polynomial p) {
        long[][] out = new long[p.terms()][];
        for (int m = 0; m < out.length; m++) {
            out[m] = layout.packMonomial(p.monomial(m));
        }
        return out;
    }

    private static long[] coefficients(Polynomial p) {
        long[] out = new long[p.terms()];
        for (int m = 0; m < out.length; m++) {
            out[m] = p.coefficient(m);
        }
        return out;
    }
}
