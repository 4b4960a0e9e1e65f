package org.winnow.geometry.hodge;

import java.util.Arrays;
import org.winnow.geometry.Checks;

/**
 * The Hodge numbers {@code h^{p,q}} ({@code 0 <= p, q <= dimension}) of a compact Kahler manifold.
 *
 * <p>The constructor checks what every compact Kahler manifold satisfies: non-negative entries, complex
 * conjugation {@code h^{p,q} = h^{q,p}} and Serre duality {@code h^{p,q} = h^{n-p,n-q}}. It does not
 * check that the manifold is connected or Calabi-Yau; the factories below build those diamonds.
 *
 * @param dimension the complex dimension n (0 for a point)
 * @param numbers   {@code numbers[p][q] = h^{p,q}}, an (n+1) x (n+1) array; copied in and out
 */
public record HodgeDiamond(int dimension, long[][] numbers) {
    public HodgeDiamond {
        Checks.requireArgument(dimension >= 0, "the dimension must not be negative: %s", dimension);
        Checks.requireArgument(numbers.length == dimension + 1, "expected %s rows of Hodge numbers, got %s",
                dimension + 1, numbers.length);
        long[][] copy = new long[dimension + 1][];
        for (int p = 0; p <= dimension; p++) {
            Checks.requireArgument(numbers[p].length == dimension + 1, "row %s of the diamond has %s entries, expected %s",
                    p, numbers[p].length, dimension + 1);
            copy[p] = numbers[p].clone();
        }
        for (int p = 0; p <= dimension; p++) {
            for (int q = 0; q <= dimension; q++) {
                long h = copy[p][q];
                Checks.requireArgument(h >= 0, "h^{%s,%s} must not be negative: %s", p, q, h);
                Checks.requireArgument(h == copy[q][p], "h^{%s,%s} = %s but h^{%s,%s} = %s (complex conjugation)", p, q, h,
                        q, p, copy[q][p]);
                Checks.requireArgument(h == copy[dimension - p][dimension - q],
                        "h^{%s,%s} = %s but h^{%s,%s} = %s (Serre duality)", p, q, h, dimension - p, dimension - q,
                        copy[dimension - p][dimension - q]);
            }
        }
        numbers = copy;
    }

    /** A copy of the numbers. */
    @Override
    public long[][] numbers() {
        long[][] copy = new long[dimension + 1][];
        for (int p = 0; p <= dimension; p++) {
            copy[p] = numbers[p].clone();
        }
        return copy;
    }

    /** {@code h^{p,q}}, 0 outside the diamond. */
    public long h(int p, int q) {
        if (p < 0 || q < 0 || p > dimension || q > dimension) {
            return 0;
        }
        return numbers[p][q];
    }

    /** The Betti number {@code b_k = sum_{p+q=k} h^{p,q}}. */
    public long betti(int k) {
        long b = 0;
        for (int p = 0; p <= k; p++) {
            b += h(p, k - p);
        }
        return b;
    }

    /** The Euler characteristic {@code sum_k (-1)^k b_k}. */
    public long euler() {
        long chi = 0;
        for (int k = 0; k <= 2 * dimension; k++) {
            chi += (k % 2 == 0 ? 1 : -1) * betti(k);
        }
        return chi;
    }

    /** A point: {@code h^{0,0} = 1}, the unit of the product. */
    public static HodgeDiamond point() {
        return new HodgeDiamond(0, new long[][] {{1}});
    }

    /** An elliptic curve (a connected Calabi-Yau of dimension 1): every {@code h^{p,q}} is 1. */
    public static HodgeDiamond ellipticCurve() {
        return new HodgeDiamond(1, new long[][] {{1, 1}, {1, 1}});
    }

    /**
     * A K3 surface (a connected Calabi-Yau surface with {@code h^{1,0} = 0}): {@code h^{0,0} = h^{2,0} = 1},
     * {@code h^{1,1} = 20}.
     */
    public static HodgeDiamond k3() {
        return calabiYau2(20);
    }

    /**
     * The diamond of a connected surface with trivial canonical bundle and {@code h^{1,0} = 0} with the given
     * {@code h^{1,1}}; only 20 is a K3 surface, other values are accepted so that a wrong input shows in the
     * result instead of being replaced.
     */
    public static HodgeDiamond calabiYau2(long h11) {
        return new HodgeDiamond(2, new long[][] {{1, 0, 1}, {0, h11, 0}, {1, 0, 1}});
    }

    /** A Calabi-Yau three-fold with holonomy SU(3): {@code h^{p,0} = 0} for p = 1, 2. */
    public static HodgeDiamond calabiYau3(long h11, long h21) {
        return new HodgeDiamond(3, new long[][] {
            {1, 0, 0, 1},
            {0, h11, h21, 0},
            {0, h21, h11, 0},
            {1, 0, 0, 1}});
    }

    /** A Calabi-Yau four-fold with holonomy SU(4): {@code h^{p,0} = 0} for p = 1, 2, 3. */
    public static HodgeDiamond calabiYau4(long h11, long h21, long h31, long h22) {
        return new HodgeDiamond(4, new long[][] {
            {1, 0, 0, 0, 1},
            {0, h11, h21, h31, 0},
            {0, h21, h22, h21, 0},
            {0, h31, h21, h11, 0},
            {1, 0, 0, 0, 1}});
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof HodgeDiamond d && d.dimension == dimension && Arrays.deepEquals(d.numbers, numbers);
    }

    @Override
    public int hashCode() {
        return 31 * dimension + Arrays.deepHashCode(numbers);
    }

    /** Rows {@code p = 0..n} of {@code h^{p,q}}, e.g. {@code [[1, 1], [1, 1]]} for an elliptic curve. */
    @Override
    public String toString() {
        return Arrays.deepToString(numbers);
    }
}
