/**
 * {@code winnow train}, {@code winnow evaluate} and {@code winnow export-weights}: reading a labelled
 * reference file, training and freezing a model, measuring it and writing its plots, and exporting its
 * weights for other runtimes.
 */
package org.winnow.app.model;
