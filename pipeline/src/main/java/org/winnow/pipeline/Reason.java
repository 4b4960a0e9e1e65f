package org.winnow.pipeline;

import java.util.Arrays;
import java.util.List;

/**
 * Why a candidate was kept or rejected. Every verdict carries exactly one reason, so the counts by
 * reason add up to the number of candidates scored. The {@link #code()} is what files and metrics show.
 */
public enum Reason {
    /** The exact dimension lies outside its keep range. */
    EXACT_DIM_OUT_OF_RANGE("exact-dim-out-of-range", Verdict.REJECT),
    /** The exact Euler characteristic lies outside its keep range. */
    EXACT_CHI_OUT_OF_RANGE("exact-chi-out-of-range", Verdict.REJECT),
    /** The number of projective factors lies outside its keep range. */
    EXACT_ROWS_OUT_OF_RANGE("exact-rows-out-of-range", Verdict.REJECT),
    /** The number of polynomials lies outside its keep range. */
    EXACT_COLS_OUT_OF_RANGE("exact-cols-out-of-range", Verdict.REJECT),
    /** The number of blocks lies outside its keep range. */
    EXACT_BLOCKS_OUT_OF_RANGE("exact-blocks-out-of-range", Verdict.REJECT),
    /** h^{1,1} is confidently predicted outside its keep range and the candidate looks familiar. */
    PREDICTED_H11_OUT_OF_RANGE("predicted-h11-out-of-range", Verdict.REJECT),
    /** h^{2,1} is confidently predicted outside its keep range and the candidate looks familiar. */
    PREDICTED_H21_OUT_OF_RANGE("predicted-h21-out-of-range", Verdict.REJECT),
    /** Every exact and predicted invariant lies in its range. */
    KEPT_IN_RANGE("kept-in-range", Verdict.KEEP),
    /** A prediction is outside its range, but the candidate is unlike the reference set. */
    KEPT_AS_NOVEL("kept-as-novel", Verdict.KEEP),
    /** A prediction is outside its range, but with a confidence below the threshold. */
    KEPT_LOW_CONFIDENCE("kept-low-confidence", Verdict.KEEP),
    /** A rule names an invariant the model does not determine for this candidate. */
    KEPT_UNDECIDED("kept-undecided", Verdict.KEEP);

    private final String code;
    private final Verdict verdict;

    Reason(String code, Verdict verdict) {
        this.code = code;
        this.verdict = verdict;
    }

    /** The stable lower-case code used in files, manifests and metric tags. */
    public String code() {
        return code;
    }

    /** The verdict this reason stands for. */
    public Verdict verdict() {
        return verdict;
    }

    /** The reasons that carry {@code verdict}, in declaration order. */
    public static List<Reason> withVerdict(Verdict verdict) {
        return Arrays.stream(values()).filter(r -> r.verdict == verdict).toList();
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
