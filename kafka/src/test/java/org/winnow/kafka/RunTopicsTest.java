package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashSet;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class RunTopicsTest {
    @Test
    void namesEveryTopicAfterTheRun() {
        RunTopics t = new RunTopics("survey-7");
        assertEquals("winnow.survey-7.candidates", t.candidates());
        assertEquals("winnow.survey-7.scored", t.scored());
        assertEquals("winnow.survey-7.plan", t.plan());
        assertEquals("winnow.survey-7.metrics", t.metrics());
        assertEquals("winnow.survey-7.run", t.descriptor());
        assertEquals(5, new HashSet<>(t.all()).size());
    }

    @Test
    void twoRunsNeverShareATopic() {
        var a = new HashSet<>(new RunTopics("a").all());
        a.retainAll(new RunTopics("a_b").all());
        assertTrue(a.isEmpty());
    }

    @Test
    void refusesRunIdsThatCouldCollideOrAreNotTopicSafe() {
        for (String bad : List.of("", "a.b", "-x", "has space", "x".repeat(65), "ä")) {
            var e = assertThrows(IllegalArgumentException.class, () -> new RunTopics(bad));
            assertTrue(e.getMessage().contains("'" + bad + "'"), e.getMessage());
        }
    }

    @Test
    void descriptorTextRoundTripsAndNamesTheFirstDifference() {
        RunDescriptor d = new RunDescriptor("r1", Map.of("bounds", "rows=1..3 cols<=4", "rules", "h11=4..6 # a=b"));
        assertEquals(d, RunDescriptor.parse(d.toText()));
        assertNull(d.firstDifference(RunDescriptor.parse(d.toText())));
        RunDescriptor other = new RunDescriptor("r1", Map.of("bounds", "rows=1..4 cols<=4", "rules", "h11=4..6 # a=b"));
        assertEquals("bounds: 'rows=1..3 cols<=4' vs 'rows=1..4 cols<=4'", d.firstDifference(other));
        assertEquals("extra: (unset) vs 'x'",
                new RunDescriptor("r1", Map.of()).firstDifference(new RunDescriptor("r1", Map.of("extra", "x"))));
    }

    @Test
    void layoutRefusesNonsense() {
        assertThrows(IllegalArgumentException.class, () -> TopicLayout.singleBroker(0));
        assertThrows(IllegalArgumentException.class, () -> new TopicLayout(4, (short) 0));
    }
}
