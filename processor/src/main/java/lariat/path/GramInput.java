package lariat.path;

/**
 * The sufficient statistics of one regression problem: weighted means and centered co-moments of the
 * predictors x (p columns) and the response y.
 *
 * <p>With weights w_i over rows i, total weight W = Σw_i and means μ = Σw_i z_i / W, the centered
 * co-moments are C_xx = Σ w_i (x_i − μ_x)(x_i − μ_x)ᵀ (p × p, row-major), C_xy = Σ w_i (x_i − μ_x)(y_i − μ_y)
 * and C_yy = Σ w_i (y_i − μ_y)². They are not divided by W.
 *
 * <p>Validation: every value finite; {@code cxx} of length p², symmetric within a relative 10⁻⁹ of
 * sqrt(C_ii C_jj) + |C_ij| + |C_ji|, with a non-negative diagonal; {@code cxy} and {@code meanX} of length
 * p; C_yy ≥ 0; W > 0; 0 &lt; Σw² ; count ≥ 1. Arrays are copied in and out.
 */
public final class GramInput {

    /** Relative asymmetry of {@code cxx} accepted as rounding. */
    static final double SYMMETRY_TOLERANCE = 1e-9;

    private final int p;
    private final double[] cxx;
    private final double[] cxy;
    private final double cyy;
    private final double[] meanX;
    private final double meanY;
    private final double totalWeight;
    private final double sumSquaredWeights;
    private final long count;
    private final boolean exactlySymmetric;

    private GramInput(double[] cxx, double[] cxy, double cyy, double[] meanX, double meanY,
                      double totalWeight, double sumSquaredWeights, long count) {
        if (cxy == null || cxy.length < 1) {
            throw new IllegalArgumentException("cxy must have length p >= 1, was "
                    + (cxy == null ? "null" : "length " + cxy.length));
        }
        this.p = cxy.length;
        checkLength("cxx", cxx, p * p);
        checkLength("meanX", meanX, p);
        checkFinite("cxx", cxx);
        checkFinite("cxy", cxy);
        checkFinite("meanX", meanX);
        checkScalar("cyy", cyy, cyy >= 0);
        checkScalar("meanY", meanY, true);
        checkScalar("totalWeight", totalWeight, totalWeight > 0);
        checkScalar("sumSquaredWeights", sumSquaredWeights, sumSquaredWeights > 0);
        if (count < 1) {
            throw new IllegalArgumentException("count must be >= 1, was " + count);
        }
        this.exactlySymmetric = checkSymmetricWithNonNegativeDiagonal(cxx, p);
        this.cxx = cxx.clone();
        this.cxy = cxy.clone();
        this.cyy = cyy;
        this.meanX = meanX.clone();
        this.meanY = meanY;
        this.totalWeight = totalWeight;
        this.sumSquaredWeights = sumSquaredWeights;
        this.count = count;
    }

    /**
     * Creates the input; see the class comment for the definitions and the validation.
     *
     * @param cxx   p × p row-major centered co-moments of x
     * @param cxy   p centered co-moments of x with y
     * @param cyy   centered sum of squares of y
     * @param meanX p weighted means of x
     * @param meanY weighted mean of y
     * @param totalWeight W = Σw
     * @param sumSquaredWeights Σw²
     * @param count number of records
     * @throws IllegalArgumentException naming the argument (and entry) that is invalid
     */
    public static GramInput of(double[] cxx, double[] cxy, double cyy, double[] meanX, double meanY,
                               double totalWeight, double sumSquaredWeights, long count) {
        return new GramInput(cxx, cxy, cyy, meanX, meanY, totalWeight, sumSquaredWeights, count);
    }

    private static void checkLength(String name, double[] a, int expected) {
        if (a == null || a.length != expected) {
            throw new IllegalArgumentException(name + " must have length " + expected + ", was "
                    + (a == null ? "null" : "length " + a.length));
        }
    }

    private static void checkFinite(String name, double[] a) {
        for (int i = 0; i < a.length; i++) {
            if (!Double.isFinite(a[i])) {
                throw new IllegalArgumentException(name + "[" + i + "] must be finite, was " + a[i]);
            }
        }
    }

    private static void checkScalar(String name, double v, boolean valid) {
        if (!Double.isFinite(v) || !valid) {
            throw new IllegalArgumentException(name + " is invalid: " + v);
        }
    }

    /** Validates; returns whether C_ij and C_ji are the same bits for every pair. */
    private static boolean checkSymmetricWithNonNegativeDiagonal(double[] c, int p) {
        for (int i = 0; i < p; i++) {
            if (c[i * p + i] < 0) {
                throw new IllegalArgumentException("cxx[" + i + "," + i + "] must be >= 0, was " + c[i * p + i]);
            }
        }
        boolean exact = true;
        for (int i = 0; i < p; i++) {
            for (int j = i + 1; j < p; j++) {
                double a = c[i * p + j];
                double b = c[j * p + i];
                exact &= Double.doubleToRawLongBits(a) == Double.doubleToRawLongBits(b);
                double scale = Math.sqrt(c[i * p + i] * c[j * p + j]) + Math.abs(a) + Math.abs(b);
                if (Math.abs(a - b) > SYMMETRY_TOLERANCE * scale) {
                    throw new IllegalArgumentException("cxx is not symmetric: cxx[" + i + "," + j + "]=" + a
                            + " but cxx[" + j + "," + i + "]=" + b);
                }
            }
        }
        return exact;
    }

    /** Number of predictor columns. */
    public int p() {
        return p;
    }

    /** A copy of the p × p row-major centered co-moments of x. */
    public double[] cxx() {
        return cxx.clone();
    }

    /** Entry (i, j) of C_xx without copying. */
    public double cxx(int i, int j) {
        return cxx[i * p + j];
    }

    /**
     * The p × p row-major C_xx itself, not a copy, for the engine's row reads (callers must not modify it).
     */
    double[] cxxShared() {
        return cxx;
    }

    /** Whether C_ij and C_ji are the same bits for every pair (then row i of C_xx is also its column i). */
    boolean exactlySymmetric() {
        return exactlySymmetric;
    }

    /** A copy of the centered co-moments of x with y. */
    public double[] cxy() {
        return cxy.clone();
    }

    /** Entry j of C_xy without copying. */
    public double cxy(int j) {
        return cxy[j];
    }

    public double cyy() {
        return cyy;
    }

    /** A copy of the weighted means of x. */
    public double[] meanX() {
        return meanX.clone();
    }

    /** Entry j of the weighted means of x without copying. */
    public double meanX(int j) {
        return meanX[j];
    }

    public double meanY() {
        return meanY;
    }

    public double totalWeight() {
        return totalWeight;
    }

    public double sumSquaredWeights() {
        return sumSquaredWeights;
    }

    /** Effective sample size W² / Σw² (the usual definition for weighted samples). */
    public double effectiveSampleSize() {
        return totalWeight * totalWeight / sumSquaredWeights;
    }

    public long count() {
        return count;
    }
}
