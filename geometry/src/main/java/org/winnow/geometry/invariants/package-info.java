/**
 * Cheap exact invariants of complete-intersection configuration matrices: hyperplane-column
 * reduction, block decomposition, the intersection numbers {@code int_X J^a} by a frontier dynamic
 * programme over columns, Chern classes and the Euler characteristic, triple intersections and
 * {@code c2.J} of three-folds, {@code int c2^2} of four-folds.
 *
 * <p>All arithmetic is exact ({@code long} with overflow checks; an overflow fails loudly with an
 * {@link java.lang.ArithmeticException}). {@link org.winnow.geometry.invariants.InvariantCalculator}
 * is the entry point of the scorer's hot path; it is not thread-safe and keeps a reusable workspace.
 */
package org.winnow.geometry.invariants;
