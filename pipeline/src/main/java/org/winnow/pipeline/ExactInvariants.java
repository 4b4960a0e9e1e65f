package org.winnow.pipeline;

/**
 * The cheap invariants a scorer computes exactly for every candidate; a rule on any of them decides
 * without doubt.
 *
 * @param dim    complex dimension of the complete intersection
 * @param chi    Euler characteristic
 * @param rows   number of projective factors
 * @param cols   number of polynomials
 * @param blocks number of blocks (the matrix is block diagonal with this many blocks)
 */
public record ExactInvariants(int dim, long chi, int rows, int cols, int blocks) {}
