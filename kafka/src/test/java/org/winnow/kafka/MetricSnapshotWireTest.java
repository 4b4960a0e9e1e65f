package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.metrics.MetricSnapshot;

/** Metric snapshots on the metrics topic: the wire form round-trips and malformed snapshots are refused. */
class MetricSnapshotWireTest {
    @Test
    void snapshotsRoundTripOnTheWireAndBadOnesAreRefused() {
        MetricSnapshot s = new MetricSnapshot("r1", "score", "a", "9@2", 3, 12345, 40, 2.5,
                new String[] {"kept-in-range", "kept-as-novel"}, new long[] {30, 10}, new long[10]);
        MetricSnapshot back = MetricsPublisher.decode(WireTypes.metrics().build().encode(s));
        assertEquals(s.instance(), back.instance());
        assertEquals(s.incarnation(), back.incarnation());
        assertEquals(s.candidatesPerSecond(), back.candidatesPerSecond());
        assertArrayEquals(s.reasonCounts(), back.reasonCounts());
        assertEquals(10, back.count(Reason.KEPT_AS_NOVEL));
        assertThrows(IllegalArgumentException.class, () -> new MetricSnapshot("r1", "scorer", "a", "1", 0, 0, 0, 0,
                new String[0], new long[0], new long[0]), "unknown stage kind");
        assertThrows(IllegalArgumentException.class, () -> new MetricSnapshot("r1", "sink", "a", "1", 0, 0, 0, 0,
                new String[1], new long[0], new long[0]), "reasons and counts differ in length");
    }
}
