package lariat.path;

/**
 * Cholesky factor L (lower triangular, G_AA = L Lᵀ) of the Gram matrix restricted to the active set,
 * kept up to date as columns join and leave.
 *
 * <p>Joining is one forward solve L l = G_{A,j} and a new pivot sqrt(G_jj − ‖l‖²). Leaving position k
 * deletes row k of L, which leaves a lower Hessenberg block; Givens rotations applied on the right to
 * column pairs (i, i+1), i = k … m−2, restore the triangle, and the last column (now zero) is dropped.
 * Since the rotations are orthogonal, L Q Qᵀ Lᵀ is still G with row and column k removed. Cost O(m²) per
 * change instead of O(m³) for a refactorization (the standard updating technique; see e.g. Gill, Golub,
 * Murray and Saunders, "Methods for modifying matrix factorizations", Math. Comp. 28, 1974).
 *
 * <p>Storage: L by rows, each row in its own array (allocated when the factor first grows to it, reused
 * afterwards; otherwise no method allocates). The back solve Lᵀ x = b, run once per path step, is in
 * column-oriented (axpy) form over these rows: once x_i … x_{i−3} are known, rows i … i−3 are subtracted from
 * the entries before them in one pass, each entry updated as
 * {@code fma(−x₃, ·, fma(−x₂, ·, fma(−x₁, ·, fma(−x₀, ·, e))))} in that order ({@link Math#fma} is exactly
 * rounded, so the results are the same bits on every machine). The forward solve (the engine needs only
 * single new entries of it) is in dot-product form over the same rows. One copy of L keeps the
 * working set small (for large active sets the solves are bound by memory traffic, not arithmetic).
 */
final class ActiveCholesky {

    private final int capacity;
    /** byRow[i][k] = L_ik for k ≤ i (k = i + 1 only transiently during a removal). */
    private final double[][] byRow;
    private final double[] probeRow;
    private final double[] rotationCos;
    private final double[] rotationSin;
    private int size;
    private int probeColumn = -1;
    private double probePivotSquared;

    ActiveCholesky(int capacity) {
        this.capacity = capacity;
        this.byRow = new double[capacity][];
        this.probeRow = new double[capacity];
        this.rotationCos = new double[capacity];
        this.rotationSin = new double[capacity];
    }

    void clear() {
        size = 0;
        probeColumn = -1;
    }

    int size() {
        return size;
    }

    /**
     * Computes, without committing, the new row l = L⁻¹G_{A,j} for {@code column} against the active
     * columns.
     *
     * @param gramColumn G_{A,j} by active position, first {@link #size()} entries used (read only)
     * @param diagonal   G_jj
     * @return the squared pivot G_jj − ‖l‖² (the residual variance of the column after projection on the
     *         active columns, for a correlation matrix 1 − R²_j)
     */
    double probe(double[] gramColumn, double diagonal, int column) {
        forward(gramColumn, probeRow, 0);
        double norm = 0;
        for (int i = 0; i < size; i++) {
            norm += probeRow[i] * probeRow[i];
        }
        probeColumn = column;
        probePivotSquared = diagonal - norm;
        return probePivotSquared;
    }

    /** The squared pivot returned by the last {@link #probe}. */
    double lastPivotSquared() {
        return probePivotSquared;
    }

    /** Appends the row computed by the last {@link #probe} of {@code column}. */
    void commit(int column) {
        if (probeColumn != column || !(probePivotSquared > 0)) {
            throw new IllegalStateException("no positive probe for column " + column);
        }
        join(probeRow, probePivotSquared);
    }

    /**
     * Appends the row (l, sqrt(pivotSquared)) with l = L⁻¹G_{A,j} computed by the caller.
     *
     * @param row          l, first {@link #size()} entries used (read only)
     * @param pivotSquared G_jj − ‖l‖², &gt; 0
     */
    void join(double[] row, double pivotSquared) {
        if (!(pivotSquared > 0)) {
            throw new IllegalArgumentException("pivotSquared must be > 0, was " + pivotSquared);
        }
        int m = size;
        if (byRow[m] == null) {
            byRow[m] = new double[capacity];
        }
        double[] target = byRow[m];
        System.arraycopy(row, 0, target, 0, m);
        target[m] = Math.sqrt(pivotSquared);
        size++;
        probeColumn = -1;
    }

    /** L_ik, for k ≤ i &lt; {@link #size()}. */
    double entry(int i, int k) {
        return byRow[i][k];
    }

    /**
     * Removes active position {@code k}, restoring the triangle with Givens rotations; rotation i (of
     * columns i and i+1, i = k … size−1 after the removal) is kept as {@link #rotationCos(int)},
     * {@link #rotationSin(int)}: [x, y] ← [c·x + s·y, −s·x + c·y].
     */
    void remove(int k) {
        int m = size;
        double[] freed = byRow[k];
        System.arraycopy(byRow, k + 1, byRow, k, m - 1 - k);
        byRow[m - 1] = freed;
        size = m - 1;
        int r = k;
        for (; r + 3 < size; r += 4) {
            rotateRows(r, k);
        }
        for (; r < size; r++) {
            applyRotations(byRow[r], k, r);
            determineRotation(r);
        }
        probeColumn = -1;
    }

