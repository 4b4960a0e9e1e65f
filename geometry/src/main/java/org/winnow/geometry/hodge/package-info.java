/**
 * Exact Hodge numbers of Calabi-Yau complete intersections (K3 surfaces, three-folds, four-folds)
 * from line bundle cohomology and the Euler and normal sequences. Every result is either proved
 * (exact), enclosed in proved intervals (bounded), or refused with a reason; nothing is guessed.
 */
package org.winnow.geometry.hodge;
