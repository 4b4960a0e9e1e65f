/**
 * The frozen similarity model as the scorer uses it: the {@code .wnm} file ({@link
 * org.winnow.scorer.model.FrozenModel}: load, save, checksum, structure checks; {@link
 * org.winnow.scorer.model.ModelFile}: its byte layout), the {@link org.winnow.scorer.model.Predictor}
 * that predicts the Hodge numbers by a distance-weighted k-nearest-neighbour vote on corrections to the
 * tuple anchor and flags candidates unlike anything in the reference set (novelty), its calibration, and
 * {@link org.winnow.scorer.model.Evaluation} (held-out metrics).
 *
 * <p>The rest of the model lives beside it, one concern a package: the embedding network and its anchor
 * in {@code scorer.network}, the neighbour indexes in {@code scorer.index}, the labelled reference data
 * in {@code scorer.reference}, and training (only the {@code train} command needs it) in {@code
 * scorer.training}.
 */
package org.winnow.scorer.model;
