package org.winnow.app.report;

import java.util.ArrayList;
import java.util.List;
import org.winnow.geometry.Checks;
import org.winnow.geometry.Configuration;
import org.winnow.pipeline.Reason;
import org.winnow.scorer.model.FrozenModel;
import org.winnow.scorer.reference.ReferenceSet;
import org.winnow.scorer.rules.KeepRules;
import org.winnow.scorer.rules.RuleException;
import org.winnow.scorer.rules.RulesFile;
import org.winnow.sink.Manifest;
import org.winnow.sink.SurvivorLine;

/**
 * What the model adds to a scan report: the reference embeddings and the survivors' embeddings on the
 * reference's two principal axes, and the density clusters of the novel survivors.
 *
 * @param model          checksum of the model the embeddings come from
 * @param sameModel      whether that is the model the scan ran with (its novelty and predictions are in the files)
 * @param guard          the novelty from which a survivor counts as novel
 * @param guardFromRules whether {@code guard} was read from the run's rules (else the default)
 * @param projection     the reference's principal axes
 * @param reference      reference points, true h11
 * @param others         drawn survivors below the guard, predicted h11
 * @param novel          drawn novel survivors, predicted h11; they are also the clustered points
 * @param novelLines     the survivor lines of {@code novel}, same order
 * @param survivorsTotal survivors in the scan
 * @param novelTotal     novel survivors in the scan (more than {@code novel.size()} when capped)
 * @param keptAsNovel    of those, the ones kept only because they are novel (the others are in range or unsure)
 * @param clusters       clusters of {@code novel}, or null when the reference has no spacing to derive a radius from
 */
record ModelView(String model, boolean sameModel, double guard, boolean guardFromRules, Projection projection,
        List<Point> reference, List<Point> others, List<Point> novel, List<SurvivorLine> novelLines,
        int survivorsTotal, int novelTotal, long keptAsNovel, NoveltyClusters clusters) {

    /** One point of the map: its coordinates on the two axes and the h11 that colours it. */
    record Point(double x, double y, int h11) {}

    /** Largest number of reference points whose nearest-neighbour distance enters the spacing. */
    static final int MAX_SPACING_QUERIES = 2000;

    /**
     * Embeds the reference and the survivors; {@code maxPoints} caps, separately, the novel survivors
     * and the other survivors embedded (an even stride keeps every part of the files represented).
     */
    static ModelView build(ScanResult scan, FrozenModel model, int maxPoints) {
        Checks.requireArgument(maxPoints >= 1, "--max-map-points must be at least 1, got %s", maxPoints);
        Manifest m = scan.manifest();
        double guard = KeepRules.DEFAULT_NOVELTY_GUARD;
        boolean fromRules = false;
        try {
            var g = RulesFile.parse(m.rules(), "manifest").noveltyGuard();
            if (g.isPresent()) {
                guard = g.getAsDouble();
                fromRules = true;
            }
        } catch (RuleException e) {
            // A manifest whose rules do not parse records no usable guard: the default stands, and the page says so.
        }
        ReferenceSet ref = model.reference();
        int dim = ref.dim();
        double[][] refEmb = new double[ref.size()][];
        for (int i = 0; i < ref.size(); i++) {
            refEmb[i] = java.util.Arrays.copyOfRange(ref.embeddings(), i * dim, (i + 1) * dim);
        }
        Projection p = Projection.fit(refEmb);
        List<Point> refPoints = new ArrayList<>(ref.size());
        for (int i = 0; i < ref.size(); i++) {
            double[] xy = p.apply(refEmb[i]);
            refPoints.add(new Point(xy[0], xy[1], ref.h11(i)));
        }
        List<SurvivorLine> novelAll = new ArrayList<>();
        List<SurvivorLine> otherAll = new ArrayList<>();
        for (SurvivorLine s : scan.survivors()) {
            (s.novelty() >= guard ? novelAll : otherAll).add(s);
        }
        List<SurvivorLine> novelLines = stride(novelAll, maxPoints);
        double[][] novelEmb = new double[novelLines.size()][];
        List<Point> novel = new ArrayList<>(novelLines.size());
        for (int i = 0; i < novelLines.size(); i++) {
            novelEmb[i] = embed(model, novelLines.get(i));
            novel.add(point(p, novelEmb[i], novelLines.get(i).h11()));
        }
        List<Point> others = new ArrayList<>();
        for (SurvivorLine s : stride(otherAll, maxPoints)) {
            others.add(point(p, embed(model, s), s.h11()));
        }
        double radius = NoveltyClusters.spacing(strideArray(refEmb, MAX_SPACING_QUERIES), refEmb);
        NoveltyClusters clusters = Double.isNaN(radius) ? null : NoveltyClusters.find(novelEmb, radius);
        return new ModelView(model.checksum(), model.checksum().equals(m.modelChecksum()), guard, fromRules, p,
                List.copyOf(refPoints), List.copyOf(others), List.copyOf(novel), List.copyOf(novelLines),
                scan.survivors().size(), novelAll.size(),
                novelAll.stream().filter(s -> s.keptBecause() == Reason.KEPT_AS_NOVEL).count(), clusters);
    }

    private static double[] embed(FrozenModel model, SurvivorLine s) {
        Configuration c = Configuration.parse(s.config());
        Checks.requireArgument(c.dimension() == model.dimension(), "survivor %s is a %s-fold but the model is for %s-folds",
                s.config(), c.dimension(), model.dimension());
        return model.embed(c, s.chi());
    }

    private static Point point(Projection p, double[] embedding, int h11) {
        double[] xy = p.apply(embedding);
        return new Point(xy[0], xy[1], h11);
    }

    static <T> List<T> stride(List<T> all, int max) {
        if (all.size() <= max) {
            return all;
        }
        List<T> out = new ArrayList<>(max);
        for (int i = 0; i < max; i++) {
            out.add(all.get((int) ((long) i * all.size() / max)));
        }
        return out;
    }

    private static double[][] strideArray(double[][] all, int max) {
        return stride(java.util.Arrays.asList(all), max).toArray(double[][]::new);
    }
}
