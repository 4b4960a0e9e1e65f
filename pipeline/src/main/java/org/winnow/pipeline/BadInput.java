package org.winnow.pipeline;

/**
 * A piece of input that was skipped.
 *
 * @param line    the 1-based line number in the input
 * @param problem what is wrong with it
 */
public record BadInput(long line, String problem) {}
