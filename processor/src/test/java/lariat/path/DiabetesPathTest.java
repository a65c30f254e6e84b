package lariat.path;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.IntStream;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.junit.jupiter.api.Test;

/**
 * The diabetes data of Efron, Hastie, Johnstone and Tibshirani, "Least angle regression", Annals of
 * Statistics 32(2), 2004 (442 patients, 10 baseline predictors; columns 0-9 are age, sex, bmi, bp, tc, ldl,
 * hdl, tch, ltg, glu, the paper's variables 1-10).
 *
 * <p>Where each expected value comes from:
 * <ul>
 *   <li>From the paper, as remembered (not re-read): LARS enters the variables in the order
 *       3, 9, 4, 7, 2, 10, 5, 8, 6, 1 (bmi, ltg, bp, hdl, sex, glu, tc, ldl, tch, age) and takes 10 steps;
 *       the lasso takes 12 steps because variable 7 (hdl) is dropped once and later re-enters.</li>
 *   <li>Verified against scikit-learn 1.2.1 ({@code lars_path}, fixture {@code sklearn_diabetes.json}):
 *       the same LAR order and 10 steps; lasso order 3, 9, 4, 7, 2, 10, 5, 8, 6, 1 with hdl (column 6)
 *       leaving at step 10 and re-entering at step 11, 12 steps.</li>
 *   <li>Independent oracle: the least-squares fit of the raw rows with an intercept column, by EJML QR.</li>
 * </ul>
 */
class DiabetesPathTest {

    private static final int[] PAPER_LAR_ORDER_ONE_BASED = {3, 9, 4, 7, 2, 10, 5, 8, 6, 1};
    private static final int HDL = 6;

    private final RawProblem data = TestData.diabetes();
    private final PathEngine engine = new PathEngine(10);

    @Test
    void lar_diabetes_entersInPaperOrderInTenSteps() {
        PathOptions opt = PathOptions.builder().method(PathMethod.LAR).build();
        LassoPath path = engine.fit(data.gram(), opt);

        int[] expected = IntStream.of(PAPER_LAR_ORDER_ONE_BASED).map(v -> v - 1).toArray();
        assertArrayEquals(expected, entryOrder(path));
        assertEquals(10, path.knots().size() - 1, "LAR steps");
        assertArrayEquals(expected, path.last().active(), "final active set in entry order");
        assertEquals(StopReason.COMPLETE, path.stopReason());
        PathCertificates.assertPath(path, data, opt);
    }

    @Test
    void lasso_diabetes_dropsHdlOnceAndReentersInTwelveSteps() {
        PathOptions opt = PathOptions.defaults();
        LassoPath path = engine.fit(data.gram(), opt);

        assertEquals(12, path.knots().size() - 1, "lasso steps");
        List<Integer> leftAt = new ArrayList<>();
        for (Knot k : path.knots()) {
            if (k.left() >= 0) {
                leftAt.add(k.step());
                assertEquals(HDL, k.left(), "the variable that leaves");
            }
        }
        assertEquals(List.of(10), leftAt, "one drop, at step 10");
        assertEquals(HDL, path.knots().get(11).entered(), "hdl re-enters at step 11");
        assertArrayEquals(new int[] {2, 8, 3, 1, 9, 4, 7, 5, 0, 6}, path.last().active(),
                "final entry order (scikit-learn 1.2.1 active list)");
        PathCertificates.assertPath(path, data, opt);
    }

    @Test
    void lasso_diabetes_lastKnotEqualsRawLeastSquares() {
        LassoPath path = engine.fit(data.gram(), PathOptions.defaults());
        double[] ols = rawLeastSquaresWithIntercept();
        Knot last = path.last();

        PathCertificates.assertCoefficients(java.util.Arrays.copyOf(ols, 10), last.raw(), "raw least squares");
        assertEquals(ols[10], last.intercept(), PathCertificates.COEFFICIENT_TOLERANCE * Math.abs(ols[10]),
                "intercept");
        assertEquals(0, last.penalty(), 0);
    }

    private static int[] entryOrder(LassoPath path) {
        return path.knots().stream().mapToInt(Knot::entered).filter(j -> j >= 0).toArray();
    }

    /** Raw coefficients of columns 0-9 followed by the intercept, by QR on [x, 1]. */
    private double[] rawLeastSquaresWithIntercept() {
        DMatrixRMaj a = new DMatrixRMaj(data.n, 11);
        DMatrixRMaj b = new DMatrixRMaj(data.n, 1);
        for (int i = 0; i < data.n; i++) {
            for (int j = 0; j < 10; j++) {
                a.set(i, j, data.x[i][j]);
            }
            a.set(i, 10, 1);
            b.set(i, 0, data.y[i]);
        }
        LinearSolverDense<DMatrixRMaj> qr = LinearSolverFactory_DDRM.qr(data.n, 11);
        qr.setA(a);
        DMatrixRMaj sol = new DMatrixRMaj(11, 1);
        qr.solve(b, sol);
        return sol.getData().clone();
    }
}
