package org.winnow.geometry.invariants;

import java.util.ArrayList;
import java.util.List;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * Hyperplane-column reduction (rule R1). A column whose only nonzero entry is a 1 in row r is a
 * linear form on {@code P^{n_r}}: the complete intersection lies in a hyperplane {@code P^{n_r - 1}}.
 * Deleting the column and lowering {@code n_r} by one describes the same variety, so every invariant
 * is unchanged and the Calabi-Yau condition is preserved. A row whose dimension drops to 0 is a
 * point factor; its remaining entries only multiply polynomials by a nowhere-vanishing power of the
 * single coordinate, so the row is deleted.
 *
 * <p>The last column is never removed: a matrix without equations (the ambient space itself) is not
 * a configuration matrix, so {@code 4:1} stays as it is.
 */
public final class Reduction {
    private Reduction() {}

    /**
     * Applies R1 until no hyperplane column is left (or one column is left); returns {@code c}
     * itself when nothing applies. Columns are kept in their order, rows too.
     *
     * @throws IllegalArgumentException if reduction deletes every row while columns remain: those
     *     columns are then nonzero constants and the generic variety is empty
     */
    public static Configuration reduce(Configuration c) {
        if (c.cols() < 2 || findHyperplaneColumn(c) < 0) {
            return c;
        }
        List<Integer> n = new ArrayList<>();
        List<List<Integer>> q = new ArrayList<>();
        for (int r = 0; r < c.rows(); r++) {
            n.add(c.n(r));
            List<Integer> row = new ArrayList<>();
            for (int j = 0; j < c.cols(); j++) {
                row.add(c.q(r, j));
            }
            q.add(row);
        }
        while (q.get(0).size() >= 2) {
            int col = findHyperplaneColumn(n, q);
            if (col < 0) {
                break;
            }
            int r = rowOfSingleEntry(q, col);
            for (List<Integer> row : q) {
                row.remove(col);
            }
            n.set(r, n.get(r) - 1);
            if (n.get(r) == 0) {
                n.remove(r);
                q.remove(r);
            }
            Checks.requireArgument(!n.isEmpty(),
                    "%s reduces to equations on a point: the generic complete intersection is empty", c.toText());
        }
        int[] dims = n.stream().mapToInt(Integer::intValue).toArray();
        int[][] degrees = new int[dims.length][];
        for (int r = 0; r < dims.length; r++) {
            degrees[r] = q.get(r).stream().mapToInt(Integer::intValue).toArray();
        }
        return Configuration.of(dims, degrees);
    }

    /** Index of the first hyperplane column of {@code c}, or -1. */
    public static int findHyperplaneColumn(Configuration c) {
        for (int j = 0; j < c.cols(); j++) {
            int nonzero = 0;
            int value = 0;
            for (int r = 0; r < c.rows(); r++) {
                if (c.q(r, j) != 0) {
                    nonzero++;
                    value = c.q(r, j);
                }
            }
            if (nonzero == 1 && value == 1) {
                return j;
            }
        }
        return -1;
    }

    private static int findHyperplaneColumn(List<Integer> n, List<List<Integer>> q) {
        int cols = q.get(0).size();
        for (int j = 0; j < cols; j++) {
            int nonzero = 0;
            int value = 0;
            for (List<Integer> row : q) {
                if (row.get(j) != 0) {
                    nonzero++;
                    value = row.get(j);
                }
            }
            if (nonzero == 1 && value == 1) {
                return j;
            }
        }
        return -1;
    }

    private static int rowOfSingleEntry(List<List<Integer>> q, int col) {
        for (int r = 0; r < q.size(); r++) {
            if (q.get(r).get(col) != 0) {
                return r;
            }
        }
        throw new IllegalStateException("column " + col + " has no nonzero entry");
    }
}