    /**
     * Rows r … r+3's share of the rotations. Rotation i (columns i and i+1) acts on rows i … size−1, so row
     * r receives rotations k … r−1, already determined by the rows above, and then determines rotation r
     * from its own entries (r, r+1), which zeroes (r, r+1). Each row is read once and in order, four rows
     * side by side (independent chains of dependent operations); every entry goes through the same
     * operations in the same order as when rotating column pairs over all rows.
     */
    private void rotateRows(int r, int k) {
        double[] r0 = byRow[r];
        double[] r1 = byRow[r + 1];
        double[] r2 = byRow[r + 2];
        double[] r3 = byRow[r + 3];
        for (int i = k; i < r; i++) {
            double c = rotationCos[i];
            double s = rotationSin[i];
            double x0 = r0[i];
            double y0 = r0[i + 1];
            double x1 = r1[i];
            double y1 = r1[i + 1];
            double x2 = r2[i];
            double y2 = r2[i + 1];
            double x3 = r3[i];
            double y3 = r3[i + 1];
            r0[i] = c * x0 + s * y0;
            r0[i + 1] = -s * x0 + c * y0;
            r1[i] = c * x1 + s * y1;
            r1[i + 1] = -s * x1 + c * y1;
            r2[i] = c * x2 + s * y2;
            r2[i + 1] = -s * x2 + c * y2;
            r3[i] = c * x3 + s * y3;
            r3[i + 1] = -s * x3 + c * y3;
        }
        determineRotation(r);
        applyRotations(r1, r, r + 1);
        determineRotation(r + 1);
        applyRotations(r2, r, r + 2);
        determineRotation(r + 2);
        applyRotations(r3, r, r + 3);
        determineRotation(r + 3);
    }

    /** Applies rotations from … to−1 to {@code row}, in that order. */
    private void applyRotations(double[] row, int from, int to) {
        for (int i = from; i < to; i++) {
            double c = rotationCos[i];
            double s = rotationSin[i];
            double x = row[i];
            double y = row[i + 1];
            row[i] = c * x + s * y;
            row[i + 1] = -s * x + c * y;
        }
    }

    /** Rotation r from the entries (r, r+1) of row r, all earlier rotations applied; zeroes (r, r+1). */
    private void determineRotation(int r) {
        double[] row = byRow[r];
        double a = row[r];
        double b = row[r + 1];
        double h = Math.hypot(a, b);
        double c = a / h;
        double s = b / h;
        rotationCos[r] = c;
        rotationSin[r] = s;
        row[r] = c * a + s * b;
        row[r + 1] = 0;
    }

    /** Cosine of rotation i of the last {@link #remove(int)}. */
    double rotationCos(int i) {
        return rotationCos[i];
    }

    /** Sine of rotation i of the last {@link #remove(int)}. */
    double rotationSin(int i) {
        return rotationSin[i];
    }

    /**
     * Solves L Lᵀ x = b on the first {@link #size()} entries. Modifies {@code x}; {@code b} is read only and
     * may be the same array as {@code x}.
     */
    void solve(double[] b, double[] x) {
        forward(b, x, 0);
        backward(x);
    }

    /**
     * Solves L x = b for entries {@code from} … {@link #size()}−1 of {@code x}, taking entries 0 … from−1 of
     * {@code x} as already solved (row i of the forward solve reads only x_0 … x_{i−1}). Modifies {@code x};
     * {@code b} is read only and may be the same array as {@code x}. After {@link #remove(int)} of position
     * k, rows 0 … k−1 of L are unchanged, so a solution of the old factor stays valid for entries below k.
     */
    void forward(double[] b, double[] x, int from) {
        for (int i = from; i < size; i++) {
            double[] row = byRow[i];
            x[i] = (b[i] - dot(row, x, i)) / row[i];
        }
    }

    /**
     * Solves Lᵀ x = b in place on the first {@link #size()} entries ({@code x} holds b on entry). Column
     * oriented: once x_i … x_{i−3} are known, rows i … i−3 of L (contiguous) are subtracted from the entries
     * before them in one pass. Modifies {@code x}.
     */
    void backward(double[] x) {
        int i = size - 1;
        for (; i >= 3; i -= 4) {
            double[] r0 = byRow[i];
            double[] r1 = byRow[i - 1];
            double[] r2 = byRow[i - 2];
            double[] r3 = byRow[i - 3];
            double x0 = x[i] / r0[i];
            double x1 = (x[i - 1] - r0[i - 1] * x0) / r1[i - 1];
            double x2 = (x[i - 2] - r0[i - 2] * x0 - r1[i - 2] * x1) / r2[i - 2];
            double x3 = (x[i - 3] - r0[i - 3] * x0 - r1[i - 3] * x1 - r2[i - 3] * x2) / r3[i - 3];
            x[i] = x0;
            x[i - 1] = x1;
            x[i - 2] = x2;
            x[i - 3] = x3;
            RowKernels.fma4(x, 0, i - 3, -x0, r0, -x1, r1, -x2, r2, -x3, r3);
        }
        for (; i >= 0; i--) {
            double[] r0 = byRow[i];
            double x0 = x[i] / r0[i];
            x[i] = x0;
            RowKernels.fma1(x, 0, i, -x0, r0);
        }
    }

    /**
     * Σ_{k &lt; n} l[k]·x[k] with four partial sums in a fixed order (the compiler does not reorder
     * floating-point additions, so one chain would be bound by the latency of each addition).
     */
    private static double dot(double[] l, double[] x, int n) {
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        double s3 = 0;
        int k = 0;
        for (; k + 3 < n; k += 4) {
            s0 += l[k] * x[k];
            s1 += l[k + 1] * x[k + 1];
            s2 += l[k + 2] * x[k + 2];
            s3 += l[k + 3] * x[k + 3];
        }
        for (; k < n; k++) {
            s0 += l[k] * x[k];
        }
        return (s0 + s1) + (s2 + s3);
    }
}
