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
 * <p>Workspaces are sized once for {@code capacity}; no method allocates.
 */
final class ActiveCholesky {

    private final int capacity;
    private final double[] l;
    private final double[] probeRow;
    private int size;
    private int probeColumn = -1;
    private double probePivotSquared;

    ActiveCholesky(int capacity) {
        this.capacity = capacity;
        this.l = new double[capacity * capacity];
        this.probeRow = new double[capacity];
    }

    void clear() {
        size = 0;
        probeColumn = -1;
    }

    int size() {
        return size;
    }

    /**
     * Computes, without committing, the new row for {@code column} against the active columns.
     *
     * @param g      p × p row-major Gram matrix (read only)
     * @param p      its order
     * @param active active columns by position, first {@link #size()} entries used
     * @return the squared pivot G_jj − ‖L⁻¹G_{A,j}‖² (the residual variance of the column after projection
     *         on the active columns, for a correlation matrix 1 − R²_j)
     */
    double probe(double[] g, int p, int[] active, int column) {
        int row = column * p;
        double norm = 0;
        for (int i = 0; i < size; i++) {
            int li = i * capacity;
            double v = (g[row + active[i]] - dot(l, li, probeRow, i)) / l[li + i];
            probeRow[i] = v;
            norm += v * v;
        }
        probeColumn = column;
        probePivotSquared = g[row + column] - norm;
        return probePivotSquared;
    }

    /** Appends the row computed by the last {@link #probe} of {@code column}. */
    void commit(int column) {
        if (probeColumn != column || !(probePivotSquared > 0)) {
            throw new IllegalStateException("no positive probe for column " + column);
        }
        int li = size * capacity;
        System.arraycopy(probeRow, 0, l, li, size);
        l[li + size] = Math.sqrt(probePivotSquared);
        size++;
        probeColumn = -1;
    }

    /** Removes active position {@code k}, restoring the triangle with Givens rotations. */
    void remove(int k) {
        for (int i = k; i < size - 1; i++) {
            System.arraycopy(l, (i + 1) * capacity, l, i * capacity, i + 2);
        }
        size--;
        for (int i = k; i < size; i++) {
            rotateColumns(i);
        }
        probeColumn = -1;
    }

    /** Zeroes entry (i, i+1) by rotating columns i and i+1 of rows i … size−1. */
    private void rotateColumns(int i) {
        double a = l[i * capacity + i];
        double b = l[i * capacity + i + 1];
        double r = Math.hypot(a, b);
        double c = a / r;
        double s = b / r;
        for (int row = i; row < size; row++) {
            int base = row * capacity;
            double x = l[base + i];
            double y = l[base + i + 1];
            l[base + i] = c * x + s * y;
            l[base + i + 1] = -s * x + c * y;
        }
        l[i * capacity + i + 1] = 0;
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
            int li = i * capacity;
            x[i] = (b[i] - dot(l, li, x, i)) / l[li + i];
        }
    }

    /**
     * Solves Lᵀ x = b in place on the first {@link #size()} entries ({@code x} holds b on entry). Column
     * oriented: once x_i is known, row i of L (contiguous) is subtracted from the entries before it, so L is
     * read by rows, never down a column. Modifies {@code x}.
     */
    void backward(double[] x) {
        for (int i = size - 1; i >= 0; i--) {
            int li = i * capacity;
            double xi = x[i] / l[li + i];
            x[i] = xi;
            for (int k = 0; k < i; k++) {
                x[k] -= l[li + k] * xi;
            }
        }
    }

    /**
     * Σ_{k &lt; n} l[lo + k]·x[k] with four partial sums in a fixed order (the compiler does not reorder
     * floating-point additions, so one chain would be bound by the latency of each addition).
     */
    private static double dot(double[] l, int lo, double[] x, int n) {
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        double s3 = 0;
        int k = 0;
        for (; k + 3 < n; k += 4) {
            s0 += l[lo + k] * x[k];
            s1 += l[lo + k + 1] * x[k + 1];
            s2 += l[lo + k + 2] * x[k + 2];
            s3 += l[lo + k + 3] * x[k + 3];
        }
        for (; k < n; k++) {
            s0 += l[lo + k] * x[k];
        }
        return (s0 + s1) + (s2 + s3);
    }
}
