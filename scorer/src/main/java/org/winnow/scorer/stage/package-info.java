/**
 * The scorer stage: for each candidate the cheap exact invariants, then the model's prediction and
 * novelty, then the keep rules, giving a verdict with its reason. One stage instance per worker
 * thread, each with its own invariant calculator and predictor, because neither is thread-safe.
 */
package org.winnow.scorer.stage;
