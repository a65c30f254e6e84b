package lariat.path;

/**
 * The element-wise loops of the engine and of {@link ActiveCholesky}, each a small static method so that
 * the JIT compiles it early and reuses the compiled loop at every call (a path calls them thousands of
 * times, each over one contiguous range). Every update is exactly rounded {@link Math#fma} in the order
 * written, so results are the same bits on every machine; the loops are element-wise (no reductions), so
 * the JIT can run them on vector instructions.
 */
final class RowKernels {

    private RowKernels() {
    }

    /** y_j = fma(c3, r3_j, fma(c2, r2_j, fma(c1, r1_j, fma(c0, r0_j, y_j)))) for j in [lo, hi). */
    static void fma4(double[] y, int lo, int hi, double c0, double[] r0, double c1, double[] r1,
                     double c2, double[] r2, double c3, double[] r3) {
        for (int j = lo; j < hi; j++) {
            y[j] = Math.fma(c3, r3[j], Math.fma(c2, r2[j], Math.fma(c1, r1[j], Math.fma(c0, r0[j], y[j]))));
        }
    }

    /** y_j = fma(c0, r0_j, y_j) for j in [lo, hi). */
    static void fma1(double[] y, int lo, int hi, double c0, double[] r0) {
        for (int j = lo; j < hi; j++) {
            y[j] = Math.fma(c0, r0[j], y[j]);
        }
    }

    /**
     * {@link #fma4} into y with coefficients c and into z with coefficients d, over the same four rows in
     * one pass (each row entry is read once for both).
     */
    static void fma4Twice(double[] y, double[] z, int lo, int hi, double c0, double c1, double c2, double c3,
                          double d0, double d1, double d2, double d3,
                          double[] r0, double[] r1, double[] r2, double[] r3) {
        for (int j = lo; j < hi; j++) {
            double x0 = r0[j];
            double x1 = r1[j];
            double x2 = r2[j];
            double x3 = r3[j];
            y[j] = Math.fma(c3, x3, Math.fma(c2, x2, Math.fma(c1, x1, Math.fma(c0, x0, y[j]))));
            z[j] = Math.fma(d3, x3, Math.fma(d2, x2, Math.fma(d1, x1, Math.fma(d0, x0, z[j]))));
        }
    }

    /** {@link #fma1} into y with c0 and into z with d0 in one pass. */
    static void fma1Twice(double[] y, double[] z, int lo, int hi, double c0, double d0, double[] r0) {
        for (int j = lo; j < hi; j++) {
            double x0 = r0[j];
            y[j] = Math.fma(c0, x0, y[j]);
            z[j] = Math.fma(d0, x0, z[j]);
        }
    }

    /** A Givens rotation of two rows: (u_j, w_j) ← (c·u_j + s·w_j, −s·u_j + c·w_j) for j in [lo, hi). */
    static void rotate(double[] u, double[] w, int lo, int hi, double c, double s) {
        for (int j = lo; j < hi; j++) {
            double x = u[j];
            double y = w[j];
            u[j] = c * x + s * y;
            w[j] = -s * x + c * y;
        }
    }
}
