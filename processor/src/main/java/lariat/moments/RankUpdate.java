package lariat.moments;

/**
 * The symmetric rank-k update C ← C + Xᵀ X on the upper triangle of a d × d matrix held as d row arrays,
 * for a panel X of k rows held as k row arrays of at least d values each.
 *
 * <p>Entry C_ij (i &lt;= j) becomes fma(x_(k−1)i, x_(k−1)j, … fma(x_1i, x_1j, fma(x_0i, x_0j, C_ij))): one
 * fused multiply-add ({@link Math#fma}, a single rounding, exactly specified by IEEE 754-2008 and so the
 * same bits on every Java platform) per row, rows in order. That order is fixed by the data alone, so
 * the result is the same bits on every run, for every panel split (updating with rows 0..k−1 and then
 * rows k..n−1 gives the same C as one update with all n rows) and for every split of the rows of C
 * between threads ({@link #addUpper(double[][], int, int, double[][], int, int)} computes each entry
 * the same way whatever range it is given). On a processor without a fused multiply-add instruction (x86
 * before 2013) {@link Math#fma} falls back to slow software arithmetic.
 *
 * <p>Loop nest: the row form of the rank-k update, C_i· ← C_i· + Σ_r x_ri x_r· (the "axpy" ordering of
 * the BLAS routine DSYRK, J. J. Dongarra, J. Du Croz, S. Hammarling, I. S. Duff, "A set of level 3 basic
 * linear algebra subprograms", ACM TOMS 16(1), 1990, 1–17). The innermost loop runs over contiguous
 * columns j of two rows i, i + 1 of C at once and applies four panel rows in order as a chain of fused
 * multiply-adds, so each panel value loaded serves four multiply-adds per row of C and the loop is a plain
 * element-wise loop that the JIT compiler turns into SIMD instructions. Columns are taken in tiles of
 * {@value #COLUMN_TILE} so that the tile's part of the panel stays in the level-2 cache while the rows of
 * C pass (K. Goto and R. A. van de Geijn, "Anatomy of high-performance matrix multiplication", ACM TOMS
 * 34(3), 2008, article 12). Each row i of C is updated from column 4⌊i/4⌋ rather than from i, so that
 * its run starts at a multiple of four; the few entries C_ij with 4⌊i/4⌋ &lt;= j &lt; i below the
 * diagonal receive the same fused sums (with the factors swapped) and are otherwise ignored.
 */
final class RankUpdate {

    /** Columns per tile: 512 columns of 256 panel rows are 1 MiB, which streams well from the caches. */
    static final int COLUMN_TILE = 512;

    private RankUpdate() {
    }

    /** The first column of row i that {@link #addUpper} writes: 4⌊i/4⌋. */
    static int firstColumn(int i) {
        return i & ~3;
    }

    /**
     * Adds Xᵀ X to rows {@code rowFrom..rowTo − 1} of {@code c}: entries c[i][j] with
     * {@link #firstColumn(int) firstColumn(i)} &lt;= j &lt; d. Reads rows 0..k−1 of {@code panel} (each at
     * least d values); modifies only those entries of {@code c}. {@code rowFrom} must be even.
     */
    static void addUpper(double[][] panel, int k, int d, double[][] c, int rowFrom, int rowTo) {
        for (int j0 = 0; j0 < d; j0 += COLUMN_TILE) {
            int j1 = Math.min(d, j0 + COLUMN_TILE);
            int last = Math.min(rowTo, j1);
            int i = rowFrom;
            for (; i + 2 <= last; i += 2) {
                rowPair(panel, k, c[i], c[i + 1], i, Math.max(firstColumn(i), j0), j1);
            }
            if (i < last) {
                singleRow(panel, k, c[i], i, Math.max(firstColumn(i), j0), j1);
            }
        }
    }

