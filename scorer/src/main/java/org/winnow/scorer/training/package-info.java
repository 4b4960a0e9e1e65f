/**
 * Training of the similarity model with a contrastive loss on sampled pairs: the trainer, its options
 * and progress reports. Only the {@code train} command and the benches use it; the scoring path never
 * does.
 */
package org.winnow.scorer.training;
