package org.winnow.app.hodge;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.util.Optional;
import java.util.concurrent.Callable;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import org.winnow.app.cli.Exit;
import org.winnow.app.cli.Limits;
import org.winnow.app.cli.WinnowCli;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.ConfigurationFormatException;
import org.winnow.geometry.ConfigurationText;
import org.winnow.geometry.ConfigurationValidator;
import org.winnow.geometry.invariants.CheapInvariants;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.TripleIntersection;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code winnow invariants}: the cheap exact invariants of Calabi-Yau configuration matrices given
 * on the command line or in files. Every bad input gets one line on stderr and the run goes on;
 * the exit code is 2 if any input was bad.
 */
@Command(name = "invariants", mixinStandardHelpOptions = true,
        description = {
            "Print the cheap exact invariants of Calabi-Yau configuration matrices.",
            "Euler characteristic, blocks and degree; c2.J and triple intersections of three-folds; int c2^2 of "
                    + "four-folds. Invariants are given for the canonical form, in its row order (0-based row "
                    + "indices)."})
public final class InvariantsCommand implements Callable<Integer> {
    private static final ObjectMapper JSON = new ObjectMapper();

    @Spec
    CommandSpec spec;

    @Option(names = "--json", description = "One JSON object a line instead of text for humans.")
    boolean json;

    @picocli.CommandLine.Mixin
    ConfigurationInputs inputs = new ConfigurationInputs();

    private final InvariantCalculator calculator = new InvariantCalculator();
    private PrintWriter out;
    private PrintWriter err;
    private int bad;

    @Override
    public Integer call() {
        out = spec.commandLine().getOut();
        err = spec.commandLine().getErr();
        if (inputs.isEmpty()) {
            return Exit.badInput(err, "invariants", "no configuration given (pass CONFIG arguments or --file F)");
        }
        inputs.forEach(this::process, (name, reason) -> reportBad(name, "", reason), this::progressBar);
        out.flush();
        err.flush();
        return bad == 0 ? 0 : Exit.BAD_INPUT;
    }

    /** A progress bar on stderr for long file runs, only when a person is watching. */
    private ProgressBar progressBar(String name) {
        if (System.console() == null) {
            return null;
        }
        return new ProgressBarBuilder().setTaskName("invariants " + name).setInitialMax(-1)
                .setConsumer(new ConsoleProgressBarConsumer(System.err)).build();
    }

    private void process(String text, int lineNumber, String source) {
        String input = text.strip();
        Configuration c;
        try {
            c = ConfigurationText.parse(input, lineNumber);
        } catch (ConfigurationFormatException e) {
            // The source already names the line; keep the column.
            reportBad(source, input, "column " + e.column() + ": " + stripLinePrefix(e.getMessage()));
            return;
        }
        Optional<String> problem = ConfigurationValidator.problemForCalabiYau(c);
        if (problem.isPresent()) {
            reportBad(source, input, problem.get());
            return;
        }
        try {
            Configuration canonical = c.canonical();
            CheapInvariants inv = calculator.compute(canonical);
            out.println(json ? toJson(input, canonical, inv) : toText(input, canonical, inv));
        } catch (IllegalArgumentException | ArithmeticException e) {
            reportBad(source, input, e.getMessage());
        }
    }

    private static String stripLinePrefix(String message) {
        int afterColumn = message.indexOf(": ");
        return message.startsWith("line ") && afterColumn >= 0 ? message.substring(afterColumn + 2) : message;
    }

    private void reportBad(String source, String input, String reason) {
        bad++;
        String what = input.isEmpty() ? source : source + " '" + Limits.excerpt(input) + "'";
        err.println("winnow invariants: " + what + ": " + reason);
    }

    static String toJson(String input, Configuration canonical, CheapInvariants inv) {
        ObjectNode o = JSON.createObjectNode();
        o.put("input", input);
        o.put("canonical", canonical.toText());
        o.put("dim", inv.dim());
        o.put("rows", canonical.rows());
        o.put("cols", canonical.cols());
        o.put("chi", inv.chi());
        o.put("blocks", inv.blocks());
        o.put("degree", inv.degree());
        if (inv.dim() == 3) {
            ArrayNode c2 = o.putArray("c2J");
            for (long v : inv.c2J()) {
                c2.add(v);
            }
            ObjectNode triple = o.putObject("triple");
            for (TripleIntersection t : inv.triple()) {
                triple.put(t.r() + "," + t.s() + "," + t.t(), t.value());
            }
        }
        inv.c2sq().ifPresent(v -> o.put("c2sq", v));
        try {
            return JSON.writeValueAsString(o);
        } catch (IOException e) {
            throw new IllegalStateException("cannot write JSON for " + input, e);
        }
    }

    static String toText(String input, Configuration canonical, CheapInvariants inv) {
        StringBuilder sb = new StringBuilder();
        sb.append(input).append("  canonical ").append(canonical.toText())
                .append("  dim ").append(inv.dim())
                .append("  chi ").append(inv.chi())
                .append("  blocks ").append(inv.blocks())
                .append("  degree ").append(inv.degree());
        if (inv.dim() == 3) {
            sb.append("  c2.J");
            for (long v : inv.c2J()) {
                sb.append(' ').append(v);
            }
            sb.append("  d_rst");
            for (TripleIntersection t : inv.triple()) {
                sb.append(' ').append(t.r()).append(',').append(t.s()).append(',').append(t.t())
                        .append('=').append(t.value());
            }
        }
        inv.c2sq().ifPresent(v -> sb.append("  int c2^2 ").append(v));
        return sb.toString();
    }
}
