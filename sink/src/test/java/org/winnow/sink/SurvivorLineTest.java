package org.winnow.sink;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.hodge.Basis;
import org.winnow.pipeline.Candidate;
import org.winnow.pipeline.ExactInvariants;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;

class SurvivorLineTest {
    private static Scored scored(Reason reason) {
        Configuration c = Configuration.parse("7:2,3,3");
        Prediction e = new Prediction(PredictedValue.proved(1), PredictedValue.estimated(0, 0.5),
                new PredictedValue(192, Basis.BOUNDED, 190, 195, 0.875), PredictedValue.estimated(816, 0.5), false, 0.25, "6:3,4");
        return Scored.of(new Candidate(c, c.toText(), 0, 3), new ExactInvariants(4, 1206, 1, 3, 1), e, reason);
    }

    @Test
    void everyValueWritesItsBasisAndReadsBack() {
        String line = SurvivorLine.format(scored(Reason.KEPT_IN_RANGE));
        assertEquals("7:2,3,3\t1206\t1\tproved\t1.000000\t0\testimated\t0.500000\t192\tbounded 190..195\t0.875000"
                + "\t816\testimated\t0.500000\t0.250000\tkept-in-range\t6:3,4", line);
        assertEquals(SurvivorLine.COLUMNS.split("\t").length, line.split("\t").length);
        SurvivorLine s = SurvivorLine.parse(line);
        assertEquals(PredictedValue.proved(1), s.h11Value());
        assertEquals(new PredictedValue(192, Basis.BOUNDED, 190, 195, 0.875), s.h31Value());
        assertEquals(Reason.KEPT_IN_RANGE, s.keptBecause());
        RejectLine r = RejectLine.parse(RejectLine.format(scored(Reason.BOUNDED_H31_OUT_OF_RANGE)));
        assertEquals(new PredictedValue(192, Basis.BOUNDED, 190, 195, 0.875), r.h31Value());
        assertEquals(Reason.BOUNDED_H31_OUT_OF_RANGE, r.rejectedBecause());
        assertEquals(RejectLine.COLUMNS.split("\t").length, RejectLine.format(scored(Reason.PROVED_H11_OUT_OF_RANGE)).split("\t").length);
    }

    @Test
    void formatOneLinesStillReadWithEveryValueEstimated() {
        SurvivorLine s = SurvivorLine.parse("4:5\t-200\t1\t1.000000\t101\t0.003\tkept-in-range\t-");
        assertEquals(Basis.ESTIMATED, s.h11Value().basis());
        assertEquals(1, s.h11());
        assertEquals(101, s.h21());
        assertNull(s.h31Value());
        assertEquals("", s.nearestReference());
        RejectLine r = RejectLine.parse("4:5\t-200\t1\t0.950000\t-\t0.003\tpredicted-h11-out-of-range");
        assertEquals(Basis.ESTIMATED, r.h11Value().basis());
        assertNull(r.h21Value());
    }
}
