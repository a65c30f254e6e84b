package lariat.select;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;
import org.junit.jupiter.api.Test;

class CrossValidationTest {

    /** Relative tolerance of held-out errors from fold moments against direct sums on raw rows. */
    static final double ERROR_TOL = 1e-7;

    @Test
    void run_manySeeds_heldOutErrorEqualsDirectComputationOnRawRows() {
        for (long seed = 1; seed <= 25; seed++) {
            Random rnd = new Random(seed);
            int k = 2 + rnd.nextInt(5);
            RawRows rows = new RawRows(seed, 40 + rnd.nextInt(80), 2 + rnd.nextInt(6), seed % 2 == 1);
            int[] fold = new int[rows.n];
            FoldMoments folds = new FoldMoments(rows.p + 1, k);
            for (int i = 0; i < rows.n; i++) {
                fold[i] = FoldAssignment.fold(i, k);
                folds.add(rows.z(i), rows.w[i], i, i);
            }
            RegressionMoments full = RegressionMoments.of(rows.moments(null), rows.features(), rows.p);
            LassoPath path = new PathEngine(rows.p).fit(full.gramInput(), PathOptions.defaults());
            CvCurve cv = CrossValidation.run(path, folds, rows.features(), rows.p, PathOptions.defaults());
            assertEquals(k, cv.folds(), "seed " + seed);
            double[] grid = cv.relativePenalties();
            double[] pooled = new double[grid.length];
            double totalWeight = 0;
            for (int f = 0; f < k; f++) {
                boolean[] train = new boolean[rows.n];
                boolean[] held = new boolean[rows.n];
                for (int i = 0; i < rows.n; i++) {
                    train[i] = fold[i] != f;
                    held[i] = fold[i] == f;
                }
                Moments direct = rows.moments(train);
                LassoPath fp = new PathEngine(rows.p).fit(
                        RegressionMoments.of(direct, rows.features(), rows.p).gramInput(), PathOptions.defaults());
                double[] fromMoments = cv.foldErrors(f);
                for (int g = 0; g < grid.length; g++) {
                    PathPoint pt = PathPoint.at(fp, grid[g]);
                    double e = rows.squaredError(held, pt.intercept(), pt.raw());
                    assertEquals(e, fromMoments[g], ERROR_TOL * e, "seed " + seed + " fold " + f + " grid " + g);
                    pooled[g] += e;
                }
                totalWeight += rows.moments(held).totalWeight();
            }
            for (int g = 0; g < grid.length; g++) {
                assertEquals(pooled[g] / totalWeight, cv.mean()[g], ERROR_TOL * cv.mean()[g], "seed " + seed);
            }
        }
    }

    @Test
    void run_grid_isTheFullPathsRelativePenalties() {
        RawRows rows = new RawRows(3, 60, 4, false);
        FoldMoments folds = new FoldMoments(5, 4);
        for (int i = 0; i < rows.n; i++) {
            folds.add(rows.z(i), rows.w[i], i, i);
        }
        RegressionMoments full = RegressionMoments.of(rows.moments(null), rows.features(), 4);
        LassoPath path = new PathEngine(4).fit(full.gramInput(), PathOptions.defaults());
        CvCurve cv = CrossValidation.run(path, folds, rows.features(), 4, PathOptions.defaults());
        double[] rel = path.knots().stream().mapToDouble(kn -> kn.relativePenalty()).toArray();
        assertArrayEquals(rel, cv.relativePenalties(), 0.0);
    }

    @Test
    void curve_handCase_meanStandardErrorAndOneSeChoice() {
        // Two folds of weight 2 and 2; fold errors e = {4, 2, 1.2, 1.0} and {6, 2, 1.6, 1.4}.
        // m_1 = {2, 1, 0.6, 0.5}, m_2 = {3, 1, 0.8, 0.7}; pooled mean = {2.5, 1, 0.7, 0.6}.
        // SE_g = sqrt((2 (m1 - M)² + 2 (m2 - M)²) / ((2 - 1) * 4)) = |m1 - m2| / 2 = {0.5, 0, 0.1, 0.1}.
        // Minimum at g = 3 (0.6); one-SE bound 0.7, first g with mean <= 0.7 is g = 2.
        CvCurve c = CvCurve.of(new double[] {1, 0.5, 0.2, 0}, new double[][] {{4, 2, 1.2, 1.0}, {6, 2, 1.6, 1.4}},
                new double[] {2, 2});
        assertArrayEquals(new double[] {2.5, 1, 0.7, 0.6}, c.mean(), 1e-12);
        assertArrayEquals(new double[] {0.5, 0, 0.1, 0.1}, c.standardError(), 1e-12);
        assertEquals(3, c.minIndex());
        assertEquals(2, c.oneSeIndex());
    }

    @Test
    void foldMoments_training_equalsMomentsOfTheOtherRows() {
        RawRows rows = new RawRows(11, 50, 3, true);
        FoldMoments folds = new FoldMoments(4, 3);
        boolean[] notZero = new boolean[rows.n];
        for (int i = 0; i < rows.n; i++) {
            folds.add(rows.z(i), rows.w[i], i, i);
            notZero[i] = FoldAssignment.fold(i, 3) != 0;
        }
        Moments direct = rows.moments(notZero);
        Moments merged = folds.training(0);
        assertEquals(direct.count(), merged.count());
        double[] a = direct.comomentMatrix();
        double[] b = merged.comomentMatrix();
        for (int i = 0; i < a.length; i++) {
            assertEquals(a[i], b[i], 1e-9 * (1 + Math.abs(a[i])));
        }
        assertTrue(merged.totalWeight() > 0);
    }
}
