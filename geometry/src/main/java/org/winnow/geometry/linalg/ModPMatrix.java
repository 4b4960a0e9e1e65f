package org.winnow.geometry.linalg;

import java.util.Arrays;
import org.winnow.geometry.Checks;

/**
 * A dense matrix over F_p ({@link ModP#P}), stored row by row with entries in {@code [0, p)}.
 *
 * <p>Entries may be changed with {@link #set} while a matrix is being filled; every derived quantity
 * (rank, kernel, image, product) works on a copy and leaves this matrix untouched.
 *
 * <p>Elimination uses the row update {@code a + (p - c) b mod p} with one reduction per entry: with
 * reduced operands {@code (p - c) b < 2^62} and the sum stays below 2^63.
 */
public final class ModPMatrix {
    private final int rows;
    private final int cols;
    private final long[][] a;

    /** The zero matrix of the given shape (either dimension may be 0). */
    public ModPMatrix(int rows, int cols) {
        Checks.requireArgument(rows >= 0 && cols >= 0, "matrix shape must be nonnegative: %d x %d", rows, cols);
        this.rows = rows;
        this.cols = cols;
        this.a = new long[rows][cols];
    }

    private ModPMatrix(long[][] data, int cols) {
        this.rows = data.length;
        this.cols = cols;
        this.a = data;
    }

    /** A matrix from integer rows (any signed values, reduced mod p); all rows must have equal length. */
    public static ModPMatrix of(long[][] entries) {
        int c = entries.length == 0 ? 0 : entries[0].length;
        long[][] data = new long[entries.length][];
        for (int i = 0; i < entries.length; i++) {
            Checks.requireArgument(entries[i].length == c, "ragged matrix: row 0 has %d entries, row %d has %d",
                    c, i, entries[i].length);
            data[i] = new long[c];
            for (int j = 0; j < c; j++) {
                data[i][j] = ModP.reduce(entries[i][j]);
            }
        }
        return new ModPMatrix(data, c);
    }

    /** The identity of size n. */
    public static ModPMatrix identity(int n) {
        ModPMatrix id = new ModPMatrix(n, n);
        for (int i = 0; i < n; i++) {
            id.a[i][i] = 1;
        }
        return id;
    }

    public int rows() {
        return rows;
    }

    public int cols() {
        return cols;
    }

    /** Entry (i, j) as a residue. */
    public long get(int i, int j) {
        return a[i][j];
    }

    /** Sets entry (i, j) to the residue of {@code value}. */
    public void set(int i, int j, long value) {
        a[i][j] = ModP.reduce(value);
    }

    /** Adds the residue of {@code value} to entry (i, j). */
    public void add(int i, int j, long value) {
        a[i][j] = ModP.add(a[i][j], ModP.reduce(value));
    }

    /** True iff every entry is zero. */
    public boolean isZero() {
        for (long[] row : a) {
            for (long v : row) {
                if (v != 0) {
                    return false;
                }
            }
        }
        return true;
    }

    /** The product {@code this * other}. */
    public ModPMatrix multiply(ModPMatrix other) {
        Checks.requireArgument(cols == other.rows, "cannot multiply %d x %d by %d x %d", rows, cols, other.rows, other.cols);
        long[][] out = new long[rows][other.cols];
        for (int i = 0; i < rows; i++) {
            long[] ai = a[i];
            long[] oi = out[i];
            for (int l = 0; l < cols; l++) {
                long v = ai[l];
                if (v == 0) {
                    continue;
                }
                long[] bl = other.a[l];
                for (int j = 0; j < other.cols; j++) {
                    oi[j] = (oi[j] + v * bl[j]) % ModP.P;
                }
            }
        }
        return new ModPMatrix(out, other.cols);
    }

    /** The transpose. */
    public ModPMatrix transpose() {
        long[][] out = new long[cols][rows];
        for (int i = 0; i < rows; i++) {
            for (int j = 0; j < cols; j++) {
                out[j][i] = a[i][j];
            }
        }
        return new ModPMatrix(out, rows);
    }

    /** The horizontal concatenation {@code [left | right]}; the row counts must agree. */
    public static ModPMatrix hstack(ModPMatrix left, ModPMatrix right) {
        Checks.requireArgument(left.rows == right.rows, "cannot stack %d rows beside %d rows", left.rows, right.rows);
        long[][] out = new long[left.rows][left.cols + right.cols];
        for (int i = 0; i < left.rows; i++) {
            System.arraycopy(left.a[i], 0, out[i], 0, left.cols);
            System.arraycopy(right.a[i], 0, out[i], left.cols, right.cols);
        }
        return new ModPMatrix(out, left.cols + right.cols);
    }

