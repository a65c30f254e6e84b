package lariat.path;

import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;

/**
 * A regression problem as raw weighted rows, with naive reference computations on those rows: a two-pass
 * weighted centered Gram (means first, then co-moments of the centered values), correlations of the
 * standardized columns with a residual, residual sums of squares and least-squares solves (EJML QR).
 */
final class RawProblem {

    final int n;
    final int p;
    final double[][] x;
    final double[] y;
    final double[] w;

    RawProblem(double[][] x, double[] y, double[] w) {
        this.n = y.length;
        this.p = x[0].length;
        this.x = x;
        this.y = y;
        this.w = w;
    }

    static RawProblem unweighted(double[][] x, double[] y) {
        double[] w = new double[y.length];
        java.util.Arrays.fill(w, 1);
        return new RawProblem(x, y, w);
    }

    /**
     * Random correlated columns with far-apart means and scales, a sparse true model plus noise;
     * weights uniform in [0.2, 2] when {@code weighted}.
     */
    static RawProblem random(long seed, int n, int p, boolean weighted) {
        Random rnd = new Random(seed);
        double[] mean = new double[p];
        double[] scale = new double[p];
        double[] b = new double[p];
        for (int j = 0; j < p; j++) {
            mean[j] = 100 * rnd.nextGaussian();
            scale[j] = Math.pow(10, 2 * rnd.nextDouble() - 1);
            b[j] = rnd.nextDouble() < 0.4 ? rnd.nextGaussian() / scale[j] : 0;
        }
        double[][] x = new double[n][p];
        double[] y = new double[n];
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            double previous = 0;
            for (int j = 0; j < p; j++) {
                double z = rnd.nextGaussian();
                x[i][j] = mean[j] + scale[j] * (z + 0.6 * previous);
                previous = z;
                y[i] += b[j] * x[i][j];
            }
            y[i] += 5 + rnd.nextGaussian();
            w[i] = weighted ? 0.2 + 1.8 * rnd.nextDouble() : 1;
        }
        return new RawProblem(x, y, w);
    }

    double totalWeight() {
        double s = 0;
        for (double v : w) {
            s += v;
        }
        return s;
    }

    double[] meanX() {
        double[] m = new double[p];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < p; j++) {
                m[j] += w[i] * x[i][j];
            }
        }
        double total = totalWeight();
        for (int j = 0; j < p; j++) {
            m[j] /= total;
        }
        return m;
    }

    double meanY() {
        double m = 0;
        for (int i = 0; i < n; i++) {
            m += w[i] * y[i];
        }
        return m / totalWeight();
    }

    /** Two-pass weighted centered moments. */
    GramInput gram() {
        double[] mx = meanX();
        double my = meanY();
        double[] cxx = new double[p * p];
        double[] cxy = new double[p];
        double cyy = 0;
        double sw2 = 0;
        for (int i = 0; i < n; i++) {
            double ry = y[i] - my;
            for (int j = 0; j < p; j++) {
                double rj = x[i][j] - mx[j];
                cxy[j] += w[i] * rj * ry;
                for (int k = 0; k < p; k++) {
                    cxx[j * p + k] += w[i] * rj * (x[i][k] - mx[k]);
                }
            }
            cyy += w[i] * ry * ry;
            sw2 += w[i] * w[i];
        }
        return GramInput.of(cxx, cxy, cyy, mx, my, totalWeight(), sw2, n);
    }

    /** d_j = sqrt(Σ w (x_j − μ_j)²), directly from the rows. */
    double[] scales() {
        double[] mx = meanX();
        double[] d = new double[p];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < p; j++) {
                d[j] += w[i] * (x[i][j] - mx[j]) * (x[i][j] - mx[j]);
            }
        }
        for (int j = 0; j < p; j++) {
            d[j] = Math.sqrt(d[j]);
        }
        return d;
    }

    double cyy() {
        double my = meanY();
        double s = 0;
        for (int i = 0; i < n; i++) {
            s += w[i] * (y[i] - my) * (y[i] - my);
        }
        return s;
    }

    /** Weighted residual of the standardized model: r_i = (y_i − μ_y) − Σ_j β_j (x_ij − μ_j)/d_j. */
    double[] residual(double[] standardized) {
        double[] mx = meanX();
        double[] d = scales();
        double my = meanY();
        double[] r = new double[n];
        for (int i = 0; i < n; i++) {
            double v = y[i] - my;
            for (int j = 0; j < p; j++) {
                if (standardized[j] != 0) {
                    v -= standardized[j] * (x[i][j] - mx[j]) / d[j];
                }
            }
            r[i] = v;
        }
        return r;
    }

    /** ĉ_j = Σ_i w_i x̃_ij r_i − λ₂β_j on the standardized scale (0 for zero-variance columns). */
    double[] correlations(double[] standardized, double ridge) {
        double[] r = residual(standardized);
        double[] mx = meanX();
        double[] d = scales();
        double[] out = new double[p];
        for (int j = 0; j < p; j++) {
            if (d[j] == 0) {
                continue;
            }
            double s = 0;
            for (int i = 0; i < n; i++) {
                s += w[i] * (x[i][j] - mx[j]) / d[j] * r[i];
            }
            out[j] = s - ridge * standardized[j];
        }
        return out;
    }

    /** Σ w (y − a − xᵀβ_raw)². */
    double rss(double[] raw, double intercept) {
        double s = 0;
        for (int i = 0; i < n; i++) {
            double v = y[i] - intercept;
            for (int j = 0; j < p; j++) {
                v -= x[i][j] * raw[j];
            }
            s += w[i] * v * v;
        }
        return s;
    }

    /**
     * Standardized coefficients minimizing ‖ỹ − X̃β‖² + λ₂‖β‖² (weighted), by an EJML QR solve of the
     * rows sqrt(w_i)·(x̃_i, ỹ_i) stacked on sqrt(λ₂)·I; columns listed in {@code keep} only, others 0.
     */
    double[] leastSquares(int[] keep, double ridge) {
        double[] mx = meanX();
        double[] d = scales();
        double my = meanY();
        int k = keep.length;
        int rows = n + (ridge > 0 ? k : 0);
        DMatrixRMaj a = new DMatrixRMaj(rows, k);
        DMatrixRMaj b = new DMatrixRMaj(rows, 1);
        for (int i = 0; i < n; i++) {
            double sw = Math.sqrt(w[i]);
            for (int c = 0; c < k; c++) {
                int j = keep[c];
                a.set(i, c, sw * (x[i][j] - mx[j]) / d[j]);
            }
            b.set(i, 0, sw * (y[i] - my));
        }
        for (int c = 0; c < k && ridge > 0; c++) {
            a.set(n + c, c, Math.sqrt(ridge));
        }
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.qr(rows, k);
        if (!solver.setA(a)) {
            throw new IllegalStateException("QR failed");
        }
        DMatrixRMaj sol = new DMatrixRMaj(k, 1);
        solver.solve(b, sol);
        double[] out = new double[p];
        for (int c = 0; c < k; c++) {
            out[keep[c]] = sol.get(c, 0);
        }
        return out;
    }
}
