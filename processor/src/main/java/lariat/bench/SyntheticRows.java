package lariat.bench;

import java.util.SplittableRandom;

/**
 * A seeded synthetic regression problem for benchmarks: n rows of p independent standard Gaussian
 * features, a true coefficient vector with ⌈p/10⌉ nonzeros (10%, at random columns, standard Gaussian
 * values), and the response y = xᵀβ + ε with ε standard Gaussian. Rows are stored row-major as z = (x, y),
 * width p + 1, target last. Immutable.
 *
 * <p>Gaussian variates come from {@link SplittableRandom#nextDouble()} via the polar method of Marsaglia
 * and Bray, "A convenient method for generating normal variables", SIAM Review 6(3), 1964, so the same
 * seed gives the same rows on every JVM.
 */
final class SyntheticRows {

    private final int p;
    private final int n;
    private final double[] rows;
    private final double[] truth;

    private SyntheticRows(int p, int n, long seed) {
        if (p < 1) {
            throw new IllegalArgumentException("features must be >= 1, was " + p);
        }
        if (n < 2) {
            throw new IllegalArgumentException("rows must be >= 2, was " + n);
        }
        if ((long) n * (p + 1) > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("rows * (features + 1) must be < 2^31, was " + n + " * " + (p + 1));
        }
        this.p = p;
        this.n = n;
        Gaussian g = new Gaussian(new SplittableRandom(seed));
        this.truth = new double[p];
        SplittableRandom pick = new SplittableRandom(seed ^ 0x5DEECE66DL);
        int nonzeros = (p + 9) / 10;
        for (int placed = 0; placed < nonzeros; ) {
            int j = pick.nextInt(p);
            if (truth[j] == 0) {
                truth[j] = g.next();
                placed++;
            }
        }
        int d = p + 1;
        this.rows = new double[n * d];
        for (int i = 0; i < n; i++) {
            int base = i * d;
            double y = 0;
            for (int j = 0; j < p; j++) {
                double x = g.next();
                rows[base + j] = x;
                y += truth[j] * x;
            }
            rows[base + p] = y + g.next();
        }
    }

    /** @throws IllegalArgumentException if p &lt; 1, n &lt; 2 or n·(p+1) does not fit one array */
    static SyntheticRows of(int p, int n, long seed) {
        return new SyntheticRows(p, n, seed);
    }

    int features() {
        return p;
    }

    int rows() {
        return n;
    }

    /** Row-major z = (x, y) rows, width p + 1; the internal array, not a copy (benchmark hot path). */
    double[] data() {
        return rows;
    }

    /** A copy of the true coefficients. */
    double[] truth() {
        return truth.clone();
    }

    /** Standard Gaussian variates by the polar method, one cached spare. */
    private static final class Gaussian {
        private final SplittableRandom rnd;
        private final double[] pair = new double[1];
        private double spare;
        private boolean hasSpare;

        Gaussian(SplittableRandom rnd) {
            this.rnd = rnd;
        }

        double next() {
            if (hasSpare) {
                hasSpare = false;
                return spare;
            }
            double first = polarPair(rnd, pair);
            spare = pair[0];
            hasSpare = true;
            return first;
        }
    }

    /**
     * A pair of independent standard normal deviates by the polar method (Marsaglia &amp; Bray 1964, SIAM
     * Review 6(3)): returns the first and stores the second in {@code second[0]}.
     */
    static double polarPair(SplittableRandom rnd, double[] second) {
        double u;
        double v;
        double s;
        do {
            u = 2 * rnd.nextDouble() - 1;
            v = 2 * rnd.nextDouble() - 1;
            s = u * u + v * v;
        } while (s >= 1 || s == 0);
        double f = Math.sqrt(-2 * Math.log(s) / s);
        second[0] = v * f;
        return u * f;
    }
}
