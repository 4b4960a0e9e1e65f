package org.winnow.pipeline;

import org.winnow.geometry.Configuration;

/**
 * Where a {@link CandidateSource} pushes what it reads. Called from the source's single thread only.
 */
public interface SourceListener {
    /**
     * One configuration read or enumerated, already in canonical form.
     *
     * @param canonical     the canonical configuration
     * @param canonicalText its canonical text (the basis of the key)
     */
    void item(Configuration canonical, String canonicalText) throws InterruptedException;

    /**
     * A piece of input that could not be used.
     *
     * @param line    the 1-based line number in the input
     * @param problem what is wrong with it, in one line
     */
    void badInput(long line, String problem);
}
