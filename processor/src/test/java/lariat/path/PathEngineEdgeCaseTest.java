package lariat.path;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

/** Degenerate inputs: rank deficiency, constant columns, ties, a single row, a zero response, p > n. */
class PathEngineEdgeCaseTest {

    private static final PathOptions LASSO = PathOptions.defaults();

    /** Random base columns plus a derived column built by {@code derive} from the row. */
    private static RawProblem withDerivedColumn(long seed, int n, int derivedIndex,
                                                java.util.function.ToDoubleFunction<double[]> derive) {
        RawProblem base = RawProblem.random(seed, n, 4, false);
        double[][] x = new double[n][5];
        for (int i = 0; i < n; i++) {
            double[] row = base.x[i];
            for (int j = 0, k = 0; j < 5; j++) {
                x[i][j] = j == derivedIndex ? 0 : row[k++];
            }
            x[i][derivedIndex] = derive.applyAsDouble(x[i]);
        }
        double[] y = base.y.clone();
        for (int i = 0; i < n; i++) {
            y[i] += 0.8 * x[i][derivedIndex];
        }
        return RawProblem.unweighted(x, y);
    }

    private static void assertNoNaN(LassoPath path) {
        for (Knot k : path.knots()) {
            assertTrue(Double.isFinite(k.penalty()) && Double.isFinite(k.rss()) && Double.isFinite(k.r2())
                    && Double.isFinite(k.intercept()), "finite knot " + k);
            for (double v : k.raw()) {
                assertTrue(Double.isFinite(v), "finite raw coefficient at " + k);
            }
        }
    }

    @Test
    void fit_sumOfTwoColumns_reportsCollinearAndEndsAtRank() {
        RawProblem problem = withDerivedColumn(101, 80, 2, r -> r[0] + r[1]);
        for (PathMethod method : PathMethod.values()) {
            PathOptions opt = PathOptions.builder().method(method).build();
            LassoPath path = new PathEngine(5).fit(problem.gram(), opt);

            assertNoNaN(path);
            assertEquals(StopReason.RANK, path.stopReason(), method.name());
            List<ExcludedColumn> ex = path.excluded();
            assertEquals(1, ex.size(), method + " excluded " + ex);
            assertEquals(ExcludedColumn.Reason.COLLINEAR, ex.get(0).reason());
            assertTrue(List.of(0, 1, 2).contains(ex.get(0).column()), "one of x1, x2, x1 + x2 is set aside");
            PathCertificates.assertPath(path, problem, opt);
            int[] kept = java.util.stream.IntStream.range(0, 5).filter(j -> j != ex.get(0).column()).toArray();
            PathCertificates.assertCoefficients(problem.leastSquares(kept, 0), path.last().standardized(),
                    "least squares on the independent columns");
        }
    }

    /**
     * x2 = x0 + x1 + 10⁻⁴·e: each column's 1 − R² on the other two is about 10⁻⁸ (computed here from the
     * centered raw rows by the normal equations, Cramer's rule on the 2 × 2 system). Below the default
     * tolerance 10⁻¹⁰ nothing is set aside; with a tolerance of 10⁻⁶ the third of the three to join is.
     */
    @Test
    void fit_collinearTolerance_decidesWhetherANearlyCollinearColumnIsSetAside() {
        Random rnd = new Random(105);
        int n = 50;
        double[][] x = new double[n][3];
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            x[i][0] = rnd.nextGaussian();
            x[i][1] = rnd.nextGaussian();
            x[i][2] = x[i][0] + x[i][1] + 1e-4 * rnd.nextGaussian();
            y[i] = x[i][0] + 2 * x[i][1] + 0.5 * rnd.nextGaussian();
        }
        RawProblem problem = RawProblem.unweighted(x, y);
        double smallest = Double.POSITIVE_INFINITY;
        double largest = 0;
        for (int k = 0; k < 3; k++) {
            double rho = residualShare(x, k);
            smallest = Math.min(smallest, rho);
            largest = Math.max(largest, rho);
        }
        assertTrue(smallest > 1e-9 && largest < 1e-7, "premise: 1 - R^2 in (1e-9, 1e-7): " + smallest + ", " + largest);

