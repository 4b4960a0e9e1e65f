package org.winnow.app.watch;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.metrics.MetricSnapshot;

class ClusterViewTest {
    private static MetricSnapshot scorer(String instance, String incarnation, long seq, long at, long kept,
            long rejected, double rate) {
        long[] bins = new long[10];
        bins[9] = kept;
        bins[0] = rejected;
        return new MetricSnapshot("r", "score", instance, incarnation, seq, at, kept + rejected, rate,
                new String[] {Reason.KEPT_AS_NOVEL.code(), Reason.EXACT_CHI_OUT_OF_RANGE.code()},
                new long[] {kept, rejected}, bins);
    }

    @Test
    void aRestartedInstanceAddsItsIncarnationsAndLateSnapshotsDoNotGoBack() {
        ClusterView view = new ClusterView("r");
        view.accept(scorer("a", "1@0", 0, 1_000, 10, 5, 15));
        view.accept(scorer("a", "1@0", 2, 3_000, 40, 20, 30));
        view.accept(scorer("a", "1@0", 1, 2_000, 20, 10, 15)); // arrives late: older than the one held
        view.accept(scorer("a", "2@5000", 0, 6_000, 3, 1, 4)); // the same name, restarted
        view.accept(scorer("b", "3@0", 4, 6_000, 7, 0, 7));
        WatchState s = view.state(7_000);
        List<WatchState.Instance> scorers = s.stage("score").instances();
        assertEquals("a", scorers.get(0).instance());
        assertEquals(64, scorers.get(0).candidates(), "60 before the restart, 4 after");
        assertEquals(2, scorers.get(0).incarnations());
        assertEquals(4, scorers.get(0).rate(), "the rate of the newest incarnation");
        assertEquals(7, scorers.get(1).candidates());
        assertEquals(71, s.stage("score").candidates());
        assertEquals(11, s.stage("score").rate());
        assertEquals(40 + 3 + 7, s.funnel().stream().filter(r -> r.reason().equals(Reason.KEPT_AS_NOVEL.code()))
                .findFirst().orElseThrow().count());
        assertEquals("reject", s.funnel().get(0).verdict(), "rejections come first in the funnel");
        assertEquals(50, s.novelty()[9]);
        assertEquals(21, s.novelty()[0]);

        WatchState later = view.state(6_000 + ClusterView.STALE_AFTER_MILLIS + 1);
        assertFalse(later.stage("score").instances().get(0).live());
        assertEquals(0, later.stage("score").rate(), "stopped instances add no throughput");
        assertEquals(71, later.stage("score").candidates(), "but keep their counts");
    }

    @Test
    void snapshotsOfAnotherRunAreRefusedAndNamedNotAdded() {
        ClusterView view = new ClusterView("r");
        view.accept(new MetricSnapshot("other", "sink", "sink", "1@0", 0, 0, 99, 0, new String[0], new long[0],
                new long[0]));
        WatchState s = view.state(0);
        assertEquals(0, s.stage("sink").candidates());
        assertEquals(1, s.refused());
        assertTrue(s.lastRefusal().contains("'other'"), s.lastRefusal());
        assertTrue(WatchText.line(s).contains("refused 1"), WatchText.line(s));
    }

    @Test
    void historyKeepsRatesPerStageAndScorerUpToItsLength() {
        ClusterView view = new ClusterView("r");
        for (int i = 0; i < ClusterView.HISTORY + 5; i++) {
            view.accept(scorer("a", "1@0", i, i * 1000L, i, 0, i));
            view.tick(i * 1000L);
        }
        List<WatchState.Point> h = view.state(0).history();
        assertEquals(ClusterView.HISTORY, h.size());
        assertEquals(ClusterView.HISTORY + 4, h.get(h.size() - 1).scorers().get("a"));
        assertEquals(5.0, h.get(0).stages().get("score"), "the oldest points were dropped");
    }
}
