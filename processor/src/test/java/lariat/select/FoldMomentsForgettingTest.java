package lariat.select;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import lariat.moments.Accumulator;
import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;
import org.junit.jupiter.api.Test;

/**
 * Folds that follow the key's forgetting and windowing. Oracles: the key's main accumulator (the merge of
 * all folds must equal it), and direct computation on raw rows with the explicit weights
 * w · 2^(−(T − t)/h), T the largest event time, summed with {@link Math#pow} independently of the
 * production decay table.
 */
class FoldMomentsForgettingTest {

    /** Relative tolerance on W, Σ w² and on means (relative to |μ| + 1) between two summation orders. */
    private static final double WEIGHT_TOL = 1e-12;
    /** Tolerance on C_ij relative to sqrt(C_ii C_jj) between two summation orders. */
    private static final double COMOMENT_TOL = 1e-10;
    private static final double HALF_LIFE_MS = 2000.0;

    /** Event times: irregular steps of 0..199 ms, every tenth record late by up to 5 s. */
    private static long[] times(long seed, int n) {
        Random rnd = new Random(seed * 31 + 7);
        long[] t = new long[n];
        long clock = 0;
        for (int i = 0; i < n; i++) {
            clock += rnd.nextInt(200);
            t[i] = rnd.nextInt(10) == 0 ? clock - rnd.nextInt(5000) : clock;
        }
        return t;
    }

    private static long max(long[] t) {
        long m = Long.MIN_VALUE;
        for (long v : t) {
            m = Math.max(m, v);
        }
        return m;
    }

    /** w_i · 2^(−(T − t_i)/h), the weight the batch definition of forgetting gives row i. */
    private static double[] decayedWeights(RawRows rows, long[] t) {
        long latest = max(t);
        double[] w = new double[rows.n];
        for (int i = 0; i < rows.n; i++) {
            w[i] = rows.w[i] * Math.pow(2.0, -(latest - t[i]) / HALF_LIFE_MS);
        }
        return w;
    }

    private static Moments direct(RawRows rows, double[] w, long[] t, boolean[] keep) {
        Moments m = new Moments(rows.p + 1);
        for (int i = 0; i < rows.n; i++) {
            if (keep == null || keep[i]) {
                m.add(rows.z(i), w[i], t[i]);
            }
        }
        return m;
    }

    private static void assertSameMoments(Moments expected, Moments actual, String where) {
        assertEquals(expected.count(), actual.count(), where + " count");
        assertEquals(expected.totalWeight(), actual.totalWeight(), WEIGHT_TOL * expected.totalWeight(), where + " W");
        assertEquals(expected.sumSquaredWeights(), actual.sumSquaredWeights(),
                WEIGHT_TOL * expected.sumSquaredWeights(), where + " sum w^2");
        int d = expected.width();
        for (int i = 0; i < d; i++) {
            assertEquals(expected.mean(i), actual.mean(i), WEIGHT_TOL * (Math.abs(expected.mean(i)) + 1),
                    where + " mean " + i);
            for (int j = 0; j < d; j++) {
                double scale = Math.sqrt(expected.comoment(i, i) * expected.comoment(j, j));
                assertEquals(expected.comoment(i, j), actual.comoment(i, j), COMOMENT_TOL * scale,
                        where + " C " + i + "," + j);
            }
        }
    }

    @Test
    void all_withForgetting_equalsMainStreamAndDecayedRawRows() {
        for (long seed = 1; seed <= 20; seed++) {
            Random rnd = new Random(seed);
            int k = 2 + rnd.nextInt(5);
            int block = 1 + rnd.nextInt(16);
            RawRows rows = new RawRows(seed, 40 + rnd.nextInt(120), 1 + rnd.nextInt(5), seed % 2 == 0);
            long[] t = times(seed, rows.n);
            Accumulator main = Accumulator.stream(rows.p + 1, block, HALF_LIFE_MS);
            FoldMoments folds = new FoldMoments(main, k);
            for (int i = 0; i < rows.n; i++) {
                main.add(rows.z(i), rows.w[i], t[i]);
                folds.add(rows.z(i), rows.w[i], t[i], i);
            }
            String where = "seed " + seed + " k " + k + " block " + block;
            assertSameMoments(main.moments(), folds.all(), where + " folds vs main");
            assertSameMoments(direct(rows, decayedWeights(rows, t), t, null), folds.all(), where + " folds vs raw");
        }
    }

