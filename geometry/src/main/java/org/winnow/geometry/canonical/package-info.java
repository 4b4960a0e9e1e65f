/**
 * The canonical form of a configuration matrix under row and column permutations: the
 * lexicographically maximal row-major word with rows grouped by descending n. Its text is the
 * dedup key of the whole pipeline, so the definition here is normative and must never change
 * silently.
 */
package org.winnow.geometry.canonical;
