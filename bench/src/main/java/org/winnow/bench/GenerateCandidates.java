package org.winnow.bench;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;
import java.util.concurrent.Callable;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.producer.Bounds;
import org.winnow.producer.Enumerator;
import org.winnow.producer.ExclusionSet;
import org.winnow.producer.ShardSpec;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * Writes a bench candidate file, one {@code configuration<TAB>chi} a line, each configuration in
 * canonical form and with its exact chi from the geometry module's calculator. Same options, same
 * file, byte for byte.
 *
 * <p>{@code --dim 3} (the default): {@code count} seeded random three-fold matrices drawn like the
 * synthetic development scenario (K in 1..5, sum n = K + 3, every row summing to n_r + 1, every
 * column to at least 2; repeats allowed). Repeats are many: the three-fold space is small (10^5 draws
 * give under 6,000 canonical forms), so a deduplicating scan scores only the distinct lines.
 *
 * <p>{@code --dim 4}: what the producer gives, distinct four-fold matrices of the enumeration under
 * {@code --rules} (default {@code lossless}, the producer's default) with at most {@code --max-rows} rows, taken at an even stride over the whole
 * enumeration so that every row count is represented in proportion (the enumeration's first matrices
 * are all small). If the space holds fewer than {@code count} matrices, all of them are written. The
 * seed is not used: the enumeration is deterministic.
 *
 * <p>{@code java -cp bench/target/benchmarks.jar org.winnow.bench.GenerateCandidates --dim 4 --count 100000 --out c.tsv}
 */
@Command(name = "generate-candidates", mixinStandardHelpOptions = true)
public final class GenerateCandidates implements Callable<Integer> {
    @Option(names = "--count", required = true, description = "Number of candidates.")
    long count;

    @Option(names = "--seed", defaultValue = "7", description = "Seed (default ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--out", required = true, description = "Output file.")
    Path out;

    @Option(names = "--dim", defaultValue = "3", description = "3: synthetic draws; 4: the producer's enumeration (default ${DEFAULT-VALUE}).")
    int dim;

    @Option(names = "--rules", defaultValue = "lossless",
            description = "Rule set of the enumeration, --dim 4 only: base, split, lossless or short (default ${DEFAULT-VALUE}).")
    String rules;

    @Option(names = "--max-rows", defaultValue = "7", description = "Most rows, --dim 4 only (default ${DEFAULT-VALUE}).")
    int maxRows;

    public static void main(String[] args) {
        System.exit(new CommandLine(new GenerateCandidates()).execute(args));
    }

    @Override
    public Integer call() throws IOException {
        if (dim == 3) {
            write(count, seed, out);
        } else if (dim == 4) {
            ExclusionSet ruleSet;
            try {
                ruleSet = ExclusionSet.byName(rules);
            } catch (IllegalArgumentException e) {
                System.err.println("generate-candidates: --rules: " + e.getMessage());
                return 2;
            }
            long written = writeEnumerated(count, maxRows, ruleSet, out);
            if (written < count) {
                System.err.printf("generate-candidates: the space holds only %d matrices; all written%n", written);
            }
        } else {
            System.err.println("generate-candidates: --dim must be 3 or 4: " + dim);
            return 2;
        }
        return 0;
    }

    /**
     * Writes up to {@code count} four-fold matrices of the enumeration under {@code rules} with at most
     * {@code maxRows} rows, at an even stride over the whole enumeration; returns how many.
     */
    static long writeEnumerated(long count, int maxRows, ExclusionSet rules, Path out) throws IOException {
        Bounds complete = Bounds.complete(4);
        Bounds bounds = new Bounds(4, complete.minRows(), maxRows, complete.maxCols(), complete.maxN(),
                complete.maxEntry());
        Enumerator enumerator = new Enumerator();
        long total = enumerator.count(bounds, rules, ShardSpec.ALL).total();
        long stride = Math.max(1, total / Math.max(1, count));
        InvariantCalculator calculator = new InvariantCalculator();
        long[] seen = {0, 0};
        try (BufferedWriter w = Files.newBufferedWriter(out, StandardCharsets.UTF_8)) {
            enumerator.run(bounds, rules, ShardSpec.ALL, e -> {
                if (seen[0]++ % stride != 0 || seen[1] >= count) {
                    return;
                }
                seen[1]++;
                Configuration c = e.configuration();
                try {
                    w.write(new CandidateLine(c, calculator.chi(c)).format());
                    w.write('\n');
                } catch (IOException ex) {
                    throw new UncheckedIOException(ex);
                }
            });
        } catch (UncheckedIOException e) {
            throw e.getCause();
        }
        return seen[1];
    }

    /** Writes the file; see the class comment. */
    static void write(long count, long seed, Path out) throws IOException {
        SplittableRandom rng = new SplittableRandom(seed);
        InvariantCalculator calculator = new InvariantCalculator();
        try (BufferedWriter w = Files.newBufferedWriter(out, StandardCharsets.UTF_8)) {
            for (long i = 0; i < count; i++) {
                Configuration c = SyntheticScenario.draw(rng).canonical();
                w.write(new CandidateLine(c, calculator.chi(c)).format());
                w.write('\n');
            }
        }
    }
}