    @Test
    void heldOut_afterLongSilenceInOneFold_decaysToTheCommonEventTime() {
        Accumulator main = Accumulator.stream(2, 4, HALF_LIFE_MS);
        FoldMoments folds = new FoldMoments(main, 2);
        folds.addToFold(0, new double[] {1, 2}, 1.0, 0L);
        folds.addToFold(0, new double[] {2, 1}, 1.0, 0L);
        folds.addToFold(1, new double[] {3, 5}, 1.0, 4000L);
        assertEquals(0.5, folds.heldOut(0).totalWeight(), 0.0,
                "two records two half-lives older than the latest event: 2 · 2^-2 (exact in binary)");
        assertEquals(1.0, folds.heldOut(1).totalWeight(), 0.0, "the latest record keeps its weight");
    }

    @Test
    void run_withForgetting_heldOutErrorEqualsRawRowsWithDecayedWeights() {
        for (long seed = 1; seed <= 12; seed++) {
            Random rnd = new Random(seed + 100);
            int k = 2 + rnd.nextInt(4);
            RawRows rows = new RawRows(seed, 60 + rnd.nextInt(80), 2 + rnd.nextInt(5), seed % 2 == 1);
            long[] t = times(seed, rows.n);
            Accumulator main = Accumulator.stream(rows.p + 1, 8, HALF_LIFE_MS);
            FoldMoments folds = new FoldMoments(main, k);
            int[] fold = new int[rows.n];
            for (int i = 0; i < rows.n; i++) {
                fold[i] = FoldAssignment.fold(i, k);
                main.add(rows.z(i), rows.w[i], t[i]);
                folds.add(rows.z(i), rows.w[i], t[i], i);
            }
            double[] w = decayedWeights(rows, t);
            RegressionMoments full = RegressionMoments.of(main.moments(), rows.features(), rows.p);
            LassoPath path = new PathEngine(rows.p).fit(full.gramInput(), PathOptions.defaults());
            CvCurve cv = CrossValidation.run(path, folds, rows.features(), rows.p, PathOptions.defaults());
            assertEquals(k, cv.folds(), "seed " + seed);
            double[] grid = cv.relativePenalties();
            for (int f = 0; f < k; f++) {
                boolean[] train = new boolean[rows.n];
                for (int i = 0; i < rows.n; i++) {
                    train[i] = fold[i] != f;
                }
                LassoPath fp = new PathEngine(rows.p).fit(
                        RegressionMoments.of(direct(rows, w, t, train), rows.features(), rows.p).gramInput(),
                        PathOptions.defaults());
                double[] fromMoments = cv.foldErrors(f);
                for (int g = 0; g < grid.length; g++) {
                    PathPoint pt = PathPoint.at(fp, grid[g]);
                    double e = heldOutError(rows, w, train, pt.intercept(), pt.raw());
                    assertEquals(e, fromMoments[g], CrossValidationTest.ERROR_TOL * e,
                            "seed " + seed + " fold " + f + " grid " + g);
                }
            }
        }
    }

    /** Σ w_i (y_i − a − x_iᵀβ)² over the rows not in training, summed directly with the given weights. */
    private static double heldOutError(RawRows rows, double[] w, boolean[] train, double a, double[] beta) {
        double s = 0;
        for (int i = 0; i < rows.n; i++) {
            if (!train[i]) {
                double r = rows.y[i] - a;
                for (int j = 0; j < rows.p; j++) {
                    r -= rows.x[i][j] * beta[j];
                }
                s += w[i] * r * r;
            }
        }
        return s;
    }

    @Test
    void all_withWindow_equalsMainWindow() {
        for (long seed = 1; seed <= 15; seed++) {
            Random rnd = new Random(seed + 200);
            int k = 2 + rnd.nextInt(5);
            RawRows rows = new RawRows(seed, 60 + rnd.nextInt(200), 1 + rnd.nextInt(4), seed % 2 == 0);
            long[] t = times(seed, rows.n);
            Accumulator main = Accumulator.window(rows.p + 1, 500L, 6);
            FoldMoments folds = new FoldMoments(main, k);
            boolean[] inWindow = new boolean[rows.n];
            for (int i = 0; i < rows.n; i++) {
                boolean accepted = main.accepts(t[i]);
                assertEquals(accepted, main.add(rows.z(i), rows.w[i], t[i]), "accepts agrees with add");
                if (accepted) {
                    assertTrue(folds.add(rows.z(i), rows.w[i], t[i], i), "a fold accepts what the main accepts");
                }
                inWindow[i] = accepted;
            }
            long firstPane = Math.floorDiv(max(t), 500L) - 5;
            for (int i = 0; i < rows.n; i++) {
                inWindow[i] &= Math.floorDiv(t[i], 500L) >= firstPane;
            }
            String where = "seed " + seed + " k " + k;
            assertSameMoments(main.moments(), folds.all(), where + " folds vs main");
            assertSameMoments(direct(rows, rows.w, t, inWindow), folds.all(), where + " folds vs raw rows in window");
        }
    }
}
