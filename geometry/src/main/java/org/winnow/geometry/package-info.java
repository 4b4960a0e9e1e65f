/**
 * Configuration matrices and their text form: {@link org.winnow.geometry.Configuration} (an immutable
 * matrix of projective dimensions and degrees, with its canonical form),
 * {@link org.winnow.geometry.ConfigurationText} (parsing and printing the one-line format),
 * {@link org.winnow.geometry.ConfigurationValidator} (whether a matrix is a Calabi-Yau configuration of
 * a supported dimension) and {@link org.winnow.geometry.Checks} (argument checks whose messages name the
 * bad value). The mathematics lives in the sub-packages: {@code canonical}, {@code invariants},
 * {@code cohomology}, {@code hodge} and {@code linalg}. This module depends on nothing else of ours.
 */
package org.winnow.geometry;
