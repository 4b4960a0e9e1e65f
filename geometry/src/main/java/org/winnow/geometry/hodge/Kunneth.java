package org.winnow.geometry.hodge;

import java.util.List;
import org.winnow.geometry.Checks;

/**
 * Hodge diamonds of products of compact Kahler manifolds by the Kunneth formula
 * {@code h^{p,q}(X x Y) = sum_{a,b} h^{a,b}(X) h^{p-a,q-b}(Y)}: the Dolbeault cohomology of a product is the
 * tensor product of the factors' (see docs/hodge-coverage.md, Products). Hodge numbers of a product are
 * polynomial in the factors', so products are exact whenever the factors are.
 */
public final class Kunneth {
    private Kunneth() {}

    /** The diamond of {@code x * y}; dimensions add. */
    public static HodgeDiamond product(HodgeDiamond x, HodgeDiamond y) {
        int n = x.dimension() + y.dimension();
        long[][] h = new long[n + 1][n + 1];
        for (int a = 0; a <= x.dimension(); a++) {
            for (int b = 0; b <= x.dimension(); b++) {
                long hx = x.h(a, b);
                if (hx == 0) {
                    continue;
                }
                for (int c = 0; c <= y.dimension(); c++) {
                    for (int d = 0; d <= y.dimension(); d++) {
                        h[a + c][b + d] = Math.addExact(h[a + c][b + d], Math.multiplyExact(hx, y.h(c, d)));
                    }
                }
            }
        }
        return new HodgeDiamond(n, h);
    }

    /** The diamond of the product of all {@code factors} (a point for none). */
    public static HodgeDiamond product(List<HodgeDiamond> factors) {
        HodgeDiamond out = HodgeDiamond.point();
        for (HodgeDiamond f : factors) {
            out = product(out, f);
        }
        return out;
    }

    /**
     * The diamond of a connected Calabi-Yau factor of dimension 1, 2 or 3 with full holonomy, from its Hodge
     * numbers: an elliptic curve (no numbers needed), a K3 surface ({@code h11}, which must be 20) or a
     * three-fold ({@code h11}, {@code h21}).
     *
     * @param dimension 1, 2, 3 or 4
     * @param hodge     nothing for dimension 1; {@code h11} for 2; {@code h11, h21} for 3;
     *                  {@code h11, h21, h31, h22} for 4
     */
    public static HodgeDiamond calabiYauFactor(int dimension, long... hodge) {
        int expected = switch (dimension) {
            case 1 -> 0;
            case 2 -> 1;
            case 3 -> 2;
            case 4 -> 4;
            default -> -1;
        };
        Checks.requireArgument(expected >= 0, "a Calabi-Yau factor has dimension 1..4, got %s", dimension);
        Checks.requireArgument(hodge.length == expected, "a Calabi-Yau factor of dimension %s needs %s Hodge numbers, got %s",
                dimension, expected, hodge.length);
        return switch (dimension) {
            case 1 -> HodgeDiamond.ellipticCurve();
            case 2 -> {
                Checks.requireArgument(hodge[0] == 20, "a K3 surface has h11 = 20, got %s", hodge[0]);
                yield HodgeDiamond.k3();
            }
            case 3 -> HodgeDiamond.calabiYau3(hodge[0], hodge[1]);
            default -> HodgeDiamond.calabiYau4(hodge[0], hodge[1], hodge[2], hodge[3]);
        };
    }
}
