package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.kafka.common.header.internals.RecordHeaders;
import org.junit.jupiter.api.Test;

class WireHeadersTest {
    private static final String MODEL_A = "00112233445566778899aabbccddeeff00112233445566778899aabbccddeeff";
    private static final String MODEL_B = "ff112233445566778899aabbccddeeff00112233445566778899aabbccddeeff";

    @Test
    void aStampedRecordPassesItsOwnRunsCheck() {
        WireHeaders h = WireHeaders.forRunAndModel(new RunTopics("r1"), MODEL_A);
        assertDoesNotThrow(() -> h.check(h.stamp(new RecordHeaders()), "t-0@0"));
        WireHeaders runOnly = WireHeaders.forRun(new RunTopics("r1"));
        assertDoesNotThrow(() -> runOnly.check(h.stamp(new RecordHeaders()), "t-0@0"));
    }

    @Test
    void refusesAnotherRunsRecordNamingBothRuns() {
        var headers = WireHeaders.forRun(new RunTopics("r2")).stamp(new RecordHeaders());
        var e = assertThrows(ClusterRefusedException.class,
                () -> WireHeaders.forRun(new RunTopics("r1")).check(headers, "t-3@17"));
        assertTrue(e.getMessage().contains("t-3@17") && e.getMessage().contains("'r2'")
                && e.getMessage().contains("'r1'"), e.getMessage());
    }

    @Test
    void refusesARecordScoredWithAnotherModel() {
        var headers = WireHeaders.forRunAndModel(new RunTopics("r1"), MODEL_B).stamp(new RecordHeaders());
        var e = assertThrows(ClusterRefusedException.class,
                () -> WireHeaders.forRunAndModel(new RunTopics("r1"), MODEL_A).check(headers, "s-0@1"));
        assertTrue(e.getMessage().contains("ff11223344556677"), e.getMessage());
    }

    @Test
    void refusesUnstampedRecordsAndBadChecksums() {
        assertThrows(ClusterRefusedException.class,
                () -> WireHeaders.forRun(new RunTopics("r1")).check(new RecordHeaders(), "t-0@0"));
        assertThrows(IllegalArgumentException.class,
                () -> WireHeaders.forRunAndModel(new RunTopics("r1"), "not-hex-at-all-zz"));
        assertThrows(IllegalArgumentException.class, () -> WireHeaders.forRunAndModel(new RunTopics("r1"), "abcd"));
    }
}
