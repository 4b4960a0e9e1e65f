package org.winnow.geometry.cohomology.transfer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.linalg.ModP;

/**
 * The contraction identities of the Cech model (derived: they are the defining properties of a
 * strong deformation retract, checked here on random cells against the expanded cochains).
 */
class CechModelTest {
    private static final int CELLS = 400;

    @Test
    void homotopyContractsOntoBottRepresentatives() {
        SplittableRandom random = new SplittableRandom(11);
        for (int round = 0; round < 12; round++) {
            Fixture f = Fixture.random(random);
            int nontrivial = 0;
            for (int i = 0; i < CELLS; i++) {
                CellTerm c = f.randomCell(random);
                Cochain lhs = new Cochain(f.layout.stride());
                Cochain h = new Cochain(f.layout.stride());
                f.model.addHomotopy(c, 1, h);
                apply(f, h, (t, v, out) -> f.model.addDifferential(t, v, out), lhs);
                Cochain d = new Cochain(f.layout.stride());
                f.model.addDifferential(c, 1, d);
                apply(f, d, (t, v, out) -> f.model.addHomotopy(t, v, out), lhs);

                Cochain rhs = new Cochain(f.layout.stride());
                add(f, rhs, c, 1);
                CellTerm bott = f.layout.newTerm();
                bott.copyFrom(c);
                if (f.model.toBottForm(bott)) {
                    add(f, rhs, bott, ModP.P - 1);
                }
                Map<String, Long> left = f.expand(lhs);
                assertEquals(f.expand(rhs), left, () -> "delta H + H delta = 1 - iota Pi fails at " + f.describe(c));
                if (!left.isEmpty()) {
                    nontrivial++;
                }

                Cochain hh = new Cochain(f.layout.stride());
                apply(f, h, (t, v, out) -> f.model.addHomotopy(t, v, out), hh);
                assertTrue(f.expand(hh).isEmpty(), () -> "H H != 0 at " + f.describe(c));
                assertTrue(f.projected(h).isEmpty(), () -> "Pi H != 0 at " + f.describe(c));

                Cochain dd = new Cochain(f.layout.stride());
                apply(f, d, (t, v, out) -> f.model.addDifferential(t, v, out), dd);
                assertTrue(f.expand(dd).isEmpty(), () -> "delta delta != 0 at " + f.describe(c));
            }
            assertTrue(nontrivial > CELLS / 2, "the random cells should mostly be moved by the identity");
        }
    }

    @Test
    void homotopyVanishesOnBottRepresentatives() {
        SplittableRandom random = new SplittableRandom(12);
        for (int round = 0; round < 10; round++) {
            Fixture f = Fixture.random(random);
            for (int i = 0; i < CELLS; i++) {
                CellTerm c = f.randomBottRepresentative(random);
                Cochain h = new Cochain(f.layout.stride());
                f.model.addHomotopy(c, 1, h);
                assertTrue(f.expand(h).isEmpty(), () -> "H iota != 0 at " + f.describe(c));
                Cochain d = new Cochain(f.layout.stride());
                f.model.addDifferential(c, 1, d);
                assertTrue(f.expand(d).isEmpty(), () -> "iota of a class is not a cocycle at " + f.describe(c));
                CellTerm copy = f.layout.newTerm();
                copy.copyFrom(c);
                assertTrue(f.model.toBottForm(copy), "Pi iota must be the identity");
                assertTrue(Arrays.equals(copy.sigma, c.sigma) && Arrays.equals(copy.exp, c.exp));
            }
        }
    }

    interface Operator {
        void apply(CellTerm t, long coefficient, Cochain out);
    }

    private static void apply(Fixture f, Cochain in, Operator op, Cochain out) {
        CellTerm t = f.layout.newTerm();
        for (int e = 0; e < in.size(); e++) {
            if (in.value(e) != 0) {
                f.layout.unpack(in.keys(), e * in.stride(), t);
                op.apply(t, in.value(e), out);
            }
        }
    }

