package org.winnow.app.watch;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.winnow.pipeline.metrics.ScorerMetrics;

/** The terminal forms of a {@link WatchState}: a full view, and one line for logs. */
public final class WatchText {
    private WatchText() {
    }

    /** The full view, one entry a line. */
    public static List<String> full(WatchState s) {
        List<String> lines = new ArrayList<>();
        lines.add("run " + s.run() + " at " + Instant.ofEpochMilli(s.nowMillis()));
        lines.add(String.format(Locale.ROOT, "%-8s %12s %10s  %s", "stage", "candidates", "per s", "instances"));
        for (WatchState.Stage st : s.stages()) {
            StringBuilder inst = new StringBuilder();
            for (WatchState.Instance i : st.instances()) {
                inst.append(inst.length() == 0 ? "" : ", ").append(String.format(Locale.ROOT, "%s %,d (%s)",
                        i.instance(), i.candidates(), i.live() ? String.format(Locale.ROOT, "%,.0f/s", i.rate())
                                : "stopped"));
                if (i.incarnations() > 1) {
                    inst.append(" restarted ").append(i.incarnations() - 1).append('x');
                }
            }
            lines.add(String.format(Locale.ROOT, "%-8s %,12d %,10.0f  %s", st.stage(), st.candidates(), st.rate(),
                    inst.length() == 0 ? "(no snapshot yet)" : inst));
        }
        lines.add("lag: scorers " + lag(s.lag().scorers()) + ", sink " + lag(s.lag().sink()));
        long scored = s.funnel().stream().mapToLong(WatchState.ReasonCount::count).sum();
        for (WatchState.ReasonCount r : s.funnel()) {
            if (r.count() > 0) {
                lines.add(String.format(Locale.ROOT, "  %-8s %-28s %,10d  %5.1f%%", r.verdict(), r.reason(),
                        r.count(), 100.0 * r.count() / scored));
            }
        }
        StringBuilder nov = new StringBuilder("novelty:");
        for (int i = 0; i < s.novelty().length; i++) {
            nov.append(String.format(Locale.ROOT, " <=%s %,d", ScorerMetrics.binLabel(i), s.novelty()[i]));
        }
        lines.add(nov.toString());
        if (s.refused() > 0) {
            lines.add("refused " + s.refused() + " records of the metrics topic; last: " + s.lastRefusal());
        }
        return lines;
    }

    /** One line: candidates and rate per stage, per scorer instance, rejected share and lag. */
    public static String line(WatchState s) {
        StringBuilder sb = new StringBuilder("run " + s.run() + ":");
        for (WatchState.Stage st : s.stages()) {
            sb.append(String.format(Locale.ROOT, " %s %,d (%,.0f/s)", st.stage(), st.candidates(), st.rate()));
            if (st.stage().equals("score") && st.instances().size() > 1) {
                sb.append(" [");
                for (int i = 0; i < st.instances().size(); i++) {
                    WatchState.Instance in = st.instances().get(i);
                    sb.append(i == 0 ? "" : ", ").append(in.instance()).append(' ')
                            .append(String.format(Locale.ROOT, "%,d", in.candidates()));
                }
                sb.append(']');
            }
            sb.append(';');
        }
        long scored = s.funnel().stream().mapToLong(WatchState.ReasonCount::count).sum();
        long rejected = s.funnel().stream().filter(r -> r.verdict().equals("reject"))
                .mapToLong(WatchState.ReasonCount::count).sum();
        sb.append(String.format(Locale.ROOT, " rejected %s; lag scorers %s, sink %s",
                scored == 0 ? "0.0%" : String.format(Locale.ROOT, "%.1f%%", 100.0 * rejected / scored),
                lag(s.lag().scorers()), lag(s.lag().sink())));
        if (s.refused() > 0) {
            sb.append("; refused ").append(s.refused());
        }
        return sb.toString();
    }

    private static String lag(Long lag) {
        return lag == null ? "n/a" : String.format(Locale.ROOT, "%,d", lag);
    }
}
