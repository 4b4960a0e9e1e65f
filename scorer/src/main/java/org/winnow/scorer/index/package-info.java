/**
 * Nearest-neighbour search over the reference embeddings: the flat scan (the oracle every faster index
 * is tested against) and the anchored index that groups points by anchor value and slabs along the
 * widest learned coordinate, returning bit-for-bit the flat scan's answers.
 */
package org.winnow.scorer.index;
