/**
 * The producer: an orderly, streaming enumeration of Calabi-Yau configuration matrices. Every
 * permutation class within the bounds is emitted exactly once, as its canonical form, in a
 * deterministic order and with constant memory (no set of seen outputs is ever kept). Shards are
 * disjoint subtrees of the search, so a cluster can split the space without coordination.
 *
 * <p>Public API: {@link org.winnow.producer.Bounds}, {@link org.winnow.producer.ExclusionSet},
 * {@link org.winnow.producer.ShardSpec}, {@link org.winnow.producer.ShardPlan},
 * {@link org.winnow.producer.Enumerator}, {@link org.winnow.producer.EnumeratedMatrix}; the candidate
 * sources of a scan (the enumeration and an input file) are in {@code org.winnow.producer.source}.
 */
package org.winnow.producer;
