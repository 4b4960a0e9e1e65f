package org.winnow.scorer.model;

import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Prediction;

/**
 * Damaged model files whose checksum matches (the payload edited, then the header's SHA-256 recomputed,
 * as a hostile or buggy writer would): each must be refused on load with one line naming the file, or
 * load and then predict without an exception and with confidence and novelty in [0, 1]. Used to load
 * and then throw in the middle of {@code scan} and {@code report}.
 */
class ModelFileFuzzTest {
    private static final Path DEMO_MODEL = Path.of("..", "demo-data", "threefolds-1pct.wnm");
    private static final List<String> PROBES = List.of("4:5", "2:3/2:3", "1:2/3:4", "3:3,0,1/3:0,3,1",
            "2:3,0/2:0,3/1:1,1", "1:0,2/1:2,0/2:1,2", "5:6", "1:1,1/1:1,1/3:2,2");

    @Test
    void rechecksummedDamagedPayloadsAreRefusedOrPredictSanely(@TempDir Path tmp) throws IOException {
        assumeTrue(Files.isReadable(DEMO_MODEL), "demo model not beside the module");
        byte[] file = Files.readAllBytes(DEMO_MODEL);
        byte[] payload = Arrays.copyOfRange(file, ModelFile.HEADER, file.length);
        SplittableRandom rnd = new SplittableRandom(20261205L);
        int refused = 0;
        int loaded = 0;
        for (int trial = 0; trial < 300; trial++) {
            byte[] p = payload.clone();
            damage(p, rnd);
            Path f = tmp.resolve("m" + trial + ".wnm");
            ModelFile.write(f, p);
            FrozenModel model;
            try {
                model = FrozenModel.load(f);
            } catch (ModelFileException e) {
                assertTrue(e.getMessage().startsWith(f.toString()) && !e.getMessage().contains("\n"),
                        "trial " + trial + ": " + e.getMessage());
                refused++;
                continue;
            } catch (RuntimeException | OutOfMemoryError e) {
                fail("trial " + trial + ": load threw " + e);
                return;
            }
            loaded++;
            Predictor predictor = model.newPredictor();
            for (String probe : PROBES) {
                Configuration c = Configuration.parse(probe);
                try {
                    Prediction pr = predictor.predict(c, -200);
                    assertTrue(pr.confidence() >= 0 && pr.confidence() <= 1 && pr.novelty() >= 0 && pr.novelty() <= 1,
                            "trial " + trial + " " + probe + ": " + pr);
                } catch (RuntimeException e) {
                    fail("trial " + trial + ": a model that loaded threw on " + probe + ": " + e + " at " + Arrays.toString(Arrays.copyOf(e.getStackTrace(), 4)));
                }
            }
        }
        assertTrue(refused > 50 && loaded > 20, "refused " + refused + ", loaded " + loaded);
        System.out.printf("model file fuzz: 300 re-checksummed damaged payloads, %d refused, %d loaded and predicted%n",
                refused, loaded);
    }

    /** One of: a flipped byte, a double overwritten by NaN, infinity or a negative, a run of bytes zeroed. */
    private static void damage(byte[] p, SplittableRandom rnd) {
        int at = rnd.nextInt(p.length);
        switch (rnd.nextInt(4)) {
            case 0 -> p[at] ^= (byte) (1 << rnd.nextInt(8));
            case 1 -> {
                at = Math.min(at, p.length - 8);
                double[] odd = {Double.NaN, Double.POSITIVE_INFINITY, -1.0, 1e300, 0.0};
                ByteBuffer.wrap(p, at, 8).putDouble(odd[rnd.nextInt(odd.length)]);
            }
            case 2 -> Arrays.fill(p, at, Math.min(p.length, at + 1 + rnd.nextInt(16)), (byte) 0);
            default -> p[at] = (byte) 0xFF;
        }
    }
}
