package lariat.select;

import java.util.Random;
import lariat.moments.Moments;

/** Random weighted regression rows for tests: x ~ offset + N(0, 1), y linear in a few columns plus noise. */
final class RawRows {

    final int n;
    final int p;
    final double[][] x;
    final double[] y;
    final double[] w;

    RawRows(long seed, int n, int p, boolean weighted) {
        Random rnd = new Random(seed);
        this.n = n;
        this.p = p;
        x = new double[n][p];
        y = new double[n];
        w = new double[n];
        double[] beta = new double[p];
        for (int j = 0; j < Math.min(3, p); j++) {
            beta[j] = (j + 1) * (rnd.nextBoolean() ? 1 : -1);
        }
        for (int i = 0; i < n; i++) {
            double s = 2.0;
            for (int j = 0; j < p; j++) {
                x[i][j] = 10 * j + rnd.nextGaussian();
                s += beta[j] * x[i][j];
            }
            y[i] = s + rnd.nextGaussian();
            w[i] = weighted ? 0.2 + rnd.nextDouble() : 1.0;
        }
    }

    double[] z(int i) {
        double[] z = new double[p + 1];
        System.arraycopy(x[i], 0, z, 0, p);
        z[p] = y[i];
        return z;
    }

    int[] features() {
        int[] f = new int[p];
        for (int j = 0; j < p; j++) {
            f[j] = j;
        }
        return f;
    }

    Moments moments(boolean[] keep) {
        Moments m = new Moments(p + 1);
        for (int i = 0; i < n; i++) {
            if (keep == null || keep[i]) {
                m.add(z(i), w[i], i);
            }
        }
        return m;
    }

    /** Σ w (y − a − xᵀβ)² over the kept rows, summed directly. */
    double squaredError(boolean[] keep, double a, double[] beta) {
        double s = 0;
        for (int i = 0; i < n; i++) {
            if (keep == null || keep[i]) {
                double r = y[i] - a;
                for (int j = 0; j < p; j++) {
                    r -= x[i][j] * beta[j];
                }
                s += w[i] * r * r;
            }
        }
        return s;
    }
}
