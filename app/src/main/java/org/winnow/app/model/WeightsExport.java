package org.winnow.app.model;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.winnow.geometry.Checks;
import org.winnow.scorer.network.Architecture;
import org.winnow.scorer.model.Calibration;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.network.Normalisation;
import org.winnow.scorer.reference.ReferenceSet;

/**
 * The frozen model as plain JSON (format {@code winnow-weights}, version 2; documented in
 * bench/README.md), so that an independent implementation can recompute embeddings and votes.
 *
 * <p>The flat parameter vector is cut into named blocks in the order the network lays them out: row
 * encoder, column encoder, per round (column self, column message, column bias, row self, row
 * message, row bias), readout hidden layer, readout output layer. Every matrix is written row by
 * row, {@code weight[o][i]} multiplying input {@code i} into output {@code o}. The walk must use up
 * exactly {@link Architecture#parameterCount()} values, which guards the cut against a change of
 * layout; the agreement test in bench guards the order.
 */
final class WeightsExport {
    static final String FORMAT = "winnow-weights";
    static final int VERSION = 2;

    private final ObjectMapper json;
    private final double[] p;
    private int at;

    private WeightsExport(ObjectMapper json, double[] parameters) {
        this.json = json;
        this.p = parameters;
    }

    /** The JSON tree of {@code model}. */
    static ObjectNode of(FrozenModel model, ObjectMapper json) {
        return new WeightsExport(json, model.parameters()).build(model);
    }

    private ObjectNode build(FrozenModel model) {
        Architecture a = model.architecture();
        int h = a.hidden();
        ObjectNode root = json.createObjectNode();
        root.put("format", FORMAT);
        root.put("version", VERSION);
        root.put("model_checksum", model.checksum());
        root.put("dimension", model.dimension());

        ObjectNode arch = root.putObject("architecture");
        arch.put("hidden", h);
        arch.put("rounds", a.rounds());
        arch.put("readout", a.readout());
        arch.put("dim", a.dim());
        arch.put("learned_dim", a.learnedDim());
        arch.put("anchored", a.anchored());
        arch.put("anchor_scale", Architecture.ANCHOR_SCALE);
        arch.put("row_features", Architecture.ROW_FEATURES);
        arch.put("col_features", Architecture.COL_FEATURES);
        arch.put("global_features", Architecture.GLOBAL_FEATURES);
        arch.put("pooled_width", a.pooledWidth());
        arch.put("parameter_count", a.parameterCount());

        Normalisation n = model.normalisation();
        ObjectNode norm = root.putObject("normalisation");
        norm.set("row_mean", vector(n.rowMean()));
        norm.set("row_scale", vector(n.rowScale()));
        norm.set("col_mean", vector(n.colMean()));
        norm.set("col_scale", vector(n.colScale()));
        norm.set("global_mean", vector(n.globalMean()));
        norm.set("global_scale", vector(n.globalScale()));

        ObjectNode layers = root.putObject("layers");
        layers.set("row_encoder", dense(h, Architecture.ROW_FEATURES));
        layers.set("col_encoder", dense(h, Architecture.COL_FEATURES));
        ArrayNode rounds = layers.putArray("rounds");
        for (int t = 0; t < a.rounds(); t++) {
            ObjectNode round = rounds.addObject();
            round.set("col_self", matrix(h, h));
            round.set("col_msg", matrix(h, h));
            round.set("col_bias", take(h));
            round.set("row_self", matrix(h, h));
            round.set("row_msg", matrix(h, h));
            round.set("row_bias", take(h));
        }
        layers.set("readout_hidden", dense(a.readout(), a.pooledWidth()));
        layers.set("readout_out", dense(a.learnedDim(), a.readout()));
        Checks.requireState(at == p.length, "the layout walk used %s of %s parameters", at, p.length);

        Calibration c = model.calibration();
        ObjectNode vote = root.putObject("vote");
        vote.put("k", c.k());
        vote.put("novelty_k", c.noveltyK());
        vote.put("distance_floor", 1e-12);
        vote.put("bandwidth", c.bandwidth());
        vote.put("tail_scale", c.tailScale());
        vote.put("tail_threshold", c.tailThreshold());
        vote.set("classes", ints(c.classes()));
        vote.set("loo_distances", vector(c.looDistances()));

        ReferenceSet r = model.reference();
        ObjectNode ref = root.putObject("reference");
        ref.put("size", r.size());
        ArrayNode h11 = ref.putArray("h11");
        ArrayNode configs = ref.putArray("configs");
        ArrayNode emb = ref.putArray("embeddings");
        ArrayNode estimates = ref.putArray("h11_estimate");
        double[] e = r.embeddings();
        for (int i = 0; i < r.size(); i++) {
            h11.add(r.h11(i));
            configs.add(r.configs()[i]);
            estimates.add(model.referenceAnchor(i));
            ArrayNode point = emb.addArray();
            for (int d = 0; d < r.dim(); d++) {
                point.add(e[i * r.dim() + d]);
            }
        }
        return root;
    }

    private ObjectNode dense(int out, int in) {
        ObjectNode layer = json.createObjectNode();
        layer.set("weight", matrix(out, in));
        layer.set("bias", take(out));
        return layer;
    }

    private ArrayNode matrix(int out, int in) {
        ArrayNode m = json.createArrayNode();
        for (int o = 0; o < out; o++) {
            m.add(take(in));
        }
        return m;
    }

    private ArrayNode take(int count) {
        Checks.requireState(at + count <= p.length, "the layout walk ran past %s parameters", p.length);
        ArrayNode v = json.createArrayNode();
        for (int i = 0; i < count; i++) {
            v.add(p[at++]);
        }
        return v;
    }

    private ArrayNode vector(double[] x) {
        ArrayNode v = json.createArrayNode();
        for (double d : x) {
            v.add(d);
        }
        return v;
    }

    private ArrayNode ints(int[] x) {
        ArrayNode v = json.createArrayNode();
        for (int d : x) {
            v.add(d);
        }
        return v;
    }
}
