package org.winnow.pipeline;

import java.util.Arrays;
import java.util.List;
import java.util.Optional;

/**
 * Why a candidate was kept or rejected. Every verdict carries exactly one reason, so the counts by
 * reason add up to the number of candidates scored. The {@link #code()} is what files and metrics show.
 *
 * <p>Every rejection names the {@link Keepable} invariant outside its range and takes its code from it.
 * The declaration order is the order in which manifests and status lines list the reasons.
 */
public enum Reason {
    /** The exact dimension lies outside its keep range. */
    EXACT_DIM_OUT_OF_RANGE(Keepable.DIM),
    /** The exact Euler characteristic lies outside its keep range. */
    EXACT_CHI_OUT_OF_RANGE(Keepable.CHI),
    /** The number of projective factors lies outside its keep range. */
    EXACT_ROWS_OUT_OF_RANGE(Keepable.ROWS),
    /** The number of polynomials lies outside its keep range. */
    EXACT_COLS_OUT_OF_RANGE(Keepable.COLS),
    /** The number of blocks lies outside its keep range. */
    EXACT_BLOCKS_OUT_OF_RANGE(Keepable.BLOCKS),
    /** h^{1,1} is proved outside its keep range. */
    PROVED_H11_OUT_OF_RANGE(Keepable.H11, Kind.PROVED),
    /** h^{1,1} is proved to lie in an interval wholly outside its keep range. */
    BOUNDED_H11_OUT_OF_RANGE(Keepable.H11, Kind.BOUNDED),
    /** h^{2,1} is proved outside its keep range. */
    PROVED_H21_OUT_OF_RANGE(Keepable.H21, Kind.PROVED),
    /** h^{2,1} is proved to lie in an interval wholly outside its keep range. */
    BOUNDED_H21_OUT_OF_RANGE(Keepable.H21, Kind.BOUNDED),
    /** h^{3,1} is proved outside its keep range. */
    PROVED_H31_OUT_OF_RANGE(Keepable.H31, Kind.PROVED),
    /** h^{3,1} is proved to lie in an interval wholly outside its keep range. */
    BOUNDED_H31_OUT_OF_RANGE(Keepable.H31, Kind.BOUNDED),
    /** h^{2,2} is proved outside its keep range. */
    PROVED_H22_OUT_OF_RANGE(Keepable.H22, Kind.PROVED),
    /** h^{2,2} is proved to lie in an interval wholly outside its keep range. */
    BOUNDED_H22_OUT_OF_RANGE(Keepable.H22, Kind.BOUNDED),
    /** h^{1,1} is not proved but confidently predicted outside its keep range, and the candidate looks familiar. */
    PREDICTED_H11_OUT_OF_RANGE(Keepable.H11),
    /** The exact Euler characteristic does not leave the residue a rule asks for (such as chi%24=0). */
    EXACT_CHI_WRONG_RESIDUE(Keepable.CHI, "exact-chi-wrong-residue"),
    /** h^{2,1} is confidently predicted outside its keep range and the candidate looks familiar. */
    PREDICTED_H21_OUT_OF_RANGE(Keepable.H21),
    /** h^{3,1} is confidently predicted outside its keep range and the candidate looks familiar. */
    PREDICTED_H31_OUT_OF_RANGE(Keepable.H31),
    /** h^{2,2} is confidently predicted outside its keep range and the candidate looks familiar. */
    PREDICTED_H22_OUT_OF_RANGE(Keepable.H22),
    /** Every exact and predicted invariant lies in its range. */
    KEPT_IN_RANGE("kept-in-range"),
    /** A prediction is outside its range, but the candidate is unlike the reference set. */
    KEPT_AS_NOVEL("kept-as-novel"),
    /** A prediction is outside its range, but with a confidence below the threshold. */
    KEPT_LOW_CONFIDENCE("kept-low-confidence"),
    /**
     * A rule names an invariant the model does not determine for this candidate, or one that a product's
     * prediction gives only through identities of full holonomy, which fail for products.
     */
    KEPT_UNDECIDED("kept-undecided");

    private final String code;
    private final Verdict verdict;
    private final Keepable invariant;
    private final boolean residue;

    /** A keep. */
    Reason(String code) {
        this.code = code;
        this.verdict = Verdict.KEEP;
        this.invariant = null;
        this.residue = false;
    }

    /** How a predicted value outside its range is known, for the rejections that are not by vote. */
    enum Kind { PROVED, BOUNDED }

    /** A rejection because {@code invariant} is proved (or bounded) outside its range. */
    Reason(Keepable invariant, Kind kind) {
        this.code = kind.name().toLowerCase(java.util.Locale.ROOT) + "-" + invariant.label() + "-out-of-range";
        this.verdict = Verdict.REJECT;
        this.invariant = invariant;
        this.residue = true; // not the invariant's one range rejection (that is the vote's)
    }

    /** A rejection because {@code invariant} leaves the wrong residue (a residue rule, not a range). */
    Reason(Keepable invariant, String code) {
        this.code = code;
        this.verdict = Verdict.REJECT;
        this.invariant = invariant;
        this.residue = true;
    }

    /** A rejection because {@code invariant} lies outside its range. */
    Reason(Keepable invariant) {
        this.code = invariant.rejectionCode();
        this.verdict = Verdict.REJECT;
        this.invariant = invariant;
        this.residue = false;
    }

    /**
     * True for a rejection that is not its invariant's {@link Keepable#rejection()}: a residue rule's, or a
     * predicted value's proved or bounded one.
     */
    public boolean residue() {
        return residue;
    }

    /** The stable lower-case code used in files, manifests and metric tags. */
    public String code() {
        return code;
    }

    /** The invariant outside its range, for a rejection; empty for a keep. */
    public Optional<Keepable> invariant() {
        return Optional.ofNullable(invariant);
    }

    /** The verdict this reason stands for. */
    public Verdict verdict() {
        return verdict;
    }

    /** The reasons that carry {@code verdict}, in declaration order. */
    public static List<Reason> withVerdict(Verdict verdict) {
        return Arrays.stream(values()).filter(r -> r.verdict == verdict).toList();
    }

    /** The rejection of a predicted {@code invariant} proved outside its range. */
    public static Reason provedOutside(Keepable invariant) {
        return ofCode("proved-" + invariant.label() + "-out-of-range");
    }

    /** The rejection of a predicted {@code invariant} whose proved interval lies wholly outside its range. */
    public static Reason boundedOutside(Keepable invariant) {
        return ofCode("bounded-" + invariant.label() + "-out-of-range");
    }

    /** The reason whose code is {@code code}. */
    public static Reason ofCode(String code) {
        for (Reason r : values()) {
            if (r.code.equals(code)) {
                return r;
            }
        }
        throw new IllegalArgumentException("unknown reason code: " + code);
    }
}
