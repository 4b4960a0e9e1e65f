/**
 * The embedding network: a permutation-invariant message-passing network over the bipartite graph of a
 * configuration matrix ({@link org.winnow.scorer.network.Architecture} gives its shape and parameter
 * layout), its exact input features and the anchor coordinate, their normalisation, the training-time
 * network with gradients and the allocation-free inference network the scorer runs, with their scratch
 * buffers.
 */
package org.winnow.scorer.network;
