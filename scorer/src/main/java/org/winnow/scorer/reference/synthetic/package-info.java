/**
 * A synthetic development scenario for the similarity model, used while exact labels do not exist
 * yet: seeded random configuration matrices with a permutation-invariant toy label standing in for
 * h11. Nothing here is mathematics of the real manifolds; results measured on it are labelled
 * synthetic wherever they are reported.
 */
package org.winnow.scorer.reference.synthetic;
