package org.winnow.scorer.rules;

import java.util.Arrays;
import java.util.Locale;
import java.util.stream.Collectors;
import org.winnow.pipeline.Reason;

/** The invariants a keep rule may name, and whether the scorer knows them exactly or by prediction. */
public enum Invariant {
    H11(false, Reason.PREDICTED_H11_OUT_OF_RANGE),
    H21(false, Reason.PREDICTED_H21_OUT_OF_RANGE),
    CHI(true, Reason.EXACT_CHI_OUT_OF_RANGE),
    ROWS(true, Reason.EXACT_ROWS_OUT_OF_RANGE),
    COLS(true, Reason.EXACT_COLS_OUT_OF_RANGE),
    DIM(true, Reason.EXACT_DIM_OUT_OF_RANGE),
    BLOCKS(true, Reason.EXACT_BLOCKS_OUT_OF_RANGE);

    private final boolean exact;
    private final Reason rejection;

    Invariant(boolean exact, Reason rejection) {
        this.exact = exact;
        this.rejection = rejection;
    }

    /** True iff the scorer computes it exactly; false iff it comes from the model. */
    public boolean exact() {
        return exact;
    }

    /** The reason code of a rejection on this invariant. */
    public Reason rejection() {
        return rejection;
    }

    /** The name used in rules, lower case. */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The invariant called {@code label}, or a {@link RuleException} naming the rule. */
    static Invariant ofLabel(String label, String rule) {
        for (Invariant i : values()) {
            if (i.label().equals(label.trim().toLowerCase(Locale.ROOT))) {
                return i;
            }
        }
        throw new RuleException(String.format("rule '%s': unknown invariant '%s' (known: %s)", rule, label.trim(),
                Arrays.stream(values()).map(Invariant::label).collect(Collectors.joining(", "))));
    }
}
