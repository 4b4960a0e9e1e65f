package org.winnow.pipeline;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

/** The keepable invariants and the rejection reasons derived from them stay one vocabulary. */
class KeepableTest {
    @Test
    void everyInvariantHasExactlyOneRejectionAndItPointsBack() {
        for (Keepable k : Keepable.values()) {
            Reason r = k.rejection();
            assertEquals(Verdict.REJECT, r.verdict(), k.label());
            assertEquals(Optional.of(k), r.invariant(), k.label());
            assertEquals(1, Reason.withVerdict(Verdict.REJECT).stream()
                    .filter(x -> x.invariant().equals(Optional.of(k)) && !x.residue()).count(), k.label());
        }
        for (Reason r : Reason.values()) {
            assertEquals(r.verdict() == Verdict.REJECT, r.invariant().isPresent(), r.code());
            assertSame(r, Reason.ofCode(r.code()));
        }
    }

    @Test
    void codesAreTheOnesFilesAndManifestsAlreadyCarry() {
        // The codes are a file format: scan directories written before the vocabulary moved must still read.
        assertEquals(List.of("exact-dim-out-of-range", "exact-chi-out-of-range", "exact-rows-out-of-range",
                "exact-cols-out-of-range", "exact-blocks-out-of-range", "proved-h11-out-of-range",
                "bounded-h11-out-of-range", "proved-h21-out-of-range", "bounded-h21-out-of-range", "proved-h31-out-of-range",
                "bounded-h31-out-of-range", "proved-h22-out-of-range", "bounded-h22-out-of-range", "predicted-h11-out-of-range",
                "exact-chi-wrong-residue", "predicted-h21-out-of-range", "predicted-h31-out-of-range",
                "predicted-h22-out-of-range", "kept-in-range", "kept-as-novel", "kept-low-confidence",
                "kept-undecided"), java.util.Arrays.stream(Reason.values()).map(Reason::code).toList());
    }

    @Test
    void labelsParseWhateverTheCaseAndUnknownOnesAreEmpty() {
        for (Keepable k : Keepable.values()) {
            assertSame(k, Keepable.ofLabel(" " + k.label().toUpperCase(java.util.Locale.ROOT) + " ").orElseThrow());
            assertTrue(k.rejection().code().contains("-" + k.label() + "-"));
        }
        assertTrue(Keepable.ofLabel("h12").isEmpty());
    }
}
