package lariat.select;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import lariat.moments.Moments;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.junit.jupiter.api.Test;

class LeastSquaresFitTest {

    /** Tolerance for coefficients from moments against an EJML QR solve on the raw rows. */
    static final double COEF_TOL = 1e-7;

    /** Weighted least squares on the raw rows with an intercept column: QR solve of √w [1 X_A] b = √w y. */
    static double[] rawLeastSquares(RawRows r, int[] cols) {
        int q = cols.length + 1;
        DMatrixRMaj a = new DMatrixRMaj(r.n, q);
        DMatrixRMaj b = new DMatrixRMaj(r.n, 1);
        for (int i = 0; i < r.n; i++) {
            double s = Math.sqrt(r.w[i]);
            a.set(i, 0, s);
            for (int j = 0; j < cols.length; j++) {
                a.set(i, j + 1, s * r.x[i][cols[j]]);
            }
            b.set(i, 0, s * r.y[i]);
        }
        LinearSolverDense<DMatrixRMaj> qr = LinearSolverFactory_DDRM.qr(r.n, q);
        assertTrue(qr.setA(a));
        DMatrixRMaj x = new DMatrixRMaj(q, 1);
        qr.solve(b, x);
        return x.data;
    }

    @Test
    void of_randomSubsets_equalsEjmlQrOnRawRows() {
        for (long seed = 1; seed <= 30; seed++) {
            Random rnd = new Random(seed);
            RawRows rows = new RawRows(seed, 20 + rnd.nextInt(50), 2 + rnd.nextInt(6), seed % 3 != 0);
            int[] cols = rnd.ints(0, rows.p).distinct().limit(1 + rnd.nextInt(rows.p)).sorted().toArray();
            RegressionMoments m = RegressionMoments.of(rows.moments(null), rows.features(), rows.p);
            LeastSquaresFit fit = LeastSquaresFit.of(m, cols);
            double[] ref = rawLeastSquares(rows, cols);
            assertTrue(fit.solved());
            assertEquals(ref[0], fit.intercept(), COEF_TOL * (1 + Math.abs(ref[0])), "seed " + seed);
            double[] beta = fit.coefficients();
            for (int j = 0; j < cols.length; j++) {
                assertEquals(ref[j + 1], beta[cols[j]], COEF_TOL * (1 + Math.abs(ref[j + 1])), "seed " + seed);
            }
            double direct = rows.squaredError(null, ref[0], beta);
            assertEquals(direct, fit.rss(), 1e-7 * direct, "seed " + seed);
        }
    }

    @Test
    void of_duplicatedColumn_isNotSolvedAndSaysWhy() {
        Moments mo = new Moments(3);
        double[][] rows = {{1, 1, 2}, {2, 2, 3}, {3, 3, 5}, {4, 4, 4}};
        for (double[] r : rows) {
            mo.add(r, 1, 0);
        }
        LeastSquaresFit fit = LeastSquaresFit.of(RegressionMoments.of(mo, new int[] {0, 1}, 2), new int[] {0, 1});
        assertFalse(fit.solved());
        assertTrue(fit.reason().contains("positive definite"), fit.reason());
    }
}
