package org.winnow.scorer.rules;

import java.util.Objects;
import org.winnow.pipeline.Keepable;

/**
 * Keep only candidates whose exact Euler characteristic leaves {@code residue} on division by
 * {@code modulus}. Written {@code chi%24=0}: a flux study wants {@code chi/24} integral (common practice,
 * no source). Only chi takes such a rule: it is the one exact invariant a divisibility condition is asked of.
 */
public record ResidueRule(Keepable invariant, long modulus, long residue) {
    public ResidueRule {
        Objects.requireNonNull(invariant, "invariant");
        if (invariant != Keepable.CHI) {
            throw new RuleException(String.format("rule '%s': only chi takes a residue rule (chi%%M=R)",
                    text(invariant, modulus, residue)));
        }
        if (modulus < 2) {
            throw new RuleException(String.format("rule '%s': the modulus must be at least 2", text(invariant, modulus, residue)));
        }
        if (residue < 0 || residue >= modulus) {
            throw new RuleException(String.format("rule '%s': the residue must be in 0..%d", text(invariant, modulus, residue),
                    modulus - 1));
        }
    }

    /** True iff {@code text} is written as a residue rule (has a {@code %} before its {@code =}). */
    static boolean looksLike(String text) {
        int eq = text.indexOf('=');
        int pct = text.indexOf('%');
        return pct >= 0 && (eq < 0 || pct < eq);
    }

    /** Parses {@code INVARIANT%M=R}; every error is one line naming the rule. */
    public static ResidueRule parse(String rule) {
        String text = rule == null ? "" : rule.trim();
        int pct = text.indexOf('%');
        int eq = text.indexOf('=');
        if (pct < 0 || eq < pct) {
            throw new RuleException(String.format("rule '%s': expected INVARIANT%%M=R, such as chi%%24=0", text));
        }
        String label = text.substring(0, pct);
        Keepable invariant = Keepable.ofLabel(label).orElseThrow(() -> new RuleException(String.format(
                "rule '%s': unknown invariant '%s' (known: %s)", text, label.trim(),
                java.util.Arrays.stream(Keepable.values()).map(Keepable::label)
                        .collect(java.util.stream.Collectors.joining(", ")))));
        long modulus = number(text.substring(pct + 1, eq), text);
        long residue = number(text.substring(eq + 1), text);
        if (invariant != Keepable.CHI) {
            throw new RuleException(String.format("rule '%s': only chi takes a residue rule (chi%%M=R)", text));
        }
        return new ResidueRule(invariant, modulus, residue);
    }

    private static long number(String s, String rule) {
        try {
            return Long.parseLong(s.trim());
        } catch (NumberFormatException e) {
            throw new RuleException(String.format("rule '%s': '%s' is not a whole number", rule, s.trim()));
        }
    }

    /** True iff {@code value} leaves the residue. */
    public boolean accepts(long value) {
        return Math.floorMod(value, modulus) == residue;
    }

    @Override
    public String toString() {
        return text(invariant, modulus, residue);
    }

    private static String text(Keepable invariant, long modulus, long residue) {
        return invariant.label() + "%" + modulus + "=" + residue;
    }
}
