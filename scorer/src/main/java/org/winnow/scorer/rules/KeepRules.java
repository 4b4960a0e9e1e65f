package org.winnow.scorer.rules;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Keepable;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Reason;

/**
 * The complete rule set of a scan: ranges, the confidence a prediction needs before it may reject,
 * and the novelty guard above which nothing is rejected on a prediction.
 *
 * <p>Decision order, so that every candidate gets exactly one reason: the exact ranges in the order
 * given (the first violated one rejects), then the residue rules on chi. Then the predicted ranges, by
 * how each value is known: a value proved outside its range rejects for certain (the first such rule),
 * else one whose proved interval lies wholly outside (likewise); otherwise, if some unproved value lies
 * outside its range, the candidate is kept as novel when the novelty reaches the guard, else rejected on
 * the first such value whose own confidence reaches the threshold, else kept with low confidence. With
 * no value outside, it is kept in range, or undecided when a named value is not determined.
 *
 * <p>Immutable and thread-safe.
 *
 * @param ranges        at most one range per invariant
 * @param residues      at most one residue rule per invariant (only chi takes one, such as {@code chi%24=0})
 * @param minConfidence a prediction rejects only with at least this confidence, in [0, 1]
 * @param noveltyGuard  a prediction rejects only with novelty below this, in (0, 1]
 */
public record KeepRules(List<RangeRule> ranges, List<ResidueRule> residues, double minConfidence, double noveltyGuard) {
    /**
     * Default confidence threshold. An unproved value's confidence is the rule of succession on the voting
     * neighbours that agree, {@code (a + 1) / (k + 2)}: a unanimous vote of the 7 nearest gives 8/9 = 0.889.
     */
    public static final double DEFAULT_MIN_CONFIDENCE = 0.85;
    /** Default novelty guard. */
    public static final double DEFAULT_NOVELTY_GUARD = 0.99;

    public KeepRules {
        ranges = List.copyOf(ranges);
        residues = List.copyOf(residues);
        Map<Keepable, RangeRule> seen = new EnumMap<>(Keepable.class);
        for (RangeRule r : ranges) {
            RangeRule before = seen.putIfAbsent(r.invariant(), r);
            if (before != null) {
                throw new RuleException(String.format("rule '%s': %s already has the rule '%s'; give one range per invariant",
                        r, r.invariant().label(), before));
            }
        }
        Map<Keepable, ResidueRule> seenResidue = new EnumMap<>(Keepable.class);
        for (ResidueRule r : residues) {
            ResidueRule before = seenResidue.putIfAbsent(r.invariant(), r);
            if (before != null) {
                throw new RuleException(String.format("rule '%s': %s already has the rule '%s'; give one residue per invariant",
                        r, r.invariant().label(), before));
            }
        }
        if (!(minConfidence >= 0 && minConfidence <= 1)) {
            throw new RuleException(String.format("rule 'min-confidence %s': must be in [0, 1]", minConfidence));
        }
        if (!(noveltyGuard > 0 && noveltyGuard <= 1)) {
            throw new RuleException(String.format("rule 'novelty %s': must be in (0, 1]", noveltyGuard));
        }
    }

    /** Ranges only. */
    public KeepRules(List<RangeRule> ranges, double minConfidence, double noveltyGuard) {
        this(ranges, List.of(), minConfidence, noveltyGuard);
    }

    /** Parses {@code --keep} values ({@code h31=100..500}, {@code chi%24=0}) with the given thresholds. */
    public static KeepRules of(List<String> keeps, double minConfidence, double noveltyGuard) {
        List<RangeRule> ranges = new ArrayList<>();
        List<ResidueRule> residues = new ArrayList<>();
        for (String k : keeps) {
            if (ResidueRule.looksLike(k)) {
                residues.add(ResidueRule.parse(k));
            } else {
                ranges.add(RangeRule.parse(k));
            }
        }
        return new KeepRules(ranges, residues, minConfidence, noveltyGuard);
    }

