package lariat.stage;

import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.select.CrossValidation;
import lariat.select.CvCurve;
import lariat.select.FoldMoments;
import lariat.select.ModelSelector;
import lariat.select.RegressionMoments;
import lariat.select.RidgeRescale;
import lariat.select.SelectedModel;
import lariat.select.SelectionRule;

/**
 * One refit of one key, a pure function of its moments and the recipe: the moments (features
 * in columns 0..p-1, target in column p), the lasso path fitted from them, the cross-validation
 * curve when the rule is CV, and the selected model (rescaled to the elastic-net estimate when the
 * recipe asks for it). Immutable.
 */
public final class KeyFit {

    private final Moments moments;
    private final LassoPath path;
    private final CvCurve cv;
    private final SelectedModel selected;
    private final int cvIndex;

    private KeyFit(Moments moments, LassoPath path, CvCurve cv, SelectedModel selected, int cvIndex) {
        this.cvIndex = cvIndex;
        this.moments = moments;
        this.path = path;
        this.cv = cv;
        this.selected = selected;
    }

    /**
     * Fits {@code moments} (width p + 1) by {@code recipe}; {@code folds} is required when the rule
     * is CV and ignored otherwise.
     *
     * @throws IllegalArgumentException when the rule cannot be applied to these moments (too few
     *                                  records for the folds, no noise estimate for Cp/AIC/BIC)
     */
    public static KeyFit of(Moments moments, FoldMoments folds, RefitRecipe recipe) {
        int p = moments.width() - 1;
        if (p < 1) {
            throw new IllegalArgumentException("moments need a feature and a target, width was " + moments.width());
        }
        int[] features = new int[p];
        for (int j = 0; j < p; j++) {
            features[j] = j;
        }
        RegressionMoments rm = RegressionMoments.of(moments, features, p);
        LassoPath path = new PathEngine(p).fit(rm.gramInput(), recipe.pathOptions());
        CvCurve cv = null;
        if (recipe.spec().rule() == SelectionRule.CV) {
            if (folds == null) {
                throw new IllegalArgumentException("rule cv needs fold moments, got none");
            }
            cv = CrossValidation.run(path, folds, features, p, recipe.pathOptions());
        }
        SelectedModel selected = ModelSelector.select(path, rm, recipe.spec(), cv);
        if (recipe.ridgeRescale()) {
            selected = RidgeRescale.apply(selected, rm, recipe.pathOptions().ridge());
        }
        int cvIndex = cv == null ? -1 : recipe.spec().oneStandardError() ? cv.oneSeIndex() : cv.minIndex();
        return new KeyFit(moments.copy(), path, cv, selected, cvIndex);
    }

    /** A copy of the moments fitted. */
    public Moments moments() {
        return moments.copy();
    }

    /** {@link Moments#fingerprint()} of the moments fitted. */
    public String fingerprint() {
        return moments.fingerprint();
    }

    public LassoPath path() {
        return path;
    }

    /** The cross-validation curve, or null when the rule is not CV. */
    public CvCurve cv() {
        return cv;
    }

    /** Grid index of the cross-validation point chosen, or -1 when the rule is not CV. */
    public int cvIndex() {
        return cvIndex;
    }

    public SelectedModel selected() {
        return selected;
    }
}
