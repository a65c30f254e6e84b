package lariat.select;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;

/**
 * Weighted least squares on a subset A of the features, from centered moments: the normal equations
 * C_AA β_A = C_Ay solved by an EJML Cholesky solve, β = 0 off A, intercept μ_y − μ_Aᵀβ_A. This is the
 * minimizer of Σ w (y − a − x_Aᵀβ_A)², so on the lasso's active set it removes the shrinkage (the
 * "relaxed" or debiased refit). Immutable; arrays are copied out. When C_AA is not positive definite the
 * fit is {@linkplain #solved() not solved} and {@link #reason()} says why.
 */
public final class LeastSquaresFit {

    private final int[] columns;
    private final double[] coefficients;
    private final double intercept;
    private final double rss;
    private final double r2;
    private final String reason;

    private LeastSquaresFit(int[] columns, double[] coefficients, double intercept, double rss, double r2,
                            String reason) {
        this.columns = columns;
        this.coefficients = coefficients;
        this.intercept = intercept;
        this.rss = rss;
        this.r2 = r2;
        this.reason = reason;
    }

    /**
     * @param m       the moments
     * @param columns distinct feature indices in [0, p); may be empty (the intercept-only model)
     */
    public static LeastSquaresFit of(RegressionMoments m, int[] columns) {
        int p = m.p();
        boolean[] seen = new boolean[p];
        for (int c : columns) {
            if (c < 0 || c >= p || seen[c]) {
                throw new IllegalArgumentException("columns must be distinct indices in [0, " + p + "), got " + c);
            }
            seen[c] = true;
        }
        int q = columns.length;
        double[] beta = new double[p];
        if (q > 0) {
            double[] cxx = m.cxx();
            double[] cxy = m.cxy();
            DMatrixRMaj a = new DMatrixRMaj(q, q);
            DMatrixRMaj b = new DMatrixRMaj(q, 1);
            for (int i = 0; i < q; i++) {
                for (int j = 0; j < q; j++) {
                    a.set(i, j, cxx[columns[i] * p + columns[j]]);
                }
                b.set(i, 0, cxy[columns[i]]);
            }
            LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.chol(q);
            if (!solver.setA(a)) {
                return new LeastSquaresFit(columns.clone(), null, Double.NaN, Double.NaN, Double.NaN,
                        "the co-moment matrix of the " + q + " columns is not positive definite");
            }
            DMatrixRMaj x = new DMatrixRMaj(q, 1);
            solver.solve(b, x);
            for (int i = 0; i < q; i++) {
                if (!Double.isFinite(x.get(i, 0))) {
                    return new LeastSquaresFit(columns.clone(), null, Double.NaN, Double.NaN, Double.NaN,
                            "the least-squares solve gave a non-finite coefficient");
                }
                beta[columns[i]] = x.get(i, 0);
            }
        }
        double intercept = m.interceptFor(beta);
        double rss = m.squaredError(intercept, beta);
        double r2 = m.cyy() > 0 ? 1 - rss / m.cyy() : 0.0;
        return new LeastSquaresFit(columns.clone(), beta, intercept, rss, r2, null);
    }

    public boolean solved() {
        return reason == null;
    }

    /** Why the fit is not solved, or {@code null}. */
    public String reason() {
        return reason;
    }

    public int[] columns() {
        return columns.clone();
    }

    /** Raw coefficients, length p, zero off the subset. */
    public double[] coefficients() {
        requireSolved();
        return coefficients.clone();
    }

    public double intercept() {
        requireSolved();
        return intercept;
    }

    /** Σ w (y − a − xᵀβ)². */
    public double rss() {
        requireSolved();
        return rss;
    }

    public double r2() {
        requireSolved();
        return r2;
    }

    private void requireSolved() {
        if (reason != null) {
            throw new IllegalStateException("least-squares fit not solved: " + reason);
        }
    }
}