    /**
     * The reason for the verdict on a candidate with these invariants and this prediction (novelty included).
     * A product (more than one block) is never rejected on h21, h31 or h22: the prediction gives them
     * through identities of full holonomy ({@code chi = 2(h11 - h21)}, {@code chi = 48 + 6(h11 - h21 + h31)},
     * {@code h22 = 44 + 4 h11 - 2 h21 + 4 h31}), which fail for products; such a rule leaves it undecided.
     */
    public Reason decide(ExactInvariants exact, Prediction prediction) {
        for (RangeRule r : ranges) {
            if (r.invariant().exact() && !r.contains(exactValue(r.invariant(), exact))) {
                return r.invariant().rejection();
            }
        }
        for (ResidueRule r : residues) {
            if (!r.accepts(exactValue(r.invariant(), exact))) {
                return Reason.EXACT_CHI_WRONG_RESIDUE;
            }
        }
        boolean undecided = false;
        RangeRule bounded = null;
        List<RangeRule> outside = null;
        for (RangeRule r : ranges) {
            if (r.invariant().exact()) {
                continue;
            }
            PredictedValue v = prediction.value(r.invariant());
            if (v == null || (prediction.product() || exact.blocks() > 1) && r.invariant() != Keepable.H11) {
                undecided = true;
            } else if (v.provedOutside(r.lo(), r.hi())) {
                if (v.isProved()) {
                    return Reason.provedOutside(r.invariant());
                }
                bounded = bounded == null ? r : bounded;
            } else if (!r.contains(v.value())) {
                if (outside == null) {
                    outside = new ArrayList<>(2);
                }
                outside.add(r);
            }
        }
        if (bounded != null) {
            return Reason.boundedOutside(bounded.invariant());
        }
        if (outside == null) {
            return undecided ? Reason.KEPT_UNDECIDED : Reason.KEPT_IN_RANGE;
        }
        if (prediction.novelty() >= noveltyGuard) {
            return Reason.KEPT_AS_NOVEL;
        }
        for (RangeRule r : outside) {
            if (prediction.value(r.invariant()).confidence() >= minConfidence) {
                return r.invariant().rejection();
            }
        }
        return Reason.KEPT_LOW_CONFIDENCE;
    }

    /**
     * True iff the verdict {@code reason} on this candidate could change were the values it rests on
     * proved: no exact rule and no proof (or proved interval) decided it, and some predicted value a
     * rule names is not proved (only h11 counts for a product, whose other values never decide). This
     * is when the opt-in proof step is worth its time.
     */
    public boolean restsOnUnproved(ExactInvariants exact, Prediction prediction, Reason reason) {
        if (reason.verdict() == org.winnow.pipeline.Verdict.REJECT && !reason.code().startsWith("predicted-")) {
            return false; // exact, residue, proved or bounded: settled whatever the proof step finds
        }
        boolean product = prediction.product() || exact.blocks() > 1;
        for (RangeRule r : ranges) {
            if (r.invariant().exact() || product && r.invariant() != Keepable.H11) {
                continue;
            }
            PredictedValue v = prediction.value(r.invariant());
            if (v != null && !v.isProved()) {
                return true;
            }
        }
        return false;
    }

    /**
     * True iff the verdict {@code reason} on a prediction whose values may be wider than the complete
     * tuple's (the engine deferred) could differ from the verdict on the complete prediction: as
     * {@link #restsOnUnproved}, except that an unproved value whose proved interval lies inside its rule's
     * range does not count, since every value the complete tuple can give lies in that interval.
     */
    public boolean hingesOnOpenValue(ExactInvariants exact, Prediction prediction, Reason reason) {
        if (reason.verdict() == org.winnow.pipeline.Verdict.REJECT && !reason.code().startsWith("predicted-")) {
            return false; // exact, residue, proved or bounded: a proof, which the complete tuple cannot overturn
        }
        boolean product = prediction.product() || exact.blocks() > 1;
        for (RangeRule r : ranges) {
            if (r.invariant().exact() || product && r.invariant() != Keepable.H11) {
                continue;
            }
            PredictedValue v = prediction.value(r.invariant());
            if (v != null && !v.isProved()
                    && !(v.basis() == org.winnow.geometry.hodge.Basis.BOUNDED && r.contains(v.lo()) && r.contains(v.hi()))) {
                return true;
            }
        }
        return false;
    }

    /** True iff every predicted value a rule names (h11 only for a product) is proved or not determined. */
    public boolean namedValuesProved(ExactInvariants exact, Prediction prediction) {
        boolean product = prediction.product() || exact.blocks() > 1;
        for (RangeRule r : ranges) {
            if (r.invariant().exact() || product && r.invariant() != Keepable.H11) {
                continue;
            }
            PredictedValue v = prediction.value(r.invariant());
            if (v != null && !v.isProved()) {
                return false;
            }
        }
        return true;
    }

    /** The rules as text lines, in the rules-file form, for manifests and logs. */
    public List<String> describe() {
        List<String> lines = new ArrayList<>();
        for (RangeRule r : ranges) {
            lines.add(RulesFile.KEEP + " " + r);
        }
        for (ResidueRule r : residues) {
            lines.add(RulesFile.KEEP + " " + r);
        }
        lines.add(RulesFile.MIN_CONFIDENCE + " " + minConfidence);
        lines.add(RulesFile.NOVELTY + " " + noveltyGuard);
        return lines;
    }

    static long exactValue(Keepable invariant, ExactInvariants e) {
        return switch (invariant) {
            case CHI -> e.chi();
            case ROWS -> e.rows();
            case COLS -> e.cols();
            case DIM -> e.dim();
            case BLOCKS -> e.blocks();
            case H11, H21, H31, H22 -> throw new IllegalArgumentException(invariant.label() + " is not exact");
        };
    }

    static Integer predictedValue(Keepable invariant, Prediction e) {
        return switch (invariant) {
            case H11 -> e.h11();
            case H21 -> e.h21();
            case H31 -> e.h31();
            case H22 -> e.h22();
            default -> throw new IllegalArgumentException(invariant.label() + " is not predicted");
        };
    }
}
