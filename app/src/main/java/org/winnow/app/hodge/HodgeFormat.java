package org.winnow.app.hodge;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.util.Locale;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.hodge.HodgeResult;

/**
 * Text forms of Hodge results: JSON lines for {@code winnow hodge}, and the reference TSV
 * ({@code config h11 h21 [h31 h22] status source}) for {@code winnow label}. In the TSV an
 * undetermined value is written {@code lo..hi}. For a K3 surface h21 is written 0, which it is
 * ({@code h^{2,1} = h^{1,0} = 0} once {@code h^1(O_X) = 0} is verified), so exact rows stay integral
 * for the reference reader. A product (block-diagonal input, method {@code product}) is marked in every form:
 * {@code "product": true} with its factors and whole diamond in JSON, {@code product A x B} and its nonzero
 * {@code h^{p,0}} in text, and the source {@code product} in the TSV, since its holonomy is smaller and the
 * identities of full holonomy do not hold for it.
 */
final class HodgeFormat {
    private static final ObjectMapper JSON = new ObjectMapper();

    /** Header of a reference file without and with the four-fold columns. */
    static final String HEADER = "config\th11\th21\tstatus\tsource";
    static final String HEADER_4 = "config\th11\th21\th31\th22\tstatus\tsource";

    private HodgeFormat() {}

    static String json(String input, Configuration canonical, HodgeResult r) {
        ObjectNode o = JSON.createObjectNode();
        o.put("input", input);
        o.put("canonical", canonical.toText());
        o.put("dim", r.dim());
        if (r.chi().isPresent()) {
            o.put("chi", r.chi().get());
        } else {
            o.putNull("chi");
        }
        put(o, "h11", r.h11());
        put(o, "h21", r.h21());
        if (r.dim() == 4) {
            put(o, "h31", r.h31());
            put(o, "h22", r.h22());
        }
        o.put("status", r.status().label());
        if (r.method() == null) {
            o.putNull("method");
        } else {
            o.put("method", r.method().label());
        }
        o.put("product", r.isProduct());
        if (r.isProduct()) {
            var factors = o.putArray("factors");
            r.factors().forEach(f -> factors.add(f.toText()));
            if (r.diamond() != null) {
                var rows = o.putArray("diamond");
                for (long[] row : r.diamond().numbers()) {
                    var a = rows.addArray();
                    for (long h : row) {
                        a.add(h);
                    }
                }
            }
        }
        o.put("seconds", Math.round(r.seconds() * 1e6) / 1e6);
        if (!r.reason().isEmpty()) {
            o.put("reason", r.reason());
        }
        try {
            return JSON.writeValueAsString(o);
        } catch (IOException e) {
            throw new IllegalStateException("cannot write JSON for " + input, e);
        }
    }

    private static void put(ObjectNode o, String name, Interval v) {
        if (v == null) {
            o.putNull(name);
        } else if (v.isExact()) {
            o.put(name, v.value());
        } else {
            o.putNull(name);
            o.put(name + "_lo", v.lo());
            o.put(name + "_hi", v.hi());
        }
    }

    static String text(String input, Configuration canonical, HodgeResult r) {
        StringBuilder sb = new StringBuilder(input);
        sb.append("  canonical ").append(canonical.toText()).append("  dim ").append(r.dim());
        r.chi().ifPresent(c -> sb.append("  chi ").append(c));
        append(sb, "h11", r.h11());
        append(sb, "h21", r.h21());
        if (r.dim() == 4) {
            append(sb, "h31", r.h31());
            append(sb, "h22", r.h22());
        }
        if (r.isProduct() && r.diamond() != null) {
            for (int p = 1; p <= r.dim(); p++) {
                if (r.diamond().h(p, 0) != 0) {
                    sb.append("  h").append(p).append("0 ").append(r.diamond().h(p, 0));
                }
            }
        }
        sb.append("  ").append(r.status().label());
        if (r.method() != null) {
            sb.append(" (").append(r.method().label()).append(')');
        }
        if (r.isProduct()) {
            sb.append("  product ").append(String.join(" x ", r.factors().stream().map(Configuration::toText).toList()));
        }
        sb.append(String.format(Locale.ROOT, "  %.3fs", r.seconds()));
        if (!r.reason().isEmpty()) {
            sb.append("  ").append(r.reason());
        }
        return sb.toString();
    }

    private static void append(StringBuilder sb, String name, Interval v) {
        if (v != null) {
            sb.append("  ").append(name).append(' ').append(v);
        }
    }

    /** One reference line (the result must not be refused); the source is {@code product} for a product. */
    static String tsv(Configuration canonical, HodgeResult r, boolean fourfoldColumns) {
        StringBuilder sb = new StringBuilder(canonical.toText());
        Interval h21 = r.h21() != null || r.dim() != 2 ? r.h21()
                : Interval.exact(r.diamond() != null ? r.diamond().h(2, 1) : 0);
        sb.append('\t').append(cell(r.h11())).append('\t').append(cell(h21));
        if (fourfoldColumns) {
            sb.append('\t').append(cell(r.h31())).append('\t').append(cell(r.h22()));
        }
        sb.append('\t').append(r.status().label()).append('\t').append(r.isProduct() ? "product" : "computed");
        return sb.toString();
    }

    private static String cell(Interval v) {
        if (v == null) {
            return "-";
        }
        return v.isExact() ? Long.toString(v.value()) : v.lo() + ".." + v.hi();
    }
}
