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
 * <p>Storage: L is kept twice, by rows and by columns, each row or column in its own array, so that both
 * triangular solves run in column-oriented (axpy) form over contiguous memory: the forward solve L x = b
 * subtracts x_j·L_{·j} (a column) from the entries after j, the back solve Lᵀ x = b subtracts x_i·L_{i·}
 * (a row) from the entries before i. Four columns (rows) are applied per pass, each entry updated as
 * {@code fma(−x₃, ·, fma(−x₂, ·, fma(−x₁, ·, fma(−x₀, ·, e))))} in that order; {@link Math#fma} is exactly
 * rounded, so the results are the same bits on every machine. Every change writes the same computed values
 * into both copies, so they stay exact transposes of each other.
 *
 * <p>Row and column arrays are allocated when the factor first grows to them and reused afterwards;
 * otherwise no method allocates.
 */
final class ActiveCholesky {

    private final int capacity;
    /** byRow[i][k] = L_ik for k ≤ i (k = i + 1 only transiently during a removal). */
    private final double[][] byRow;
    /** byColumn[k][i] = L_ik for i ≥ k. */
    private final double[][] byColumn;
    private final double[] probeRow;
    private final double[] rotationCos;
    private final double[] rotationSin;
    private int size;
    private int probeColumn = -1;
    private double probePivotSquared;

    ActiveCholesky(int capacity) {
        this.capacity = capacity;
        this.byRow = new double[capacity][];
        this.byColumn = new double[capacity][];
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
        System.arraycopy(gramColumn, 0, probeRow, 0, size);
        solveForward(probeRow, 0);
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
            byColumn[m] = new double[capacity];
        }
        double[] target = byRow[m];
        System.arraycopy(row, 0, target, 0, m);
        target[m] = Math.sqrt(pivotSquared);
        for (int i = 0; i < m; i++) {
            byColumn[i][m] = row[i];
        }
        byColumn[m][m] = target[m];
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
        for (int r = 0; r <= k; r++) {
            System.arraycopy(byColumn[r], k + 1, byColumn[r], k, m - 1 - k);
        }
        for (int r = k + 1; r < m; r++) {
            System.arraycopy(byColumn[r], r, byColumn[r], r - 1, m - r);
        }
        size = m - 1;
        for (int i = k; i < size; i++) {
            rotateColumns(i);
        }
        probeColumn = -1;
    }

    /** Zeroes entry (i, i+1) by rotating columns i and i+1 of rows i … size−1, in both copies. */
    private void rotateColumns(int i) {
        double[] left = byColumn[i];
        double[] right = byColumn[i + 1];
        double a = left[i];
        double b = right[i];
        double r = Math.hypot(a, b);
        double c = a / r;
        double s = b / r;
        rotationCos[i] = c;
        rotationSin[i] = s;
        for (int row = i; row < size; row++) {
            double x = left[row];
            double y = right[row];
            double nx = c * x + s * y;
            double ny = -s * x + c * y;
            left[row] = nx;
            right[row] = ny;
            double[] lr = byRow[row];
            lr[i] = nx;
            lr[i + 1] = ny;
        }
        right[i] = 0;
        byRow[i][i + 1] = 0;
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
     * One new entry (from = size − 1) is a dot product with the last row; otherwise the solved entries are
     * first subtracted column by column, then the rest is solved in column-oriented form.
     */
    void forward(double[] b, double[] x, int from) {
        int m = size;
        if (from >= m) {
            return;
        }
        if (from == m - 1) {
            double[] row = byRow[from];
            x[from] = (b[from] - dot(row, x, from)) / row[from];
            return;
        }
        if (b != x) {
            System.arraycopy(b, from, x, from, m - from);
        }
        int j = 0;
        for (; j + 3 < from; j += 4) {
            subtractColumns(x, j, x[j], x[j + 1], x[j + 2], x[j + 3], from, m);
        }
        for (; j < from; j++) {
            subtractColumn(x, j, x[j], from, m);
        }
        solveForward(x, from);
    }

    /** Column-oriented forward solve of entries from … size−1 of x in place, entries before from known. */
    private void solveForward(double[] x, int from) {
        int m = size;
        int j = from;
        for (; j + 3 < m; j += 4) {
            double[] c0 = byColumn[j];
            double[] c1 = byColumn[j + 1];
            double[] c2 = byColumn[j + 2];
            double[] c3 = byColumn[j + 3];
            double x0 = x[j] / c0[j];
            double x1 = (x[j + 1] - c0[j + 1] * x0) / c1[j + 1];
            double x2 = (x[j + 2] - c0[j + 2] * x0 - c1[j + 2] * x1) / c2[j + 2];
            double x3 = (x[j + 3] - c0[j + 3] * x0 - c1[j + 3] * x1 - c2[j + 3] * x2) / c3[j + 3];
            x[j] = x0;
            x[j + 1] = x1;
            x[j + 2] = x2;
            x[j + 3] = x3;
            subtractColumns(x, j, x0, x1, x2, x3, j + 4, m);
        }
        for (; j < m; j++) {
            double x0 = x[j] / byColumn[j][j];
            x[j] = x0;
            subtractColumn(x, j, x0, j + 1, m);
        }
    }

    /** x_i −= x0·L_{i,j} + … + x3·L_{i,j+3} for i in [lo, hi), four columns from j. */
    private void subtractColumns(double[] x, int j, double x0, double x1, double x2, double x3, int lo, int hi) {
        double[] c0 = byColumn[j];
        double[] c1 = byColumn[j + 1];
        double[] c2 = byColumn[j + 2];
        double[] c3 = byColumn[j + 3];
        for (int i = lo; i < hi; i++) {
            x[i] = Math.fma(-x3, c3[i], Math.fma(-x2, c2[i], Math.fma(-x1, c1[i], Math.fma(-x0, c0[i], x[i]))));
        }
    }

    private void subtractColumn(double[] x, int j, double x0, int lo, int hi) {
        double[] c0 = byColumn[j];
        for (int i = lo; i < hi; i++) {
            x[i] = Math.fma(-x0, c0[i], x[i]);
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
            int n = i - 3;
            for (int k = 0; k < n; k++) {
                x[k] = Math.fma(-x3, r3[k], Math.fma(-x2, r2[k], Math.fma(-x1, r1[k], Math.fma(-x0, r0[k], x[k]))));
            }
        }
        for (; i >= 0; i--) {
            double[] r0 = byRow[i];
            double x0 = x[i] / r0[i];
            x[i] = x0;
            for (int k = 0; k < i; k++) {
                x[k] = Math.fma(-x0, r0[k], x[k]);
            }
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