        LassoPath loose = new PathEngine(3).fit(problem.gram(), LASSO);
        PathOptions strictOptions = PathOptions.builder().collinearTolerance(1e-6).build();
        LassoPath strict = new PathEngine(3).fit(problem.gram(), strictOptions);

        assertEquals(List.of(), loose.excluded(), "default tolerance 1e-10 keeps all three");
        assertEquals(3, loose.last().active().length);
        assertEquals(1, strict.excluded().size(), "tolerance 1e-6 sets one aside: " + strict.excluded());
        ExcludedColumn ex = strict.excluded().get(0);
        assertEquals(ExcludedColumn.Reason.COLLINEAR, ex.reason());
        assertEquals(StopReason.RANK, strict.stopReason());
        int[] lastActive = strict.last().active();
        assertEquals(2, lastActive.length);
        for (int column : lastActive) {
            assertTrue(column != ex.column(), "the excluded column is not active");
        }
        PathCertificates.assertPath(loose, problem, LASSO);
        PathCertificates.assertPath(strict, problem, strictOptions);
    }

    /** 1 − R² of column k regressed on the other two columns of x (with intercept), from centered rows. */
    private static double residualShare(double[][] x, int k) {
        int n = x.length;
        double[] mean = new double[3];
        for (double[] row : x) {
            for (int j = 0; j < 3; j++) {
                mean[j] += row[j] / n;
            }
        }
        double[][] s = new double[3][3];
        for (double[] row : x) {
            for (int i = 0; i < 3; i++) {
                for (int j = 0; j < 3; j++) {
                    s[i][j] += (row[i] - mean[i]) * (row[j] - mean[j]);
                }
            }
        }
        int a = k == 0 ? 1 : 0;
        int b = k == 2 ? 1 : 2;
        double det = s[a][a] * s[b][b] - s[a][b] * s[b][a];
        double ca = (s[k][a] * s[b][b] - s[k][b] * s[a][b]) / det;
        double cb = (s[k][b] * s[a][a] - s[k][a] * s[a][b]) / det;
        return (s[k][k] - ca * s[a][k] - cb * s[b][k]) / s[k][k];
    }

    @Test
    void fit_duplicatedColumn_higherIndexIsCollinear() {
        RawProblem problem = withDerivedColumn(102, 60, 3, r -> r[1]);
        LassoPath path = new PathEngine(5).fit(problem.gram(), LASSO);

        assertNoNaN(path);
        assertEquals(1, path.excluded().size());
        assertEquals(3, path.excluded().get(0).column(), "the copy (higher index) of column 1");
        assertEquals(ExcludedColumn.Reason.COLLINEAR, path.excluded().get(0).reason());
        for (Knot k : path.knots()) {
            assertEquals(0, k.standardized()[3], 0, "excluded copy has no coefficient");
        }
        PathCertificates.assertPath(path, problem, LASSO);
    }

    @Test
    void fit_constantColumn_reportedAtStepZeroWithZeroCoefficient() {
        RawProblem problem = withDerivedColumn(103, 50, 4, r -> 273.15);
        LassoPath path = new PathEngine(5).fit(problem.gram(), LASSO);

        assertNoNaN(path);
        assertEquals(List.of(4), path.excluded().stream().map(ExcludedColumn::column).toList());
        assertEquals(ExcludedColumn.Reason.CONSTANT, path.excluded().get(0).reason());
        assertEquals(0, path.excluded().get(0).step());
        assertEquals(StopReason.COMPLETE, path.stopReason());
        for (Knot k : path.knots()) {
            assertEquals(0, k.raw()[4], 0);
        }
        PathCertificates.assertPath(path, problem, LASSO);
    }

    /** Columns 1 and 2 are orthogonal, of equal norm and equally correlated with y (an exact tie); column 0 is weaker. */
    @Test
    void fit_exactTie_lowestIndexEntersFirstAtTheSamePenalty() {
        double[][] x = {{0.1, 1, 0}, {-0.1, -1, 0}, {-0.2, 0, 1}, {0.2, 0, -1}, {0, 0, 0}};
        double[] y = {1, -1, 1, -1, 0};
        RawProblem problem = RawProblem.unweighted(x, y);
        LassoPath path = new PathEngine(3).fit(problem.gram(), LASSO);

        assertEquals(1, path.knots().get(0).entered());
        assertEquals(2, path.knots().get(1).entered());
        assertEquals(path.knots().get(0).penalty(), path.knots().get(1).penalty(), 0, "zero-length step");
        PathCertificates.assertPath(path, problem, LASSO);
    }

    @Test
    void fit_oneRow_allConstantOneKnot() {
        RawProblem problem = RawProblem.unweighted(new double[][] {{1, 2, 3}}, new double[] {7});
        LassoPath path = new PathEngine(3).fit(problem.gram(), LASSO);

        assertEquals(1, path.knots().size());
        assertEquals(3, path.excluded().size());
        assertEquals(7, path.interceptAt(0), 0);
        assertArrayEquals(new double[3], path.rawCoefficientsAt(0));
        assertNoNaN(path);
    }

    @Test
    void fit_allZeroResponse_oneKnotNoNaN() {
        RawProblem base = RawProblem.random(104, 30, 6, true);
        RawProblem problem = new RawProblem(base.x, new double[30], base.w);
        LassoPath path = new PathEngine(6).fit(problem.gram(), LASSO);

        assertEquals(1, path.knots().size());
        assertEquals(StopReason.COMPLETE, path.stopReason());
        assertEquals(0, path.lambdaMax(), 0);
        Knot k = path.last();
        assertEquals(0, k.rss(), 0);
        assertEquals(0, k.r2(), 0, "R² is defined as 0 when C_yy = 0");
        assertEquals(1, k.relativePenalty(), 0);
        assertArrayEquals(new double[6], path.standardizedCoefficientsAt(0.5));
        assertNoNaN(path);
    }

    @Test
    void fit_pGreaterThanN_stopsAtRankWithExactFit() {
        RawProblem problem = RawProblem.random(105, 9, 40, true);
        for (PathOptions opt : new PathOptions[] {LASSO, PathOptions.builder().method(PathMethod.LAR).build()}) {
            LassoPath path = new PathEngine(40).fit(problem.gram(), opt);

            assertNoNaN(path);
            assertEquals(StopReason.RANK, path.stopReason());
            assertEquals(8, path.last().df(), "n − 1 nonzero coefficients at the rank");
            assertEquals(0, path.last().rss(), PathCertificates.RSS_TOLERANCE * problem.cyy());
            PathCertificates.assertPath(path, problem, opt);
        }
    }

    @Test
    void fit_sameEngineTwice_identicalPaths() {
        PathEngine engine = new PathEngine(7);
        RawProblem a = RawProblem.random(106, 50, 7, true);
        RawProblem b = RawProblem.random(107, 5, 7, false);
        LassoPath first = engine.fit(a.gram(), LASSO);
        engine.fit(b.gram(), PathOptions.builder().positive(true).ridge(1).build());
        LassoPath again = engine.fit(a.gram(), LASSO);

        assertEquals(first.knots().size(), again.knots().size());
        for (int k = 0; k < first.knots().size(); k++) {
            assertArrayEquals(first.knots().get(k).standardized(), again.knots().get(k).standardized(), 0);
            assertEquals(first.knots().get(k).penalty(), again.knots().get(k).penalty(), 0);
        }
    }

    @Test
    void fit_nearlyConstantColumnWithLargeMean_isConstant() {
        Random rnd = new Random(108);
        double[][] x = new double[40][2];
        double[] y = new double[40];
        for (int i = 0; i < 40; i++) {
            x[i][0] = rnd.nextGaussian();
            x[i][1] = 1e8 + 1e-6 * rnd.nextGaussian();
            y[i] = x[i][0] + rnd.nextGaussian();
        }
        LassoPath path = new PathEngine(2).fit(RawProblem.unweighted(x, y).gram(), LASSO);

        assertEquals(1, path.excluded().size());
        assertEquals(1, path.excluded().get(0).column());
        assertEquals(ExcludedColumn.Reason.CONSTANT, path.excluded().get(0).reason());
    }
}
