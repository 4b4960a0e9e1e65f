/**
 * The candidate sources, as implementations of the pipeline's
 * {@link org.winnow.pipeline.CandidateSource} contract: {@link org.winnow.producer.source.EnumerationSource}
 * walks an {@link org.winnow.producer.source.EnumeratedSpace} with the producer's enumerator, and
 * {@link org.winnow.producer.source.InputFileSource} reads a file of configurations, one a line.
 */
package org.winnow.producer.source;
