package org.winnow.scorer.reference;

import java.util.Objects;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;

/**
 * One exactly labelled configuration: its exact chi and its Hodge numbers, {@code {h11, h21}} for a
 * three-fold, {@code {h11, h21, h31, h22}} for a four-fold, {@code {h11}} otherwise.
 */
public record LabelledExample(Configuration config, long chi, int[] hodge) {
    public LabelledExample {
        Objects.requireNonNull(config, "config");
        Checks.requireArgument(hodge != null && hodge.length >= 1, "a label needs at least h11");
        hodge = hodge.clone();
    }

    public int h11() {
        return hodge[0];
    }

    @Override
    public int[] hodge() {
        return hodge.clone();
    }
}
