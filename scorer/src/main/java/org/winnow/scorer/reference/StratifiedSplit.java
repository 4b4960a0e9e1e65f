package org.winnow.scorer.reference;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.TreeMap;
import org.winnow.geometry.Checks;

/**
 * A seeded split per h11 class: from a class of s examples, {@code max(round(f s), min(minPerClass, s))}
 * go to training and the rest to the held-out set, so rare classes are represented when they can be.
 *
 * @param train the labelled fraction
 * @param rest everything else
 */
public record StratifiedSplit(List<LabelledExample> train, List<LabelledExample> rest) {
    public static StratifiedSplit of(List<LabelledExample> all, double fraction, int minPerClass, long seed) {
        Checks.requireArgument(fraction > 0 && fraction <= 1, "labelled fraction must be in (0, 1]: %s", fraction);
        Checks.requireArgument(minPerClass >= 0, "minimum per class must not be negative: %s", minPerClass);
        TreeMap<Integer, List<LabelledExample>> byClass = new TreeMap<>();
        for (LabelledExample e : all) {
            byClass.computeIfAbsent(e.h11(), x -> new ArrayList<>()).add(e);
        }
        SplittableRandom rng = new SplittableRandom(seed);
        List<LabelledExample> train = new ArrayList<>();
        List<LabelledExample> rest = new ArrayList<>();
        for (List<LabelledExample> members : byClass.values()) {
            List<LabelledExample> shuffled = new ArrayList<>(members);
            for (int i = shuffled.size() - 1; i > 0; i--) {
                int j = rng.nextInt(i + 1);
                LabelledExample t = shuffled.get(i);
                shuffled.set(i, shuffled.get(j));
                shuffled.set(j, t);
            }
            int s = shuffled.size();
            int take = (int) Math.max(Math.round(fraction * s), Math.min(minPerClass, s));
            train.addAll(shuffled.subList(0, take));
            rest.addAll(shuffled.subList(take, s));
        }
        return new StratifiedSplit(List.copyOf(train), List.copyOf(rest));
    }
}
