package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import java.util.SplittableRandom;
import org.apache.kafka.common.header.internals.RecordHeaders;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.Verdict;

/** Both forms of a scored topic's values, told apart by a header and never by guessing at bytes. */
class ScoredTopicSerdeTest {
    private static final ScoredTopicSerde SERDE = ScoredTopicSerde.of(WireTypes.stages().build());

    @Test
    void slimRejectsAndWholeRecordsRoundTripAndOnlySlimOnesAreMarked() {
        SplittableRandom random = new SplittableRandom(20261202L);
        Reason[] reasons = Reason.values();
        for (int i = 0; i < 500; i++) {
            Configuration c = KryoCodecTest.randomConfiguration(random);
            Candidate cand = new Candidate(c, c.toText(), random.nextInt(4), random.nextLong(1L << 40));
            Reason reason = reasons[random.nextInt(reasons.length)];
            Scored whole = Scored.of(cand, new ExactInvariants(3, -2L * random.nextInt(100), c.rows(), c.cols(), 1), Prediction.of(random.nextInt(20), 0.5, null, random.nextDouble(), "4:5"), reason);
            RecordHeaders wholeHeaders = new RecordHeaders();
            byte[] wholeBytes = SERDE.serialize("t", wholeHeaders, whole);
            assertNull(wholeHeaders.lastHeader(ScoredTopicSerde.KIND), "a whole record keeps the bytes of older runs");
            assertEquals(whole, SERDE.deserialize("t", wholeHeaders, wholeBytes));
            assertEquals(cand.seq(), ScoredTopicSerde.seq(whole));
            if (reason.verdict() == Verdict.REJECT) {
                SlimReject slim = SlimReject.of(whole);
                RecordHeaders slimHeaders = new RecordHeaders();
                byte[] slimBytes = SERDE.serialize("t", slimHeaders, slim);
                assertEquals(slim, SERDE.deserialize("t", slimHeaders, slimBytes));
                assertEquals(new SlimReject(cand.shard(), cand.seq(), reason), slim);
                assertEquals(cand.seq(), ScoredTopicSerde.seq(slim));
                // One byte each for shard and reason, seven bits of the seq per byte.
                int seqBytes = Math.max(1, (64 - Long.numberOfLeadingZeros(cand.seq()) + 6) / 7);
                assertEquals(2 + seqBytes, slimBytes.length);
                assertTrue(slimBytes.length < wholeBytes.length);
            }
        }
    }

    @Test
    void aKeptReasonAnUnknownReasonOrAnUnknownKindIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> new SlimReject(0, 3, Reason.KEPT_AS_NOVEL));
        // shard 0, seq 3, reason ordinal 99
        RecordHeaders slim = new RecordHeaders();
        slim.add(ScoredTopicSerde.KIND, new byte[] {'r'});
        assertThrows(WireFormatException.class, () -> SERDE.deserialize("t", slim, new byte[] {0, 3, 99}));
        int kept = Reason.KEPT_IN_RANGE.ordinal();
        assertThrows(WireFormatException.class, () -> SERDE.deserialize("t", slim, new byte[] {0, 3, (byte) kept}));
        RecordHeaders other = new RecordHeaders();
        other.add(ScoredTopicSerde.KIND, new byte[] {'x'});
        var e = assertThrows(WireFormatException.class, () -> SERDE.deserialize("t", other, new byte[] {0, 3, 0}));
        assertTrue(e.getMessage().contains("topic t"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> SERDE.serialize("t", new RecordHeaders(), "text"));
    }

    @Test
    void theRunDescriptorSaysHowRejectsTravel() {
        assertEquals(RejectsOnWire.WHOLE, RejectsOnWire.of(new RunDescriptor("r", Map.of())));
        assertEquals(RejectsOnWire.SLIM, RejectsOnWire.of(new RunDescriptor("r", Map.of("rejects", "slim"))));
        assertEquals(RejectsOnWire.WHOLE, RejectsOnWire.of(new RunDescriptor("r", Map.of("rejects", "whole"))));
        var e = assertThrows(ClusterRefusedException.class,
                () -> RejectsOnWire.of(new RunDescriptor("r", Map.of("rejects", "thin"))));
        assertTrue(e.getMessage().contains("'thin'"), e.getMessage());
    }
}
