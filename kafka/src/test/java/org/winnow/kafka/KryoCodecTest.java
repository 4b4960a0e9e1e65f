package org.winnow.kafka;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

class KryoCodecTest {
    private static final KryoCodec CODEC = WireTypes.base().register(Sample.class, 900).build();

    record Sample(long id, Configuration config, double[] scores, String note) {
    }

    record Unregistered(int x) {
    }

    @Test
    void randomConfigurationsRoundTripExactly() {
        SplittableRandom random = new SplittableRandom(20261201L);
        for (int i = 0; i < 2000; i++) {
            Configuration c = randomConfiguration(random);
            byte[] bytes = CODEC.encode(c);
            assertEquals(c, CODEC.decode(bytes, Configuration.class), c.toText());
            // Shape (2 bytes) plus one byte per dimension and per degree, all below 128.
            assertEquals(2 + c.rows() * (1 + c.cols()), bytes.length, c.toText());
        }
    }

    @Test
    void recordsWithNestedRegisteredTypesRoundTrip() {
        Sample s = new Sample(42L, Configuration.parse("2:3,0/2:0,3/1:1,1"), new double[] {0.5, -1.25}, "kept");
        Sample back = CODEC.decode(CODEC.encode(s), Sample.class);
        assertEquals(s.id(), back.id());
        assertEquals(s.config(), back.config());
        assertArrayEquals(s.scores(), back.scores());
        assertEquals(s.note(), back.note());
    }

    @Test
    void stageRecordsRoundTripWithAndWithoutADerivedH21() {
        KryoCodec stages = WireTypes.stages().build();
        Configuration c = Configuration.parse("2:3,0/2:0,3/1:1,1");
        org.winnow.pipeline.Candidate cand = new org.winnow.pipeline.Candidate(c, c.toText(), 3, 41L);
        var exact = new org.winnow.pipeline.ExactInvariants(3, -108, 3, 2, 1);
        for (Integer h21 : new Integer[] {null, 57}) {
            var p = new org.winnow.pipeline.Prediction(3, 0.75, h21, h21 == null ? null : 2, h21 == null ? null : 0,
                    0.125, "4:5");
            var s = org.winnow.pipeline.Scored.of(cand, exact, p, org.winnow.pipeline.Reason.KEPT_LOW_CONFIDENCE);
            assertEquals(s, stages.decode(stages.encode(s), org.winnow.pipeline.Scored.class));
        }
        assertEquals(cand, stages.decode(stages.encode(cand), org.winnow.pipeline.Candidate.class));
    }

    @Test
    void shardProgressRoundTripsWithItsBadLines() {
        KryoCodec stages = WireTypes.stages().build();
        var report = new org.winnow.pipeline.SourceReport(40, 2, 36, 5, 2,
                List.of(new org.winnow.pipeline.BadInput(7, "line 7: expected ':'"),
                        new org.winnow.pipeline.BadInput(19, "not Calabi-Yau")), true);
        ShardProgress p = new ShardProgress(0, 36, report);
        assertEquals(p, stages.decode(stages.encode(p), ShardProgress.class));
    }

    @Test
    void anUnregisteredClassIsRefusedOnWrite() {
        var e = assertThrows(IllegalArgumentException.class, () -> CODEC.encode(new Unregistered(1)));
        assertTrue(e.getMessage().contains("not registered"), e.getMessage());
    }

    @Test
    void bytesThatAreNotOneRecordAreRefused() {
        byte[] good = CODEC.encode(Configuration.parse("4:5"));
        byte[] truncated = java.util.Arrays.copyOf(good, good.length - 1);
        byte[] trailing = java.util.Arrays.copyOf(good, good.length + 1);
        assertThrows(WireFormatException.class, () -> CODEC.decode(truncated, Configuration.class));
        assertThrows(WireFormatException.class, () -> CODEC.decode(trailing, Configuration.class));
        // A shape of 0 rows is outside what a configuration may be.
        assertThrows(WireFormatException.class, () -> CODEC.decode(new byte[] {0, 1}, Configuration.class));
        // A dimension above the supported maximum is refused by Configuration.of, so by the decoder too.
        assertThrows(WireFormatException.class, () -> CODEC.decode(new byte[] {1, 1, 40, 5}, Configuration.class));
    }

    @Test
    void idsAndClassesMustBeUnique() {
        assertThrows(IllegalArgumentException.class,
                () -> WireTypes.base().register(Sample.class, WireTypes.CONFIGURATION));
        assertThrows(IllegalArgumentException.class,
                () -> WireTypes.base().register(Configuration.class, 901));
        assertThrows(IllegalArgumentException.class, () -> KryoCodec.builder().register(Sample.class, 5));
    }

    @Test
    void oneCodecServesManyThreadsWithIdenticalBytes() throws Exception {
        SplittableRandom random = new SplittableRandom(7L);
        List<Configuration> configs = new ArrayList<>();
        for (int i = 0; i < 500; i++) {
            configs.add(randomConfiguration(random));
        }
        List<byte[]> expected = configs.stream().map(CODEC::encode).toList();
        ExecutorService pool = Executors.newFixedThreadPool(4);
        try {
            List<Future<Boolean>> results = new ArrayList<>();
            for (int t = 0; t < 8; t++) {
                results.add(pool.submit(() -> {
                    for (int i = 0; i < configs.size(); i++) {
                        byte[] b = CODEC.encode(configs.get(i));
                        if (!java.util.Arrays.equals(b, expected.get(i))
                                || !CODEC.decode(b, Configuration.class).equals(configs.get(i))) {
                            return false;
                        }
                    }
                    return true;
                }));
            }
            for (Future<Boolean> f : results) {
                assertTrue(f.get());
            }
        } finally {
            pool.shutdownNow();
        }
    }

    static Configuration randomConfiguration(SplittableRandom random) {
        int rows = 1 + random.nextInt(5);
        int cols = 1 + random.nextInt(6);
        int[] n = new int[rows];
        int[][] q = new int[rows][cols];
        for (int r = 0; r < rows; r++) {
            n[r] = 1 + random.nextInt(5);
            for (int j = 0; j < cols; j++) {
                q[r][j] = random.nextInt(6);
            }
        }
        return Configuration.of(n, q);
    }
}
