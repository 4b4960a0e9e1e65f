package org.winnow.scorer.rules;

/** A keep rule that cannot be used; the message is one line and names the rule. */
public final class RuleException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    public RuleException(String message) {
        super(message);
    }
}
