package org.winnow.app.model;

import org.winnow.app.cli.Exit;
import org.winnow.app.cli.WinnowCli;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;
import org.winnow.scorer.reference.synthetic.SyntheticScenario;
import picocli.CommandLine;

class ExportWeightsCommandTest {
    @TempDir
    static Path dir;

    static FrozenModel model;
    static Path modelFile;

    @BeforeAll
    static void train() throws Exception {
        TrainingOptions options = TrainingOptions.defaults(4, 3).withArchitecture(new Architecture(6, 2, 10, 4))
                .withEpochs(1).withThreads(1);
        model = Trainer.train(SyntheticScenario.generate(200, 3), options, TrainingProgress.silent());
        modelFile = dir.resolve("m.wnm");
        model.save(modelFile);
    }

    private static int run(StringWriter err, String... args) {
        CommandLine cl = WinnowCli.commandLine();
        cl.setErr(new PrintWriter(err));
        return cl.execute(args);
    }

    @Test
    void blocksInLayoutOrderRebuildTheParameterVector() throws Exception {
        Path out = dir.resolve("w.json");
        assertEquals(0, run(new StringWriter(), "export-weights", "--model", modelFile.toString(), "--out",
                out.toString()));
        JsonNode w = new ObjectMapper().readTree(out.toFile());
        assertEquals("winnow-weights", w.get("format").asText());
        assertEquals(model.checksum(), w.get("model_checksum").asText());
        JsonNode layers = w.get("layers");
        List<Double> flat = new ArrayList<>();
        flatten(layers.get("row_encoder").get("weight"), flat);
        flatten(layers.get("row_encoder").get("bias"), flat);
        flatten(layers.get("col_encoder").get("weight"), flat);
        flatten(layers.get("col_encoder").get("bias"), flat);
        for (JsonNode round : layers.get("rounds")) {
            for (String block : new String[] {"col_self", "col_msg", "col_bias", "row_self", "row_msg", "row_bias"}) {
                flatten(round.get(block), flat);
            }
        }
        flatten(layers.get("readout_hidden").get("weight"), flat);
        flatten(layers.get("readout_hidden").get("bias"), flat);
        flatten(layers.get("readout_out").get("weight"), flat);
        flatten(layers.get("readout_out").get("bias"), flat);
        double[] p = model.parameters();
        assertEquals(p.length, flat.size());
        for (int i = 0; i < p.length; i++) {
            assertEquals(p[i], flat.get(i), 0.0, "parameter " + i); // JSON doubles round-trip exactly
        }
        assertEquals(6, layers.get("row_encoder").get("weight").size());
        assertEquals(Architecture.ROW_FEATURES, layers.get("row_encoder").get("weight").get(0).size());
        JsonNode ref = w.get("reference");
        assertEquals(model.reference().size(), ref.get("embeddings").size());
        assertEquals(model.reference().embeddings()[5], ref.get("embeddings").get(1).get(1).asDouble(), 0.0);
        assertEquals(model.reference().h11(7), ref.get("h11").get(7).asInt());
    }

    @Test
    void missingModelIsOneLineAndExitTwo() {
        StringWriter err = new StringWriter();
        int code = run(err, "export-weights", "--model", dir.resolve("nope.wnm").toString(), "--out",
                dir.resolve("x.json").toString());
        assertEquals(Exit.BAD_INPUT, code);
        String msg = err.toString().strip();
        assertTrue(msg.startsWith("winnow export-weights: ") && msg.contains("nope.wnm") && !msg.contains("\n"), msg);
    }

    private static void flatten(JsonNode node, List<Double> out) {
        if (node.isArray()) {
            for (JsonNode x : node) {
                flatten(x, out);
            }
        } else {
            out.add(node.asDouble());
        }
    }
}
