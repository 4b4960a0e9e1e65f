package org.winnow.pipeline;

import java.util.Arrays;
import java.util.EnumMap;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;

/**
 * The invariants a keep rule may name: the one vocabulary that the scorer's keep rules parse and that the
 * rejection {@link Reason}s derive from. Each is either computed exactly by the scorer or predicted by
 * the model.
 *
 * <p>A new keepable invariant is a constant here, its out-of-range constant in {@link Reason} (whose code
 * follows from this constant), and its value in the scorer; nothing else names it.
 */
public enum Keepable {
    H11(false),
    H21(false),
    H31(false),
    H22(false),
    CHI(true),
    ROWS(true),
    COLS(true),
    DIM(true),
    BLOCKS(true);

    private final boolean exact;

    Keepable(boolean exact) {
        this.exact = exact;
    }

    /** True iff the scorer computes it exactly; false iff it comes from the model. */
    public boolean exact() {
        return exact;
    }

    /** The name used in rules, lower case. */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The reason a candidate is rejected with when this invariant lies outside its range. */
    public Reason rejection() {
        return Rejections.BY_INVARIANT.get(this);
    }

    /**
     * The code of that rejection: {@code exact-LABEL-out-of-range} or {@code predicted-LABEL-out-of-range}.
     * {@link Reason} takes its codes from here, so the two cannot drift apart.
     */
    String rejectionCode() {
        return (exact ? "exact-" : "predicted-") + label() + "-out-of-range";
    }

    /** The invariant called {@code label} (case and surrounding blanks ignored), if any. */
    public static Optional<Keepable> ofLabel(String label) {
        String l = Objects.requireNonNull(label, "label").trim().toLowerCase(Locale.ROOT);
        return Arrays.stream(values()).filter(k -> k.label().equals(l)).findFirst();
    }

    /** Filled on first use, after both enums exist (Reason's constants refer to this enum's). */
    private static final class Rejections {
        static final Map<Keepable, Reason> BY_INVARIANT = new EnumMap<>(Keepable.class);

        static {
            for (Reason r : Reason.values()) {
                if (!r.residue()) {
                    r.invariant().ifPresent(k -> BY_INVARIANT.put(k, r));
                }
            }
            for (Keepable k : values()) {
                if (!BY_INVARIANT.containsKey(k)) {
                    throw new ExceptionInInitializerError("no out-of-range reason for " + k);
                }
            }
        }
    }
}
