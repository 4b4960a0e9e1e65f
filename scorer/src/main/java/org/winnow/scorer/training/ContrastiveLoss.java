package org.winnow.scorer.training;

/** The margin contrastive loss of one pair and its gradient with respect to the first embedding. */
final class ContrastiveLoss {
    private ContrastiveLoss() {}

    /**
     * Returns the loss, {@code D^2} for a same-class pair and {@code max(0, margin - D)^2} otherwise,
     * and writes {@code dL/dx} to {@code grad}; {@code dL/dy} is its negative.
     */
    static double pair(double[] x, double[] y, boolean same, double margin, double[] grad) {
        double d2 = 0;
        for (int i = 0; i < x.length; i++) {
            double diff = x[i] - y[i];
            d2 += diff * diff;
        }
        if (same) {
            for (int i = 0; i < x.length; i++) {
                grad[i] = 2 * (x[i] - y[i]);
            }
            return d2;
        }
        double d = Math.sqrt(d2);
        if (d >= margin || d == 0) {
            // At D = 0 the direction is undefined; the pair is left to the other pairs to separate.
            java.util.Arrays.fill(grad, 0);
            return d >= margin ? 0 : margin * margin;
        }
        double f = -2 * (margin - d) / d;
        for (int i = 0; i < x.length; i++) {
            grad[i] = f * (x[i] - y[i]);
        }
        return (margin - d) * (margin - d);
    }
}
