package org.winnow.app.model;

import java.io.IOException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.reference.ReferenceTsv;

/**
 * Reads a reference file for the model commands: keeps the exact rows, computes each row's chi with
 * the exact invariant calculator, and counts rows whose labels contradict that chi (for a three-fold
 * {@code chi = 2(h11 - h21)}, for a four-fold {@code chi = 48 + 6(h11 - h21 + h31)}). Products (source
 * {@code product}) are skipped and counted: their holonomy is smaller, those identities do not hold for them,
 * and the model is built for manifolds of full holonomy.
 */
final class ReferenceLoader {
    /** The exact examples, plus how many bounded rows were skipped and how many labels disagree with chi. */
    record Loaded(List<LabelledExample> examples, int bounded, int inconsistent, String firstInconsistent, int products) {}

    /** A reference file that cannot be used; the message is one line naming the file. */
    static final class BadReference extends Exception {
        BadReference(String message) {
            super(message);
        }
    }

    private ReferenceLoader() {}

    static Loaded load(Path path) throws BadReference {
        List<ReferenceTsv.Row> rows;
        try {
            rows = ReferenceTsv.read(path);
        } catch (NoSuchFileException e) {
            throw new BadReference(path + ": no such file");
        } catch (IOException e) {
            throw new BadReference(path + ": cannot read (" + e.getMessage() + ")");
        } catch (IllegalArgumentException e) {
            throw new BadReference(path + ": " + e.getMessage());
        }
        InvariantCalculator calc = new InvariantCalculator();
        List<LabelledExample> out = new ArrayList<>();
        int bounded = 0;
        int inconsistent = 0;
        int products = 0;
        String first = null;
        Integer dim = null;
        for (ReferenceTsv.Row r : rows) {
            if (!r.exact() || r.hodge() == null) {
                bounded++;
                continue;
            }
            if (r.source() == ReferenceTsv.Source.PRODUCT) {
                products++;
                continue;
            }
            Configuration c = r.config();
            if (dim == null) {
                dim = c.dimension();
            } else if (dim != c.dimension()) {
                throw new BadReference(path + ": line " + r.line() + ": dimension " + c.dimension()
                        + " differs from the first exact row's " + dim);
            }
            long chi;
            try {
                chi = calc.chi(c);
            } catch (RuntimeException e) {
                throw new BadReference(path + ": line " + r.line() + ": cannot compute chi of " + c.toText() + " ("
                        + e.getMessage() + ")");
            }
            int[] h = r.hodge();
            Long expected = c.dimension() == 3 ? Long.valueOf(2L * (h[0] - h[1]))
                    : c.dimension() == 4 && h.length == 4 ? Long.valueOf(48L + 6L * (h[0] - h[1] + h[2])) : null;
            if (expected != null && expected != chi) {
                inconsistent++;
                if (first == null) {
                    first = "line " + r.line() + ": " + c.toText() + " has chi " + chi + " but its labels give "
                            + expected;
                }
            }
            out.add(new LabelledExample(c, chi, h));
        }
        if (out.isEmpty()) {
            throw new BadReference(path + ": no exact rows to use");
        }
        return new Loaded(out, bounded, inconsistent, first, products);
    }

    /** Parses {@code h11=V}. */
    static Integer holdoutClass(String spec) {
        if (spec == null) {
            return null;
        }
        String s = spec.strip();
        if (!s.startsWith("h11=")) {
            throw new IllegalArgumentException("--holdout-class must look like h11=V, got '" + spec + "'");
        }
        try {
            return Integer.parseInt(s.substring(4).strip());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("--holdout-class must look like h11=V with an integer V, got '"
                    + spec + "'");
        }
    }
}
