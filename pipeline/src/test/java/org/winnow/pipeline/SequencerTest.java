package org.winnow.pipeline;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.metrics.SourceMetrics;

class SequencerTest {
    private static void push(Sequencer s, String... texts) throws InterruptedException {
        for (String t : texts) {
            s.item(Configuration.parse(t), t);
        }
    }

    @Test
    void numbersDistinctKeysInOrderAndCountsDuplicates() throws Exception {
        List<Candidate> out = new ArrayList<>();
        SimpleMeterRegistry reg = new SimpleMeterRegistry();
        Sequencer s = new Sequencer(0, 0, BadInputPolicy.SKIP, out::add, new SourceMetrics(reg));
        push(s, "4:5", "2:3/2:3", "4:5", "3:3,1", "2:3/2:3");
        s.markDone();
        assertEquals(List.of("4:5", "2:3/2:3", "3:3,1"), out.stream().map(Candidate::key).toList());
        assertEquals(List.of(0L, 1L, 2L), out.stream().map(Candidate::seq).toList());
        SourceReport r = s.report();
        assertEquals(5, r.items());
        assertEquals(2, r.duplicates());
        assertEquals(3, r.candidates());
        assertTrue(r.done());
        assertEquals(3.0, reg.get(SourceMetrics.SENT).counter().count());
        assertEquals(2.0, reg.get(SourceMetrics.DUPLICATES).counter().count());
    }

    @Test
    void aDistinctSourceIsNumberedWithoutASeenSet() throws Exception {
        List<Candidate> out = new ArrayList<>();
        Sequencer s = new Sequencer(1, 0, BadInputPolicy.SKIP, out::add, new SourceMetrics(new SimpleMeterRegistry()), false);
        push(s, "4:5", "2:3/2:3", "3:3,1");
        assertEquals(List.of(1L, 2L), out.stream().map(Candidate::seq).toList());
        assertEquals(0, s.report().duplicates());
        assertEquals(3, s.report().candidates());
    }

    @Test
    void resumeSkipsCommittedSeqsButKeepsTheNumbering() throws Exception {
        List<Candidate> out = new ArrayList<>();
        Sequencer s = new Sequencer(2, 0, BadInputPolicy.SKIP, out::add, new SourceMetrics(new SimpleMeterRegistry()));
        push(s, "4:5", "4:5", "2:3/2:3", "3:3,1", "1:2");
        assertEquals(List.of(2L, 3L), out.stream().map(Candidate::seq).toList());
        assertEquals(List.of("3:3,1", "1:2"), out.stream().map(Candidate::key).toList());
        assertEquals(2, s.report().skipped());
        assertEquals(4, s.report().candidates());
    }

    @Test
    void badInputIsListedWithItsLineOrFailsUnderTheStrictPolicy() {
        Sequencer lax = new Sequencer(0, 0, BadInputPolicy.SKIP, c -> {}, new SourceMetrics(new SimpleMeterRegistry()));
        lax.badInput(7, "not Calabi-Yau");
        lax.badInput(9, "ragged rows");
        assertEquals(List.of(new BadInput(7, "not Calabi-Yau"), new BadInput(9, "ragged rows")),
                lax.report().badInputLines());
        assertEquals(2, lax.report().badInputs());
        Sequencer strict = new Sequencer(0, 0, BadInputPolicy.FAIL, c -> {}, new SourceMetrics(new SimpleMeterRegistry()));
        BadInputException e = assertThrows(BadInputException.class, () -> strict.badInput(4, "ragged rows"));
        assertEquals(4, e.line());
        assertEquals("line 4: ragged rows", e.getMessage());
    }

    @Test
    void longCanonicalTextsAreHashedTo128Bits() {
        String shortText = "2:3/2:3";
        assertEquals(shortText, CandidateKeys.of(shortText));
        String longText = "1:2,0,0,0,0,0,0,0,0,0/".repeat(5) + "1:2,0,0,0,0,0,0,0,0,0";
        String key = CandidateKeys.of(longText);
        assertTrue(key.startsWith(CandidateKeys.HASH_PREFIX));
        assertEquals(1 + 32, key.length());
        assertEquals(key, CandidateKeys.of(longText));
        assertTrue(!key.equals(CandidateKeys.of(longText.replaceFirst("1:2", "1:1"))));
    }
}
