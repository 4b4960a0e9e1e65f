package org.winnow.app.hodge;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.hodge.Method;
import org.winnow.geometry.hodge.Status;

/**
 * Survey statistics of a {@code winnow hodge} run: how many results each method decided, the exact
 * fraction among non-refused inputs, refusal reasons, distinct Hodge tuples (of non-products; products,
 * method {@code product}, are counted apart since their numbers mean less), and per-method median
 * and 99th-percentile seconds.
 */
final class HodgeSummary {
    private final Map<Status, Integer> byStatus = new EnumMap<>(Status.class);
    private final Map<Method, List<Double>> seconds = new EnumMap<>(Method.class);
    private final Map<String, Integer> refusals = new TreeMap<>();
    private final Set<String> tuples = new HashSet<>();
    private final Set<String> productTuples = new HashSet<>();
    private final List<Double> all = new ArrayList<>();
    private int exactByMethod;

    void add(HodgeResult r) {
        byStatus.merge(r.status(), 1, Integer::sum);
        all.add(r.seconds());
        if (r.method() != null) {
            seconds.computeIfAbsent(r.method(), m -> new ArrayList<>()).add(r.seconds());
        }
        if (r.status() == Status.REFUSED) {
            String reason = r.reason();
            int colon = reason.indexOf(':');
            refusals.merge(colon > 0 ? reason.substring(0, colon) : reason, 1, Integer::sum);
        } else if (r.status() == Status.EXACT) {
            exactByMethod++;
            (r.isProduct() ? productTuples : tuples).add(r.dim() + ":" + r.h11() + "," + r.h21() + "," + r.h31() + ","
                    + r.h22());
        }
    }

    void print(PrintWriter w) {
        int exact = byStatus.getOrDefault(Status.EXACT, 0);
        int bounded = byStatus.getOrDefault(Status.BOUNDED, 0);
        int refused = byStatus.getOrDefault(Status.REFUSED, 0);
        w.printf(Locale.ROOT, "results %d: exact %d, bounded %d, refused %d; exact fraction of non-refused %.4f%n",
                exact + bounded + refused, exact, bounded, refused,
                exact + bounded == 0 ? 0.0 : exact / (double) (exact + bounded));
        for (Map.Entry<Method, List<Double>> e : seconds.entrySet()) {
            List<Double> v = e.getValue();
            v.sort(null);
            w.printf(Locale.ROOT, "method %-11s %6d results, median %.4f s, p99 %.4f s, max %.4f s%n", e.getKey().label(),
                    v.size(), quantile(v, 0.5), quantile(v, 0.99), v.get(v.size() - 1));
        }
        refusals.forEach((reason, count) -> w.printf(Locale.ROOT, "refused %6d  %s%n", count, reason));
        all.sort(null);
        double total = all.stream().mapToDouble(Double::doubleValue).sum();
        w.printf(Locale.ROOT, "distinct exact Hodge tuples %d (products apart: %d more); total compute %.1f s (sum over results)%n",
                tuples.size(), productTuples.size(), total);
        w.flush();
    }

    private static double quantile(List<Double> sorted, double q) {
        if (sorted.isEmpty()) {
            return 0;
        }
        int i = (int) Math.ceil(q * sorted.size()) - 1;
        return sorted.get(Math.max(0, Math.min(sorted.size() - 1, i)));
    }
}
