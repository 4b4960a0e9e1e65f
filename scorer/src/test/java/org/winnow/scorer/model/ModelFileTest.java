package org.winnow.scorer.model;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.pipeline.Prediction;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import org.winnow.scorer.reference.LabelledExample;

class ModelFileTest {
    @TempDir
    Path dir;

    private Path file;
    private byte[] good;

    @BeforeEach
    void writeModel() throws IOException {
        file = dir.resolve("m.wnm");
        ModelTestSupport.smallModel().save(file);
        good = Files.readAllBytes(file);
    }

    @Test
    void roundTripGivesIdenticalPredictions() throws IOException {
        FrozenModel original = ModelTestSupport.smallModel();
        FrozenModel loaded = FrozenModel.load(file);
        assertEquals(original.checksum(), loaded.checksum());
        assertEquals(64, loaded.checksum().length());
        assertArrayEquals(original.parameters(), loaded.parameters(), 0);
        Predictor a = original.newPredictor();
        Predictor b = loaded.newPredictor();
        for (LabelledExample ex : SyntheticScenario.generate(200, 99)) {
            Prediction pa = a.predict(ex.config(), ex.chi());
            Prediction pb = b.predict(ex.config(), ex.chi());
            assertEquals(pa.h11(), pb.h11());
            assertEquals(pa.confidence(), pb.confidence(), 0);
            assertEquals(pa.novelty(), pb.novelty(), 0);
            assertEquals(a.nearestDistance(), b.nearestDistance(), 0);
            assertEquals(pa.nearestReference(), pb.nearestReference());
            assertArrayEquals(a.neighbourH11(), b.neighbourH11());
        }
        assertEquals(original.metadata(), loaded.metadata());
    }

    @Test
    void savingTwiceGivesTheSameBytes() throws IOException {
        Path again = dir.resolve("again.wnm");
        FrozenModel.load(file).save(again);
        assertArrayEquals(good, Files.readAllBytes(again));
    }

    @Test
    void truncatedFileIsRefused() throws IOException {
        for (int cut : new int[] {3, ModelFile.HEADER - 1, good.length / 2, good.length - 1}) {
            Files.write(file, java.util.Arrays.copyOf(good, cut));
            String msg = refusal();
            assertTrue(msg.startsWith(file + ": truncated model file"), msg);
        }
    }

    @Test
    void wrongMagicIsRefused() throws IOException {
        byte[] bad = good.clone();
        bad[0] = 'X';
        Files.write(file, bad);
        assertEquals(file + ": not a winnow model file (wrong magic header)", refusal());
    }

    @Test
    void wrongVersionIsRefused() throws IOException {
        byte[] bad = good.clone();
        ByteBuffer.wrap(bad).putInt(ModelFile.MAGIC.length, 7);
        Files.write(file, bad);
        assertEquals(file + ": unsupported model format version 7 (this build reads version 4)", refusal());
    }

    @Test
    void aVersionThreeFileIsRefusedWithTheRetrainingCommand() throws IOException {
        byte[] old = good.clone();
        ByteBuffer.wrap(old).putInt(ModelFile.MAGIC.length, 3);
        Files.write(file, old);
        assertEquals(file + ": model format version 3 predates the tuple anchor (this build reads version 4); retrain it "
                + "with 'winnow train --reference LABELLED.tsv --out MODEL.wnm'", refusal());
    }

    @Test
    void everySingleBitFlipInPayloadIsRefusedByTheChecksum() throws IOException {
        for (int pos = ModelFile.HEADER; pos < good.length; pos += Math.max(1, good.length / 97)) {
            byte[] bad = good.clone();
            bad[pos] ^= (byte) (1 << (pos % 8));
            Files.write(file, bad);
            assertTrue(refusal().contains("checksum mismatch"), "flip at " + pos);
        }
    }

    @Test
    void bitFlipsInTheHeaderAreRefused() throws IOException {
        for (int pos = 0; pos < ModelFile.HEADER; pos++) {
            byte[] bad = good.clone();
            bad[pos] ^= 1;
            Files.write(file, bad);
            String msg = refusal();
            assertTrue(msg.startsWith(file + ": ") && !msg.contains("\n"), msg);
        }
    }

    @Test
    void missingFileIsRefusedWithOneLine() {
        Path missing = dir.resolve("nope.wnm");
        ModelFileException e = assertThrows(ModelFileException.class, () -> FrozenModel.load(missing));
        assertTrue(e.getMessage().startsWith(missing + ": cannot read the model file"), e.getMessage());
    }

    @Test
    void payloadOfAnUnregisteredShapeIsRefused() throws IOException {
        // A well-formed container around bytes that are not a payload: checksum passes, decoding fails.
        byte[] junk = "not kryo at all".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        ModelFile.write(file, junk);
        String msg = refusal();
        assertTrue(msg.startsWith(file + ": payload does not decode") && !msg.contains("\n"), msg);
    }

    private String refusal() {
        ModelFileException e = assertThrows(ModelFileException.class, () -> FrozenModel.load(file));
        return e.getMessage();
    }
}
