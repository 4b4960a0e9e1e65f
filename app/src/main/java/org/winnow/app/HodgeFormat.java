package org.winnow.app;

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
 * for the reference reader.
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
        sb.append("  ").append(r.status().label());
        if (r.method() != null) {
            sb.append(" (").append(r.method().label()).append(')');
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

    /** One reference line (the result must not be refused). */
    static String tsv(Configuration canonical, HodgeResult r, boolean fourfoldColumns) {
        StringBuilder sb = new StringBuilder(canonical.toText());
        Interval h21 = r.h21() == null && r.dim() == 2 ? Interval.exact(0) : r.h21();
        sb.append('\t').append(cell(r.h11())).append('\t').append(cell(h21));
        if (fourfoldColumns) {
            sb.append('\t').append(cell(r.h31())).append('\t').append(cell(r.h22()));
        }
        sb.append('\t').append(r.status().label()).append('\t').append("computed");
        return sb.toString();
    }

    private static String cell(Interval v) {
        if (v == null) {
            return "-";
        }
        return v.isExact() ? Long.toString(v.value()) : v.lo() + ".." + v.hi();
    }
}
