/**
 * The similarity model: a permutation-invariant embedding of a configuration matrix, trained with a
 * contrastive loss on a few exactly labelled examples, frozen into a {@code .wnm} file, and used by
 * the scorer through {@link org.winnow.scorer.model.Predictor} to predict h11 by a distance-weighted
 * k-nearest-neighbour vote and to flag candidates unlike anything in the reference set (novelty).
 *
 * <p>Entry points: {@link org.winnow.scorer.model.FrozenModel} (load, save, checksum, predictors),
 * {@link org.winnow.scorer.model.Trainer} (training), {@link org.winnow.scorer.model.ReferenceTsv}
 * (the labelled reference file) and {@link org.winnow.scorer.model.Evaluation} (held-out metrics).
 */
package org.winnow.scorer.model;
