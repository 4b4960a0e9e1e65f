package org.winnow.bench;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.SplittableRandom;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.DefiningPolynomials;
import org.winnow.geometry.cohomology.transfer.TransferredKoszul;
import org.winnow.geometry.invariants.Blocks;
import org.winnow.geometry.invariants.RandomConfigurations;
import org.winnow.geometry.invariants.Reduction;

/**
 * Cost of the transferred Koszul complex per Calabi-Yau three-fold: exact {@code h^*} of every
 * bundle the Hodge numbers need ({@code O_X(e_r)}, {@code O_X(q_j)}) and the Jacobian rank rho, all
 * by the transferred complex (no spectral-sequence shortcut), on seeded random reduced irreducible
 * matrices.
 *
 * <p>Run after {@code mvn -B -ntp -pl bench -am package -DskipTests}:
 * {@code java -cp bench/target/benchmarks.jar org.winnow.bench.TransferredKoszulBench [count] [maxRows] [maxN] [seed]}.
 * The first tenth of the sample is a warm-up and not reported.
 */
public final class TransferredKoszulBench {
    private TransferredKoszulBench() {}

    public static void main(String[] args) {
        int count = args.length > 0 ? Integer.parseInt(args[0]) : 200;
        int maxRows = args.length > 1 ? Integer.parseInt(args[1]) : 6;
        int maxN = args.length > 2 ? Integer.parseInt(args[2]) : 4;
        long seed = args.length > 3 ? Long.parseLong(args[3]) : 99;
        SplittableRandom random = new SplittableRandom(seed);
        RandomConfigurations configs = new RandomConfigurations(random);
        int warmup = count / 10;
        List<Double> matrixMillis = new ArrayList<>();
        List<Double> rhoMillis = new ArrayList<>();
        long checksum = 0;
        int done = 0;
        while (done < count + warmup) {
            Configuration x = Reduction.reduce(configs.calabiYau(3, maxRows, maxN));
            if (x.dimension() != 3 || Blocks.of(x).count() != 1 || x.cols() > 9) {
                continue;
            }
            TransferredKoszul tk = TransferredKoszul.of(DefiningPolynomials.random(x, random.nextLong()));
            long start = System.nanoTime();
            for (int r = 0; r < x.rows(); r++) {
                int[] e = new int[x.rows()];
                e[r] = 1;
                checksum += Arrays.stream(tk.cohomology(e)).sum();
            }
            for (int j = 0; j < x.cols(); j++) {
                int[] qj = new int[x.rows()];
                for (int r = 0; r < qj.length; r++) {
                    qj[r] = x.q(r, j);
                }
                checksum += Arrays.stream(tk.cohomology(qj)).sum();
            }
            long mid = System.nanoTime();
            checksum += tk.jacobianRank(1);
            long end = System.nanoTime();
            if (done++ >= warmup) {
                matrixMillis.add((end - start) / 1e6);
                rhoMillis.add((end - mid) / 1e6);
            }
        }
        System.out.printf(Locale.ROOT, "matrices %d (m <= %d, n_r <= %d, seed %d), checksum %d%n", count, maxRows,
                maxN, seed, checksum);
        report("per matrix (all Hodge bundles + rho)", matrixMillis);
        report("rho alone", rhoMillis);
    }

    private static void report(String label, List<Double> millis) {
        double[] v = millis.stream().mapToDouble(Double::doubleValue).sorted().toArray();
        double mean = Arrays.stream(v).average().orElse(0);
        System.out.printf(Locale.ROOT, "%-40s mean %.2f ms, median %.2f ms, p90 %.2f ms, max %.2f ms%n", label, mean,
                v[v.length / 2], v[(int) (v.length * 0.9)], v[v.length - 1]);
    }
}
