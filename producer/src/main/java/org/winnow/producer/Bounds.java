package org.winnow.producer;

import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * The search space: Calabi-Yau {@code dim}-folds with {@code minRows..maxRows} projective factors,
 * at most {@code maxCols} polynomials, factors {@code P^n} with {@code n <= maxN} and degrees at most
 * {@code maxEntry}.
 *
 * @param dim complex dimension d of the Calabi-Yau, 1..4
 * @param minRows fewest rows m (at least 1)
 * @param maxRows most rows m (at most {@link Configuration#MAX_ROWS})
 * @param maxCols most columns K (at most {@link Configuration#MAX_COLS})
 * @param maxN largest projective factor
 * @param maxEntry largest degree
 */
public record Bounds(int dim, int minRows, int maxRows, int maxCols, int maxN, int maxEntry) {
    /** Largest supported dimension. */
    public static final int MAX_DIM = 4;

    public Bounds {
        Checks.requireArgument(dim >= 1 && dim <= MAX_DIM, "dim must be in 1..%d, got %d", MAX_DIM, dim);
        Checks.requireArgument(minRows >= 1, "min-rows must be at least 1, got %d", minRows);
        Checks.requireArgument(maxRows >= 1, "max-rows must be at least 1, got %d", maxRows);
        Checks.requireArgument(maxRows <= Configuration.MAX_ROWS,
                "max-rows %d exceeds the supported %d", maxRows, Configuration.MAX_ROWS);
        Checks.requireArgument(minRows <= maxRows, "min-rows %d is above max-rows %d", minRows, maxRows);
        Checks.requireArgument(maxCols >= 1, "max-cols must be at least 1, got %d", maxCols);
        Checks.requireArgument(maxCols <= Configuration.MAX_COLS,
                "max-cols %d exceeds the supported %d", maxCols, Configuration.MAX_COLS);
        Checks.requireArgument(maxN >= 1, "max-n must be at least 1, got %d", maxN);
        Checks.requireArgument(maxN <= Configuration.MAX_N, "max-n %d exceeds the supported %d", maxN, Configuration.MAX_N);
        Checks.requireArgument(maxEntry >= 1, "max-entry must be at least 1, got %d", maxEntry);
    }

    /**
     * The bounds that lose nothing under the base rules: B2-B4 already force {@code E <= 2d}, hence
     * {@code n <= 2d+1}, {@code m <= 5d} and entries {@code <= n+1 <= 2d+2}. Only the row limit of
     * {@link Configuration} can cut: for d = 4 the base space reaches 20 rows, of which 16 are
     * supported.
     */
    public static Bounds complete(int dim) {
        Checks.requireArgument(dim >= 1 && dim <= MAX_DIM, "dim must be in 1..%d, got %d", MAX_DIM, dim);
        return new Bounds(dim, 1, Math.min(5 * dim, Configuration.MAX_ROWS), Configuration.MAX_COLS,
                2 * dim + 1, 2 * dim + 2);
    }

    /** The same bounds with other row limits. */
    public Bounds withRows(int min, int max) {
        return new Bounds(dim, min, max, maxCols, maxN, maxEntry);
    }
}
