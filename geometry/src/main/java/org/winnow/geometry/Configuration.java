package org.winnow.geometry;

import java.util.Arrays;
import org.winnow.geometry.canonical.CanonicalForm;

/**
 * A configuration matrix: the ambient {@code P^{n_1} x ... x P^{n_m}} and the multi-degrees of K
 * polynomials, {@code q[r][j]} being the degree of polynomial j in the coordinates of factor r.
 *
 * <p>Immutable; the arrays are copied in and out. Construction checks only the shape (m >= 1,
 * K >= 1, rectangular, {@code n_r >= 1}, {@code q >= 0}, sizes within {@link #MAX_ROWS} by
 * {@link #MAX_COLS}); the Calabi-Yau condition and the other mathematical conditions are checked by
 * {@link ConfigurationValidator}, because non-Calabi-Yau input is legitimate for some invariants.
 */
public final class Configuration {
    /** Largest number of rows (projective factors) supported throughout the project. */
    public static final int MAX_ROWS = 16;
    /** Largest number of columns (polynomials) supported throughout the project. */
    public static final int MAX_COLS = 24;
    /** Largest dimension of one projective factor; keeps packed exponent vectors in 5 bits a row. */
    public static final int MAX_N = 31;

    private final int[] n;
    private final int[][] q;
    private final int hash;

    private Configuration(int[] n, int[][] q) {
        this.n = n;
        this.q = q;
        this.hash = 31 * Arrays.hashCode(n) + Arrays.deepHashCode(q);
    }

    /**
     * Builds a configuration from the ambient dimensions and the degree matrix (rows by columns).
     *
     * @throws IllegalArgumentException naming the offending value if the shape is not valid
     */
    public static Configuration of(int[] n, int[][] q) {
        Checks.requireArgument(n != null && q != null, "n and q must not be null");
        int m = n.length;
        Checks.requireArgument(m >= 1, "a configuration needs at least one row");
        Checks.requireArgument(m <= MAX_ROWS, "too large: %d rows, at most %d are supported", m, MAX_ROWS);
        Checks.requireArgument(q.length == m, "%d dimensions but %d degree rows", m, q.length);
        int k = q[0].length;
        Checks.requireArgument(k >= 1, "a configuration needs at least one column");
        Checks.requireArgument(k <= MAX_COLS, "too large: %d columns, at most %d are supported", k, MAX_COLS);
        int[][] copy = new int[m][];
        for (int r = 0; r < m; r++) {
            Checks.requireArgument(n[r] >= 1, "row %d: the dimension must be at least 1, got %d", r + 1, n[r]);
            Checks.requireArgument(n[r] <= MAX_N, "row %d: the dimension %d exceeds the supported %d", r + 1, n[r], MAX_N);
            Checks.requireArgument(q[r].length == k, "ragged rows: row 1 has %d entries but row %d has %d",
                    k, r + 1, q[r].length);
            for (int j = 0; j < k; j++) {
                Checks.requireArgument(q[r][j] >= 0, "negative entry %d in row %d, column %d", q[r][j], r + 1, j + 1);
            }
            copy[r] = q[r].clone();
        }
        return new Configuration(n.clone(), copy);
    }

    /** Parses one configuration in the project's text format; see {@link ConfigurationText}. */
    public static Configuration parse(String text) {
        return ConfigurationText.parse(text);
    }

    /** Number of rows m (projective factors). */
    public int rows() {
        return n.length;
    }

    /** Number of columns K (polynomials). */
    public int cols() {
        return q[0].length;
    }

    /** Dimension of factor r (0-based). */
    public int n(int r) {
        return n[r];
    }

    /** Degree of polynomial j in factor r (both 0-based). */
    public int q(int r, int j) {
        return q[r][j];
    }

    /** A copy of the ambient dimensions. */
    public int[] dims() {
        return n.clone();
    }

    /** A copy of the degree matrix, rows by columns. */
    public int[][] degrees() {
        int[][] copy = new int[q.length][];
        for (int r = 0; r < q.length; r++) {
            copy[r] = q[r].clone();
        }
        return copy;
    }

    /** Sum of the ambient dimensions. */
    public int ambientDimension() {
        int s = 0;
        for (int v : n) {
            s += v;
        }
        return s;
    }

    /** Complex dimension of the generic complete intersection: {@code sum n - K} (may be negative). */
    public int dimension() {
        return ambientDimension() - cols();
    }

    /** Sum of row r. */
    public int rowSum(int r) {
        int s = 0;
        for (int v : q[r]) {
            s += v;
        }
        return s;
    }

    /** Sum of column j. */
    public int colSum(int j) {
        int s = 0;
        for (int[] row : q) {
            s += row[j];
        }
        return s;
    }

    /** True iff every row sums to {@code n_r + 1}, i.e. the first Chern class vanishes. */
    public boolean isCalabiYau() {
        for (int r = 0; r < n.length; r++) {
            if (rowSum(r) != n[r] + 1) {
                return false;
            }
        }
        return true;
    }

    /** The text form, rows {@code n:d1,...,dK} joined by {@code /}, in this matrix's own order. */
    public String toText() {
        return ConfigurationText.format(this);
    }

    /** The canonical representative of this matrix's permutation class; see {@link CanonicalForm}. */
    public Configuration canonical() {
        return CanonicalForm.canonical(this);
    }

    /** The text of {@link #canonical()}: the pipeline's byte-exact dedup key. */
    public String canonicalText() {
        return CanonicalForm.canonicalText(this);
    }

    @Override
    public boolean equals(Object o) {
        if (this == o) {
            return true;
        }
        if (!(o instanceof Configuration)) {
            return false;
        }
        Configuration other = (Configuration) o;
        return hash == other.hash && Arrays.equals(n, other.n) && Arrays.deepEquals(q, other.q);
    }

    @Override
    public int hashCode() {
        return hash;
    }

    @Override
    public String toString() {
        return toText();
    }
}