    /** Adds Xᵀ X to all rows of {@code c}: the ranged {@code addUpper} over rows 0..d−1. */
    static void addUpper(double[][] panel, int k, int d, double[][] c) {
        addUpper(panel, k, d, c, 0, d);
    }

    /** Rows i and i + 1 of C, columns from..to−1, panel rows in order, four at a time. */
    private static void rowPair(double[][] x, int k, double[] c0, double[] c1, int i, int from, int to) {
        int r = 0;
        for (; r + 4 <= k; r += 4) {
            double[] x0 = x[r];
            double[] x1 = x[r + 1];
            double[] x2 = x[r + 2];
            double[] x3 = x[r + 3];
            pairOfFour(c0, c1, x0, x1, x2, x3, x0[i], x1[i], x2[i], x3[i],
                    x0[i + 1], x1[i + 1], x2[i + 1], x3[i + 1], from, to);
        }
        for (; r < k; r++) {
            double[] x0 = x[r];
            double a = x0[i];
            double b = x0[i + 1];
            for (int j = from; j < to; j++) {
                double y = x0[j];
                c0[j] = Math.fma(a, y, c0[j]);
                c1[j] = Math.fma(b, y, c1[j]);
            }
        }
    }

    /** c0[j] and c1[j] for j in from..to−1, each gaining four fused multiply-adds, panel rows x0..x3 in order. */
    private static void pairOfFour(double[] c0, double[] c1, double[] x0, double[] x1, double[] x2, double[] x3,
            double a0, double a1, double a2, double a3, double b0, double b1, double b2, double b3, int from, int to) {
        for (int j = from; j < to; j++) {
            double y0 = x0[j];
            double y1 = x1[j];
            double y2 = x2[j];
            double y3 = x3[j];
            c0[j] = Math.fma(a3, y3, Math.fma(a2, y2, Math.fma(a1, y1, Math.fma(a0, y0, c0[j]))));
            c1[j] = Math.fma(b3, y3, Math.fma(b2, y2, Math.fma(b1, y1, Math.fma(b0, y0, c1[j]))));
        }
    }

    /** Row i of C alone (the last row when it has no partner), columns from..to−1. */
    private static void singleRow(double[][] x, int k, double[] c0, int i, int from, int to) {
        int r = 0;
        for (; r + 4 <= k; r += 4) {
            double[] x0 = x[r];
            double[] x1 = x[r + 1];
            double[] x2 = x[r + 2];
            double[] x3 = x[r + 3];
            double a0 = x0[i];
            double a1 = x1[i];
            double a2 = x2[i];
            double a3 = x3[i];
            for (int j = from; j < to; j++) {
                c0[j] = Math.fma(a3, x3[j], Math.fma(a2, x2[j], Math.fma(a1, x1[j], Math.fma(a0, x0[j], c0[j]))));
            }
        }
        for (; r < k; r++) {
            double[] x0 = x[r];
            double a = x0[i];
            for (int j = from; j < to; j++) {
                c0[j] = Math.fma(a, x0[j], c0[j]);
            }
        }
    }

    /**
     * Splits rows 0..d−1 of C into {@code parts} ranges of about equal work (row i costs d − 4⌊i/4⌋
     * multiply-adds per panel row) with even boundaries: writes bounds[0] = 0 &lt;= bounds[1] &lt;= … &lt;=
     * bounds[parts] = d. Modifies {@code bounds} (at least parts + 1 values) only.
     */
    static void splitRows(int d, int parts, int[] bounds) {
        double total = 0.0;
        for (int i = 0; i < d; i++) {
            total += d - firstColumn(i);
        }
        bounds[0] = 0;
        int p = 1;
        double done = 0.0;
        for (int i = 0; i < d && p < parts; i += 2) {
            while (p < parts && done >= total * p / parts) {
                bounds[p++] = i;
            }
            done += (d - firstColumn(i)) + (i + 1 < d ? d - firstColumn(i + 1) : 0);
        }
        while (p <= parts) {
            bounds[p++] = d;
        }
    }
}
