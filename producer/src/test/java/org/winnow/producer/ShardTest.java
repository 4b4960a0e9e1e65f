package org.winnow.producer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class ShardTest {
    @Test
    void shardsAreDisjointAndCoverTheSpace() {
        Enumerator enumerator = new Enumerator();
        Bounds b = Bounds.complete(3).withRows(1, 6);
        List<String> whole = new ArrayList<>();
        enumerator.run(b, ExclusionSet.SPLIT, ShardSpec.ALL, e -> whole.add(e.toLine()));
        whole.sort(null);
        assertTrue(whole.size() > 1000);
        for (int count : new int[] {1, 2, 7}) {
            List<String> union = new ArrayList<>();
            for (ShardSpec s : ShardPlan.of(count).shards()) {
                int before = union.size();
                enumerator.run(b, ExclusionSet.SPLIT, s, e -> union.add(e.toLine()));
                assertTrue(count == 1 || union.size() - before < whole.size(), "shard " + s + " is not the whole space");
            }
            union.sort(null);
            // equal sorted lists of distinct lines: no overlap and nothing missing
            assertEquals(whole, union, count + " shards");
        }
    }

    @Test
    void shardSpecsAndPlansRoundTripAsText() {
        assertEquals(new ShardSpec(3, 7), ShardSpec.parse("3/7"));
        ShardPlan plan = ShardPlan.of(5);
        assertEquals(plan, ShardPlan.parse(plan.toText()));
        assertEquals("0/5", plan.toText().lines().findFirst().orElseThrow());
    }
}
