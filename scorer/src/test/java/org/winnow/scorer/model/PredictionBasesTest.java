package org.winnow.scorer.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;
import org.winnow.geometry.cohomology.Interval;
import org.winnow.geometry.hodge.Basis;
import org.winnow.geometry.hodge.HodgeEngine;
import org.winnow.geometry.hodge.HodgeResult;
import org.winnow.geometry.invariants.InvariantCalculator;
import org.winnow.geometry.invariants.RandomConfigurations;
import org.winnow.pipeline.PredictedValue;
import org.winnow.pipeline.Prediction;
import org.winnow.scorer.reference.LabelledExample;
import org.winnow.scorer.training.Trainer;
import org.winnow.scorer.training.TrainingOptions;
import org.winnow.scorer.training.TrainingProgress;

/**
 * What the scorer shows a researcher: every predicted value with its basis. A value marked proved must
 * be the true value, a bounded one's interval must hold it, and no unproved value may look certain. The
 * oracle is the Hodge engine with its exact backend; the four-fold labels are that engine's as well.
 */
class PredictionBasesTest {
    private static final Path DEMO_MODEL = Path.of("../demo-data/threefolds-1pct.wnm");
    private static final Path FOURFOLDS = Path.of("../geometry/src/test/resources/org/winnow/geometry/hodge/"
            + "lossless-fourfolds-6rows.tsv");

    @Test
    void onRandomThreeFoldsOutsideTheEnumerationNoWrongValueIsMarkedProved() throws IOException {
        FrozenModel model = FrozenModel.load(DEMO_MODEL);
        Predictor predictor = model.newPredictor();
        RandomConfigurations gen = new RandomConfigurations(new SplittableRandom(1405));
        InvariantCalculator invariants = new InvariantCalculator();
        HodgeEngine exact = HodgeEngine.standard();
        int compared = 0;
        int proved = 0;
        for (int trial = 0; trial < 400 && compared < 80; trial++) {
            // Up to 7 rows: more than the enumerated lossless space holds for most shapes.
            Configuration c = gen.calabiYau(3, 7, 3);
            if (c.cols() > 8) {
                continue;
            }
            HodgeResult truth = exact.compute(c);
            if (!truth.isExact()) {
                continue;
            }
            Prediction p = predictor.predict(c, invariants.chi(c));
            proved += checkValue(c, "h11", p.h11Value(), truth.h11());
            proved += checkValue(c, "h21", p.h21Value(), truth.h21());
            compared++;
        }
        assertTrue(compared >= 60, "compared with the exact engine: " + compared);
        assertTrue(proved > 0, "nothing proved: the check would be empty");
    }

    @Test
    void aValueTheCheapTupleOnlyBoundsIsShownWithItsBasisNotAsCertain() throws IOException {
        // h11 = 8 by the exact engine (method transferred); without the exact backend it is only bounded.
        Configuration c = Configuration.parse("2:2,1,0,0,0/2:0,1,1,1,0/1:0,0,2,0,0/1:0,0,2,0,0/1:0,0,0,1,1/1:0,0,0,0,2");
        HodgeResult truth = HodgeEngine.standard().compute(c);
        assertEquals(new Interval(8, 8), truth.h11());
        Prediction p = FrozenModel.load(DEMO_MODEL).newPredictor().predict(c, new InvariantCalculator().chi(c));
        checkValue(c, "h11", p.h11Value(), truth.h11());
        checkValue(c, "h21", p.h21Value(), truth.h21());
        PredictedValue h11 = p.h11Value();
        assertTrue(h11.isProved() ? h11.value() == 8
                : h11.basis() == Basis.BOUNDED && h11.confidence() <= 1.0 / (h11.hi() - h11.lo() + 1),
                "either proved and right, or bounded with at most one value's share of confidence: " + h11);
    }

    @Test
    void aFourFoldModelVotesH31AndNeverMarksAWrongValueProved() throws IOException {
        List<LabelledExample> all = fourFolds();
        List<LabelledExample> train = new ArrayList<>();
        List<LabelledExample> test = new ArrayList<>();
        for (int i = 0; i < all.size(); i++) {
            (i % 5 == 0 ? train : test).add(all.get(i));
        }
        FrozenModel model = Trainer.train(train, TrainingOptions.defaults(9, 1).withEpochs(6).withThreads(1)
                .withLabelSource("engine-labelled four-folds"), TrainingProgress.silent());
        assertTrue(model.residual31Count() > 0, "a four-fold model with full labels votes on h31 corrections");
        Evaluation ev = Evaluation.of(model, test, null);
        Evaluation.Tuple t = ev.tuple();
        assertEquals(test.size(), t.examples());
        assertEquals(4, t.accuracy().length);
        assertEquals(0, t.wrongProved(), "values marked proved that differ from the engine's");
        assertEquals(0, t.outsideBounds(), "labels outside a proved interval");
        assertEquals(0, t.confidentUnproved(), "unproved values shown near-certain");
        // The file mixes rows the first page pins with rows it does not: both bases occur.
        assertTrue(t.proved()[2] > 0 && t.proved()[2] < 1, "share of h31 proved: " + t.proved()[2]);
        Predictor p = model.newPredictor();
        for (LabelledExample e : test) {
            Prediction x = p.predict(e.config(), e.chi());
            // The identities of full holonomy hold for every four-fold prediction, whatever its bases.
            assertEquals(e.chi(), 48 + 6 * (x.h11Value().value() - x.h21Value().value() + x.h31Value().value()),
                    e.config().toText());
            assertEquals(x.h22Value().value(), 44 + 4 * x.h11Value().value() - 2 * x.h21Value().value()
                    + 4 * x.h31Value().value(), e.config().toText());
        }
    }

    /** Returns 1 when the value is proved (and then checked equal), else checks its interval and confidence. */
    private static int checkValue(Configuration c, String name, PredictedValue v, Interval truth) {
        String where = c.toText() + " " + name + " " + v.describeBasis() + " " + v.value() + " vs exact " + truth;
        long t = truth.value();
        switch (v.basis()) {
            case PROVED -> {
                assertEquals(t, v.value(), where);
                return 1;
            }
            case BOUNDED -> assertTrue(v.lo() <= t && t <= v.hi(), where);
            case ESTIMATED -> { }
        }
        assertTrue(v.confidence() <= Predictor.UNPROVED_MAX, "an unproved value looks certain: " + where);
        return 0;
    }

    private static List<LabelledExample> fourFolds() throws IOException {
        InvariantCalculator invariants = new InvariantCalculator();
        List<LabelledExample> out = new ArrayList<>();
        for (String line : Files.readAllLines(FOURFOLDS, StandardCharsets.UTF_8)) {
            if (line.startsWith("#") || line.isBlank()) {
                continue;
            }
            String[] f = line.split("\t");
            Configuration c = Configuration.parse(f[0]);
            int[] hodge = {Integer.parseInt(f[1]), Integer.parseInt(f[2]), Integer.parseInt(f[3]), Integer.parseInt(f[4])};
            out.add(new LabelledExample(c, invariants.chi(c), hodge));
        }
        return out;
    }
}
