/**
 * Keep/reject rules: ranges on exact and predicted invariants, a confidence threshold and a novelty
 * guard, parsed from the command line or a rules file and checked at startup.
 *
 * <p>The asymmetry is deliberate: an exact invariant outside its range rejects for certain, while a
 * predicted one rejects only when the model is confident and the candidate resembles the reference
 * set. What looks new is never thrown away on the model's word.
 */
package org.winnow.scorer.rules;
