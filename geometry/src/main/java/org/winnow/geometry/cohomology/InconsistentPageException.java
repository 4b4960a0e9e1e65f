package org.winnow.geometry.cohomology;

/**
 * Thrown when rigorous constraints on a spectral sequence contradict each other: the input is not
 * what the analysis assumes (for example the complete intersection is empty or not of the expected
 * dimension). Callers report the case as refused, never as a value.
 */
public final class InconsistentPageException extends RuntimeException {
    public InconsistentPageException(String message) {
        super(message);
    }
}
