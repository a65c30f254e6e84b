package lariat.select;

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
     * @throws IllegalArgumentException if a fold holds no weight or its training part has fewer than two
     *                                  records
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
        double[][] errors = new double[k][grid.length];
        double[] weights = new double[k];
        for (int f = 0; f < k; f++) {
            Moments held = folds.heldOut(f);
            Moments train = folds.training(f);
            if (!(held.totalWeight() > 0) || train.count() < 2) {
                throw new IllegalArgumentException("fold " + f + " of " + k + " has " + held.count()
                        + " held-out and " + train.count() + " training records; use fewer folds");
            }
            RegressionMoments heldOut = RegressionMoments.of(held, featureCols, targetCol);
            RegressionMoments training = RegressionMoments.of(train, featureCols, targetCol);
            LassoPath path = new PathEngine(featureCols.length).fit(training.gramInput(), options);
            for (int g = 0; g < grid.length; g++) {
                PathPoint point = PathPoint.at(path, grid[g]);
                errors[f][g] = heldOut.squaredError(point.intercept(), point.raw());
            }
            weights[f] = held.totalWeight();
        }
        return CvCurve.of(grid, errors, weights);
    }
}
