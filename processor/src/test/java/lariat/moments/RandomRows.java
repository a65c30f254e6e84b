package lariat.moments;

import java.util.Random;

/** Reproducible random records for the moments tests: rows, weights and event times. */
final class RandomRows {

    final double[][] rows;
    final double[] weights;
    final long[] times;

    private RandomRows(double[][] rows, double[] weights, long[] times) {
        this.rows = rows;
        this.weights = weights;
        this.times = times;
    }

    /**
     * n rows of width d: column c is offset_c + scale_c · (a shared factor + noise), so columns are correlated;
     * weights uniform in [0.1, 3); event times increase by 0..20 ms with about one late record in ten.
     */
    static RandomRows of(Random rnd, int n, int d) {
        double[] offset = new double[d];
        double[] scale = new double[d];
        for (int c = 0; c < d; c++) {
            offset[c] = 200.0 * (rnd.nextDouble() - 0.5);
            scale[c] = 0.1 + 5.0 * rnd.nextDouble();
        }
        double[][] rows = new double[n][d];
        double[] weights = new double[n];
        long[] times = new long[n];
        long t = 1_700_000_000_000L;
        for (int r = 0; r < n; r++) {
            double shared = rnd.nextGaussian();
            for (int c = 0; c < d; c++) {
                rows[r][c] = offset[c] + scale[c] * (0.7 * shared + rnd.nextGaussian());
            }
            weights[r] = 0.1 + 2.9 * rnd.nextDouble();
            t += rnd.nextInt(21);
            times[r] = rnd.nextInt(10) == 0 ? t - rnd.nextInt(500) : t;
        }
        return new RandomRows(rows, weights, times);
    }

    int size() {
        return rows.length;
    }

    int width() {
        return rows[0].length;
    }

    /** Rows from..to-1 flattened row-major. */
    double[] flat(int from, int to) {
        int d = width();
        double[] out = new double[(to - from) * d];
        for (int r = from; r < to; r++) {
            System.arraycopy(rows[r], 0, out, (r - from) * d, d);
        }
        return out;
    }

    double[] weights(int from, int to) {
        return java.util.Arrays.copyOfRange(weights, from, to);
    }

    long[] times(int from, int to) {
        return java.util.Arrays.copyOfRange(times, from, to);
    }

    TwoPass twoPass() {
        return TwoPass.of(rows, weights, rows.length);
    }
}
