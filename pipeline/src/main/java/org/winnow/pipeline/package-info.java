/**
 * The contract between the stages of a scan: the records that travel from producer to scorer to sink
 * ({@link org.winnow.pipeline.Candidate}, {@link org.winnow.pipeline.Scored}), the reason codes every
 * verdict carries, and the stage lifecycle ({@link org.winnow.pipeline.Stage}).
 *
 * <p>The records hold only primitives, strings, enums and {@link org.winnow.geometry.Configuration},
 * so that a serializer with registration (Kryo) can carry them between processes unchanged.
 */
package org.winnow.pipeline;
