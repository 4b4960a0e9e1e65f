package org.winnow.scorer.training;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.TreeMap;

/**
 * Class-balanced pair sampling: the anchor's class is drawn uniformly over classes (not over
 * examples), so a class with three members is seen as often as one with three thousand; half of the
 * pairs are positives (another member of the same class), half negatives (a member of a class drawn
 * uniformly among the others).
 */
final class PairSampler {
    private final int[][] members;
    private final SplittableRandom rng;

    PairSampler(int[] labels, SplittableRandom rng) {
        TreeMap<Integer, List<Integer>> byClass = new TreeMap<>();
        for (int i = 0; i < labels.length; i++) {
            byClass.computeIfAbsent(labels[i], x -> new ArrayList<>()).add(i);
        }
        members = new int[byClass.size()][];
        int c = 0;
        for (List<Integer> list : byClass.values()) {
            members[c++] = list.stream().mapToInt(Integer::intValue).toArray();
        }
        this.rng = rng;
    }

    /** Fills {@code a[i], b[i], same[i]} for {@code i < count}. */
    void sample(int count, int[] a, int[] b, boolean[] same) {
        int classes = members.length;
        for (int i = 0; i < count; i++) {
            int ca = rng.nextInt(classes);
            int[] in = members[ca];
            int px = rng.nextInt(in.length);
            int x = in[px];
            boolean positive = rng.nextBoolean();
            if (positive && in.length >= 2) {
                int py = rng.nextInt(in.length - 1);
                b[i] = in[py >= px ? py + 1 : py];
                same[i] = true;
            } else if (classes >= 2) {
                int cb = rng.nextInt(classes - 1);
                if (cb >= ca) {
                    cb++;
                }
                int[] other = members[cb];
                b[i] = other[rng.nextInt(other.length)];
                same[i] = false;
            } else {
                b[i] = x;
                same[i] = true;
            }
            a[i] = x;
        }
    }
}
