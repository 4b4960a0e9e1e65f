package org.winnow.bench;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;
import java.util.concurrent.Callable;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.scorer.model.synthetic.SyntheticScenario;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * Writes a bench candidate file: {@code count} seeded random three-fold configuration matrices
 * (drawn like the synthetic development scenario: K in 1..5, sum n = K + 3, every row summing to
 * n_r + 1, every column to at least 2; repeats allowed), each in canonical form and with its exact
 * chi from the geometry module's calculator. Same seed and count, same file, byte for byte.
 *
 * <p>Repeats are many: the three-fold space is small (10^5 draws give under 6,000 canonical forms),
 * so a deduplicating scan scores only the distinct lines; the canonical text makes them easy to pick
 * out ({@code awk -F'\t' '!seen[$1]++'}).
 *
 * <p>{@code java -cp bench/target/benchmarks.jar org.winnow.bench.GenerateCandidates --count 1000000 --seed 7 --out c.tsv}
 */
@Command(name = "generate-candidates", mixinStandardHelpOptions = true)
public final class GenerateCandidates implements Callable<Integer> {
    @Option(names = "--count", required = true, description = "Number of candidates.")
    long count;

    @Option(names = "--seed", defaultValue = "7", description = "Seed (default ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--out", required = true, description = "Output file.")
    Path out;

    public static void main(String[] args) {
        System.exit(new CommandLine(new GenerateCandidates()).execute(args));
    }

    @Override
    public Integer call() throws IOException {
        write(count, seed, out);
        return 0;
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
