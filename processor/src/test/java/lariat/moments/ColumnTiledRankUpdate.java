package lariat.moments;

/**
 * The register-tiled rank-k update that {@link RankUpdate} replaced, kept as a second, independently
 * ordered loop nest for the tests: a panel held column by column (column c at {@code panel[c·k ..]}),
 * columns of C in panels of {@value #COLUMN_PANEL}, a 2 × 4 tile of C in eight accumulators while the k
 * rows stream past. Each upper entry C_ij receives fma(x_ri, x_rj, ·) for r = 0..k−1 in order, the same
 * arithmetic as {@link RankUpdate}, so the two must agree bit for bit; entries below the diagonal are
 * never touched.
 */
final class ColumnTiledRankUpdate {

    /** Columns per panel: 64 columns of 256 rows are 128 KiB, inside a level-2 cache. */
    static final int COLUMN_PANEL = 64;

    private ColumnTiledRankUpdate() {
    }

    /**
     * Adds Xᵀ X to the upper triangle of {@code c} (row-major, d × d). Reads {@code panel} (at least d·k
     * values, column-major with stride k); modifies the entries c_ij, i &lt;= j, of {@code c} only.
     */
    static void addUpper(double[] panel, int k, int d, double[] c) {
        for (int j0 = 0; j0 < d; j0 += COLUMN_PANEL) {
            int j1 = Math.min(d, j0 + COLUMN_PANEL);
            for (int i = 0; i < j1; i += 2) {
                int first = j0 + (Math.max(i, j0) - j0) / 4 * 4;
                int j = first;
                for (; j + 4 <= j1; j += 4) {
                    tile(panel, k, d, c, i, j);
                }
                for (; j < j1; j++) {
                    column(panel, k, d, c, i, j);
                }
            }
        }
    }

    /** Rows i, i + 1 (if it exists) and columns j..j+3 of C, entries on or above the diagonal. */
    private static void tile(double[] x, int k, int d, double[] c, int i, int j) {
        int i1 = Math.min(i + 1, d - 1);
        int a0 = i * k;
        int a1 = i1 * k;
        int b0 = j * k;
        int b1 = b0 + k;
        int b2 = b1 + k;
        int b3 = b2 + k;
        int r0 = i * d + j;
        int r1 = i1 * d + j;
        double s00 = c[r0];
        double s01 = c[r0 + 1];
        double s02 = c[r0 + 2];
        double s03 = c[r0 + 3];
        double s10 = c[r1];
        double s11 = c[r1 + 1];
        double s12 = c[r1 + 2];
        double s13 = c[r1 + 3];
        for (int r = 0; r < k; r++) {
            double x0 = x[a0 + r];
            double x1 = x[a1 + r];
            double y = x[b0 + r];
            s00 = Math.fma(x0, y, s00);
            s10 = Math.fma(x1, y, s10);
            y = x[b1 + r];
            s01 = Math.fma(x0, y, s01);
            s11 = Math.fma(x1, y, s11);
            y = x[b2 + r];
            s02 = Math.fma(x0, y, s02);
            s12 = Math.fma(x1, y, s12);
            y = x[b3 + r];
            s03 = Math.fma(x0, y, s03);
            s13 = Math.fma(x1, y, s13);
        }
        store(c, i, j, d, s00, s01, s02, s03);
        if (i1 != i) {
            store(c, i1, j, d, s10, s11, s12, s13);
        }
    }

    /** Writes s0..s3 to row i, columns j..j+3, where on or above the diagonal. */
    private static void store(double[] c, int i, int j, int d, double s0, double s1, double s2, double s3) {
        int row = i * d + j;
        if (j >= i) {
            c[row] = s0;
        }
        if (j + 1 >= i) {
            c[row + 1] = s1;
        }
        if (j + 2 >= i) {
            c[row + 2] = s2;
        }
        if (j + 3 >= i) {
            c[row + 3] = s3;
        }
    }

    /** Rows i, i + 1 (if it exists) of column j of C, entries on or above the diagonal. */
    private static void column(double[] x, int k, int d, double[] c, int i, int j) {
        int i1 = Math.min(i + 1, d - 1);
        int a0 = i * k;
        int a1 = i1 * k;
        int b = j * k;
        double s0 = c[i * d + j];
        double s1 = c[i1 * d + j];
        for (int r = 0; r < k; r++) {
            double y = x[b + r];
            s0 = Math.fma(x[a0 + r], y, s0);
            s1 = Math.fma(x[a1 + r], y, s1);
        }
        if (j >= i) {
            c[i * d + j] = s0;
        }
        if (i1 != i && j >= i1) {
            c[i1 * d + j] = s1;
        }
    }
}
