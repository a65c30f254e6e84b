package lariat.moments;

/**
 * Input checks shared by the accumulators of this package. Each method either returns normally or
 * throws an {@link IllegalArgumentException} whose message names the offending argument, column and
 * value; none of them modifies anything.
 */
final class RowCheck {

    private RowCheck() {
    }

    /**
     * As {@link #row(double[], int)}, and tells whether some value exceeds {@code limit} in magnitude, at the
     * cost of the plain check (one comparison per value).
     */
    static boolean rowAbove(double[] z, int width, double limit) {
        shape(z, width);
        boolean above = false;
        for (int c = 0; c < width; c++) {
            if (!(Math.abs(z[c]) <= limit)) {
                if (!Double.isFinite(z[c])) {
                    throw nonFinite(c, z[c]);
                }
                above = true;
            }
        }
        return above;
    }

    /** Checks that {@code z} has exactly {@code width} finite values. */
    static void row(double[] z, int width) {
        shape(z, width);
        for (int c = 0; c < width; c++) {
            if (!Double.isFinite(z[c])) {
                throw nonFinite(c, z[c]);
            }
        }
    }

    private static void shape(double[] z, int width) {
        if (z == null) {
            throw new IllegalArgumentException("z is null");
        }
        if (z.length != width) {
            throw new IllegalArgumentException("z has length " + z.length + ", expected width " + width);
        }
    }

    private static IllegalArgumentException nonFinite(int c, double v) {
        return new IllegalArgumentException("column " + c + " has non-finite value " + v);
    }

    /** Checks that {@code weight} is finite and strictly positive. */
    static void weight(double weight) {
        if (!(weight > 0.0 && Double.isFinite(weight))) {
            throw new IllegalArgumentException("weight must be finite and > 0, was " + weight);
        }
    }

    /** Checks rows {@code 0..n-1} of a row-major block, with their weights. */
    static void block(double[] rows, double[] weights, long[] eventTimesMs, int n, int width) {
        if (n < 0) {
            throw new IllegalArgumentException("n must be >= 0, was " + n);
        }
        if (rows == null || weights == null || eventTimesMs == null) {
            throw new IllegalArgumentException("rows, weights and eventTimesMs must not be null");
        }
        if (rows.length < (long) n * width) {
            throw new IllegalArgumentException("rows has length " + rows.length + ", expected at least "
                    + ((long) n * width) + " for n=" + n + " and width " + width);
        }
        if (weights.length < n) {
            throw new IllegalArgumentException("weights has length " + weights.length + ", expected at least " + n);
        }
        if (eventTimesMs.length < n) {
            throw new IllegalArgumentException(
                    "eventTimesMs has length " + eventTimesMs.length + ", expected at least " + n);
        }
        for (int r = 0; r < n; r++) {
            int base = r * width;
            for (int c = 0; c < width; c++) {
                double v = rows[base + c];
                if (!Double.isFinite(v)) {
                    throw new IllegalArgumentException("row " + r + ": column " + c + " has non-finite value " + v);
                }
            }
            double w = weights[r];
            if (!(w > 0.0 && Double.isFinite(w))) {
                throw new IllegalArgumentException("row " + r + ": weight must be finite and > 0, was " + w);
            }
        }
    }
}
