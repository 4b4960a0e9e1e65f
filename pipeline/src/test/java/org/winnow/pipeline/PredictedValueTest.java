package org.winnow.pipeline;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.KnownValue;

class PredictedValueTest {
    @Test
    void theBasisColumnRoundTrips() {
        for (PredictedValue v : new PredictedValue[] {PredictedValue.proved(426),
                new PredictedValue(12, Basis.BOUNDED, 10, 14, 0.75), PredictedValue.estimated(57, 0.5)}) {
            assertEquals(v, PredictedValue.parse(Long.toString(v.value()), v.describeBasis(), Double.toString(v.confidence())));
        }
        assertEquals("bounded 10..14", new PredictedValue(12, Basis.BOUNDED, 10, 14, 0.75).describeBasis());
        assertEquals("proved", PredictedValue.proved(1).describeBasis());
        assertEquals("estimated", PredictedValue.estimated(1, 0.3).describeBasis());
    }

    @Test
    void onlyAProofShowsCertainty() {
        assertThrows(IllegalArgumentException.class, () -> PredictedValue.estimated(5, 1.0));
        assertThrows(IllegalArgumentException.class, () -> new PredictedValue(5, Basis.BOUNDED, 4, 6, 1.0));
        assertThrows(IllegalArgumentException.class, () -> new PredictedValue(5, Basis.PROVED, 5, 5, 0.9));
        assertThrows(IllegalArgumentException.class, () -> new PredictedValue(7, Basis.BOUNDED, 4, 6, 0.5));
    }

    @Test
    void aVoteIsClampedIntoItsProvedIntervalAndAProofIgnoresIt() {
        assertEquals(new PredictedValue(14, Basis.BOUNDED, 10, 14, 0.6),
                PredictedValue.of(new KnownValue(12, Basis.BOUNDED, 10, 14), 20, 0.6));
        assertEquals(PredictedValue.proved(3), PredictedValue.of(KnownValue.proved(3), 20, 0.6));
        assertEquals(PredictedValue.estimated(0, 0.6), PredictedValue.of(KnownValue.estimated(2), -3, 0.6));
    }

    @Test
    void aBoundedIntervalWhollyOutsideCounts() {
        PredictedValue b = new PredictedValue(12, Basis.BOUNDED, 10, 14, 0.75);
        assertEquals(true, b.provedOutside(15, 20));
        assertEquals(false, b.provedOutside(14, 20));
        assertEquals(false, PredictedValue.estimated(3, 0.5).provedOutside(10, 20));
    }
}
