package org.winnow.pipeline;

/**
 * The predicted Hodge numbers of one candidate, each with how it is known ({@link PredictedValue}); shared
 * by the prediction on the wire and the lines of survivors and rejects files, so that the plain accessors
 * mean the same everywhere.
 */
public interface HodgeValues {
    /** h^{1,1}; never null. */
    PredictedValue h11Value();

    /** h^{2,1}, or null when not determined. */
    PredictedValue h21Value();

    /** h^{3,1} (four-folds), or null when not determined. */
    PredictedValue h31Value();

    /** h^{2,2} (four-folds), or null when not determined. */
    PredictedValue h22Value();

    /** The predicted h11. */
    default int h11() {
        return Math.toIntExact(h11Value().value());
    }

    /** The confidence of h11: 1 when proved. */
    default double confidence() {
        return h11Value().confidence();
    }

    /** The predicted h21, or null. */
    default Integer h21() {
        return plain(h21Value());
    }

    /** The predicted h31, or null. */
    default Integer h31() {
        return plain(h31Value());
    }

    /** The predicted h22, or null. */
    default Integer h22() {
        return plain(h22Value());
    }

    /** The value of {@code invariant} (a predicted one), or null when not determined. */
    default PredictedValue value(Keepable invariant) {
        return switch (invariant) {
            case H11 -> h11Value();
            case H21 -> h21Value();
            case H31 -> h31Value();
            case H22 -> h22Value();
            default -> throw new IllegalArgumentException(invariant.label() + " is not predicted");
        };
    }

    private static Integer plain(PredictedValue v) {
        return v == null ? null : Math.toIntExact(v.value());
    }
}
