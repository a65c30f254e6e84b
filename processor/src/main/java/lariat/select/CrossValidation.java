package lariat.select;

import java.util.ArrayList;
import java.util.List;
import lariat.moments.Moments;
import lariat.path.Knot;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;

/**
 * K-fold cross-validation of a lasso path from fold moments alone. For each fold k the training moments
 * are the merge of the other folds; a path is fitted to them; at each grid point r_g its model
 * (a, β) at λ = r_g·λmax(k) is scored on fold k's moments with the exact identity of
 * {@link RegressionMoments#squaredError}. The grid is the relative penalties of the full-data path's
 * knots. No raw row is kept.
 */
public final class CrossValidation {

    private CrossValidation() {
    }

    /**
     * @param full        the path fitted to all the data (its knots give the grid)
     * @param folds       fold moments over (features..., target) columns
     * @param featureCols feature columns in the fold moments, in the order of the full path's features
     * @param targetCol   target column in the fold moments
     * @param options     path options for the training fits; they should not stop before the grid's
     *                    smallest relative penalty (below a training path's last knot its last knot is used)
     * @return the curve over the folds that hold records (empty folds are skipped)
     * @throws IllegalArgumentException if fewer than two folds hold records, or a training part has fewer
     *                                  than two records
     */
    public static CvCurve run(LassoPath full, FoldMoments folds, int[] featureCols, int targetCol,
                              PathOptions options) {
        List<Knot> knots = full.knots();
        double[] grid = new double[knots.size()];
        for (int g = 0; g < grid.length; g++) {
            grid[g] = Math.min(1.0, Math.max(0.0, knots.get(g).relativePenalty()));
            if (g > 0 && grid[g] > grid[g - 1]) {
                grid[g] = grid[g - 1];
            }
        }
        int k = folds.folds();
        List<double[]> errors = new ArrayList<>();
        List<Double> weights = new ArrayList<>();
        for (int f = 0; f < k; f++) {
            Moments held = folds.heldOut(f);
            if (!(held.totalWeight() > 0)) {
                continue;
            }
            Moments train = folds.training(f);
            if (train.count() < 2) {
                throw new IllegalArgumentException("fold " + f + " of " + k + " leaves " + train.count()
                        + " training record(s); use fewer folds");
            }
            RegressionMoments heldOut = RegressionMoments.of(held, featureCols, targetCol);
            RegressionMoments training = RegressionMoments.of(train, featureCols, targetCol);
            LassoPath path = new PathEngine(featureCols.length).fit(training.gramInput(), options);
            double[] e = new double[grid.length];
            for (int g = 0; g < grid.length; g++) {
                PathPoint point = PathPoint.at(path, grid[g]);
                e[g] = heldOut.squaredError(point.intercept(), point.raw());
            }
            errors.add(e);
            weights.add(held.totalWeight());
        }
        if (errors.size() < 2) {
            throw new IllegalArgumentException("only " + errors.size() + " of " + k
                    + " folds hold records; cross-validation needs at least 2");
        }
        double[] w = new double[weights.size()];
        for (int f = 0; f < w.length; f++) {
            w[f] = weights.get(f);
        }
        return CvCurve.of(grid, errors.toArray(new double[0][]), w);
    }
}
