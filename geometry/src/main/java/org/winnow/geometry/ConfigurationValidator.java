package org.winnow.geometry;

import java.util.Optional;

/**
 * The mathematical checks that a shape-valid {@link Configuration} must pass before Calabi-Yau work:
 * no zero column, the Calabi-Yau condition row by row, and a dimension in the supported range.
 * Each failure names the offending row, column or value.
 */
public final class ConfigurationValidator {
    /** Smallest supported dimension of the complete intersection. */
    public static final int MIN_DIM = 1;
    /** Largest supported dimension of the complete intersection. */
    public static final int MAX_DIM = 4;

    private ConfigurationValidator() {}

    /** The first reason the configuration is unfit for Calabi-Yau work, or empty when it is fit. */
    public static Optional<String> problemForCalabiYau(Configuration c) {
        for (int j = 0; j < c.cols(); j++) {
            if (c.colSum(j) == 0) {
                return Optional.of("zero column " + (j + 1) + " (a constant polynomial)");
            }
        }
        for (int r = 0; r < c.rows(); r++) {
            int sum = c.rowSum(r);
            if (sum != c.n(r) + 1) {
                return Optional.of(String.format(
                        "not Calabi-Yau: row %d (P^%d) has degree sum %d, expected %d", r + 1, c.n(r), sum, c.n(r) + 1));
            }
        }
        int d = c.dimension();
        if (d < MIN_DIM || d > MAX_DIM) {
            return Optional.of(String.format("dimension out of range: sum n - K = %d, supported %d..%d", d, MIN_DIM, MAX_DIM));
        }
        return Optional.empty();
    }

    /**
     * Throws {@link IllegalArgumentException} with the reason when the configuration is unfit for
     * Calabi-Yau work; returns it unchanged otherwise.
     */
    public static Configuration requireCalabiYau(Configuration c) {
        problemForCalabiYau(c).ifPresent(p -> {
            throw new IllegalArgumentException(p);
        });
        return c;
    }
}