    private static void add(Fixture f, Cochain out, CellTerm t, long coefficient) {
        long[] key = new long[f.layout.stride()];
        f.layout.pack(t, key, 0);
        out.add(key, 0, coefficient);
    }

    /** A random ambient space with a layout wide enough for exponents in [-3, 3]. */
    private static final class Fixture {
        final CellLayout layout;
        final CechModel model;

        private Fixture(CellLayout layout) {
            this.layout = layout;
            this.model = new CechModel(layout);
        }

        static Fixture random(SplittableRandom random) {
            int m = 1 + random.nextInt(3);
            int[] n = new int[m];
            int[][] q = new int[m][1];
            for (int r = 0; r < m; r++) {
                n[r] = 1 + random.nextInt(3);
                q[r][0] = n[r] + 4;
            }
            Configuration x = Configuration.of(n, q);
            return new Fixture(CellLayout.of(x, new int[m]));
        }

        CellTerm randomCell(SplittableRandom random) {
            CellTerm t = layout.newTerm();
            for (int r = 0; r < layout.factors(); r++) {
                int size = layout.size(r);
                int neg = 0;
                int style = random.nextInt(4);
                for (int i = 0; i < size; i++) {
                    int e = switch (style) {
                        case 0 -> random.nextInt(0, 3);
                        case 1 -> random.nextInt(-3, 0);
                        default -> random.nextInt(-3, 3);
                    };
                    t.exp[layout.offset(r) + i] = e;
                    if (e < 0) {
                        neg |= 1 << i;
                    }
                }
                int sigma = neg | random.nextInt(1 << size);
                if (sigma == 0) {
                    sigma = 1 << random.nextInt(size);
                }
                t.sigma[r] = neg == 0 && random.nextInt(5) == 0 ? CellTerm.LIFTED : sigma;
            }
            return t;
        }

        CellTerm randomBottRepresentative(SplittableRandom random) {
            CellTerm t = layout.newTerm();
            for (int r = 0; r < layout.factors(); r++) {
                boolean top = random.nextBoolean();
                for (int i = 0; i < layout.size(r); i++) {
                    t.exp[layout.offset(r) + i] = top ? random.nextInt(-3, 0) : random.nextInt(0, 3);
                }
                t.sigma[r] = top ? (1 << layout.size(r)) - 1 : CellTerm.LIFTED;
            }
            return t;
        }

        /** The cochain as real Cech cells (lifted factors written out), zero coefficients dropped. */
        Map<String, Long> expand(Cochain c) {
            Map<String, Long> out = new HashMap<>();
            CellTerm t = layout.newTerm();
            for (int e = 0; e < c.size(); e++) {
                layout.unpack(c.keys(), e * c.stride(), t);
                expandInto(t, 0, c.value(e), out);
            }
            out.values().removeIf(v -> v == 0);
            return out;
        }

        private void expandInto(CellTerm t, int r, long coefficient, Map<String, Long> out) {
            if (r == layout.factors()) {
                out.merge(describe(t), coefficient, (a, b) -> (a + b) % ModP.P);
                return;
            }
            if (t.sigma[r] != CellTerm.LIFTED) {
                expandInto(t, r + 1, coefficient, out);
                return;
            }
            for (int i = 0; i < layout.size(r); i++) {
                t.sigma[r] = 1 << i;
                expandInto(t, r + 1, coefficient, out);
            }
            t.sigma[r] = CellTerm.LIFTED;
        }

        /** {@code Pi} of the cochain, keyed by the Bott representative, zero coefficients dropped. */
        Map<String, Long> projected(Cochain c) {
            Map<String, Long> out = new HashMap<>();
            CellTerm t = layout.newTerm();
            for (int e = 0; e < c.size(); e++) {
                layout.unpack(c.keys(), e * c.stride(), t);
                if (model.toBottForm(t)) {
                    out.merge(describe(t), c.value(e), (a, b) -> (a + b) % ModP.P);
                }
            }
            out.values().removeIf(v -> v == 0);
            return out;
        }

        String describe(CellTerm t) {
            return Arrays.toString(t.sigma) + Arrays.toString(t.exp);
        }
    }
}
