package org.winnow.geometry;

/** Boundary checks that name the bad value, in one place so every module fails the same way. */
public final class Checks {
    private Checks() {}

    /** Throws {@link IllegalArgumentException} with the formatted message unless {@code condition}. */
    public static void requireArgument(boolean condition, String template, Object... args) {
        if (!condition) {
            throw new IllegalArgumentException(String.format(template, args));
        }
    }

    /** Throws {@link IllegalStateException} with the formatted message unless {@code condition}. */
    public static void requireState(boolean condition, String template, Object... args) {
        if (!condition) {
            throw new IllegalStateException(String.format(template, args));
        }
    }
}