    /** The vertical concatenation (this on top of {@code below}); the column counts must agree. */
    public ModPMatrix vstack(ModPMatrix below) {
        Checks.requireArgument(cols == below.cols, "cannot stack %d columns over %d columns", cols, below.cols);
        long[][] out = new long[rows + below.rows][];
        for (int i = 0; i < rows; i++) {
            out[i] = a[i].clone();
        }
        for (int i = 0; i < below.rows; i++) {
            out[rows + i] = below.a[i].clone();
        }
        return new ModPMatrix(out, cols);
    }

    /** The columns with the given indices, in that order. */
    public ModPMatrix columns(int[] indices) {
        long[][] out = new long[rows][indices.length];
        for (int i = 0; i < rows; i++) {
            for (int t = 0; t < indices.length; t++) {
                out[i][t] = a[i][indices[t]];
            }
        }
        return new ModPMatrix(out, indices.length);
    }

    /** The rank over F_p. */
    public int rank() {
        return eliminate(copy(), false).length;
    }

    /** The rank of {@code [left | right]} without building a new matrix first. */
    public static int rankOfStacked(ModPMatrix left, ModPMatrix right) {
        return hstack(left, right).rank();
    }

    /** A basis of the column space: the pivot columns of this matrix, as a {@code rows x rank} matrix. */
    public ModPMatrix imageBasis() {
        return columns(eliminate(copy(), false));
    }

    /**
     * A basis of the kernel {@code {x : A x = 0}} as the columns of a {@code cols x (cols - rank)}
     * matrix: one vector per free column of the reduced row echelon form.
     */
    public ModPMatrix kernelBasis() {
        long[][] r = copy();
        int[] pivots = eliminate(r, true);
        boolean[] isPivot = new boolean[cols];
        for (int pc : pivots) {
            isPivot[pc] = true;
        }
        int nullity = cols - pivots.length;
        long[][] out = new long[cols][nullity];
        int f = 0;
        for (int j = 0; j < cols; j++) {
            if (isPivot[j]) {
                continue;
            }
            out[j][f] = 1;
            for (int i = 0; i < pivots.length; i++) {
                out[pivots[i]][f] = ModP.neg(r[i][j]);
            }
            f++;
        }
        return new ModPMatrix(out, nullity);
    }

    private long[][] copy() {
        long[][] c = new long[rows][];
        for (int i = 0; i < rows; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }

    /**
     * Gaussian elimination in place; returns the pivot columns in order. With {@code reduced} the
     * result is the reduced row echelon form (pivots 1, zeros above them) in the first rank rows.
     */
    private int[] eliminate(long[][] m, boolean reduced) {
        int nr = m.length;
        int[] pivots = new int[Math.min(nr, cols)];
        int rank = 0;
        for (int c = 0; c < cols && rank < nr; c++) {
            int sel = -1;
            for (int i = rank; i < nr; i++) {
                if (m[i][c] != 0) {
                    sel = i;
                    break;
                }
            }
            if (sel < 0) {
                continue;
            }
            long[] tmp = m[sel];
            m[sel] = m[rank];
            m[rank] = tmp;
            long[] piv = m[rank];
            long inv = ModP.inv(piv[c]);
            for (int j = c; j < cols; j++) {
                piv[j] = ModP.mul(piv[j], inv);
            }
            int start = reduced ? 0 : rank + 1;
            for (int i = start; i < nr; i++) {
                if (i == rank) {
                    continue;
                }
                long[] row = m[i];
                long f = row[c];
                if (f == 0) {
                    continue;
                }
                long negF = ModP.P - f;
                for (int j = c; j < cols; j++) {
                    long pv = piv[j];
                    if (pv != 0) {
                        row[j] = (row[j] + negF * pv) % ModP.P;
                    }
                }
            }
            pivots[rank++] = c;
        }
        return Arrays.copyOf(pivots, rank);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ModPMatrix other && rows == other.rows && cols == other.cols && Arrays.deepEquals(a, other.a);
    }

    @Override
    public int hashCode() {
        return 31 * (31 * rows + cols) + Arrays.deepHashCode(a);
    }

    @Override
    public String toString() {
        return rows + "x" + cols + " mod " + ModP.P;
    }
}
