package org.winnow.bench;

import java.util.HashSet;
import java.util.Locale;
import java.util.Set;
import java.util.SplittableRandom;
import org.winnow.pipeline.CandidateKeys;
import org.winnow.pipeline.SeenKeys;

/**
 * Heap bytes a key of the scan's duplicate check takes: {@link SeenKeys} against the
 * {@code HashSet<String>} it replaced, filled with the same {@code n} distinct keys of configuration-text
 * length (seeded, 30 to 64 characters, the plain-key range of {@link CandidateKeys}). The heap is read
 * after repeated collections, so the figure is what stays live.
 *
 * <p>{@code java -Xmx4g -cp bench/target/benchmarks.jar org.winnow.bench.KeySetFootprint 1000000}
 */
public final class KeySetFootprint {
    private KeySetFootprint() {}

    public static void main(String[] args) throws InterruptedException {
        int n = args.length > 0 ? Integer.parseInt(args[0]) : 1_000_000;
        long base = live();
        Set<String> strings = new HashSet<>();
        fill(n, k -> strings.add(k));
        long afterStrings = live();
        System.out.printf(Locale.ROOT, "HashSet<String>: %d keys, %.1f bytes a key%n", strings.size(),
                (afterStrings - base) / (double) n);
        strings.clear();
        base = live();
        SeenKeys seen = new SeenKeys(SeenKeys.limitForThisHeap());
        fill(n, seen::add);
        long afterSeen = live();
        System.out.printf(Locale.ROOT, "SeenKeys:        %d keys, %.1f bytes a key (limit in this heap %,d keys)%n",
                seen.size(), (afterSeen - base) / (double) n, seen.maxKeys());
    }

    private static void fill(int n, java.util.function.Predicate<String> add) {
        SplittableRandom rnd = new SplittableRandom(3);
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < n; i++) {
            sb.setLength(0);
            sb.append(i).append(':');
            int len = 30 + rnd.nextInt(35);
            while (sb.length() < len) {
                sb.append(rnd.nextInt(3)).append(sb.length() % 6 == 5 ? '/' : ',');
            }
            add.test(CandidateKeys.of(sb.toString()));
        }
    }

    private static long live() throws InterruptedException {
        Runtime rt = Runtime.getRuntime();
        long used = Long.MAX_VALUE;
        for (int i = 0; i < 5; i++) {
            System.gc();
            Thread.sleep(50);
            used = Math.min(used, rt.totalMemory() - rt.freeMemory());
        }
        return used;
    }
}
