package lariat.bench;

import lariat.path.GramInput;

/**
 * Prototype of a faster inner loop for the lasso path from a Gram matrix, kept beside the benchmark to
 * measure what a change of memory layout would gain in {@code lariat.path.PathEngine}. It is not a
 * replacement engine: plain lasso only (no LAR, positive or ridge variants, no stopping rule but a step
 * count), no collinear or constant columns (it stops, reporting {@link #stoppedOnPivot()}), ties broken by
 * position rather than by column index, and it records only the penalty and the active coefficients of
 * each knot.
 *
 * <p>The algorithm is the one of Efron, Hastie, Johnstone and Tibshirani, "Least angle regression",
 * Annals of Statistics 32(2), 2004, with the lasso modification (section 3.1), on G = D⁻¹C_xxD⁻¹ and
 * c = D⁻¹C_xy. What differs from the engine is where the work goes:
 * <ul>
 *   <li>The current correlations are updated, not recomputed: ĉ ← ĉ − γa (O(p) per step instead of
 *       O(p·|A|)), and λ ← λ − γA_A.</li>
 *   <li>Columns are kept in positions, active ones first. {@code rows} holds, for each active position k,
 *       the Gram row of that column with its entries in position order, so a_I = G_{I,A}w over the inactive
 *       positions I is |A| contiguous axpy operations over row tails of length p − |A|, instead of a gather
 *       G[j, active[k]] over every row j of the full matrix.</li>
 *   <li>A column joining at position |A| swaps two positions in the |A| active rows (|A| strided writes)
 *       and copies its own Gram row once (p reads); a column leaving shifts the later active rows and
 *       positions down by one (memmoves). The Cholesky factor of G_AA is grown by one forward solve and downdated by
 *       Givens rotations, as in the engine. v = L⁻¹s grows by one entry per join (O(|A|)), and the back
 *       substitution q = L⁻ᵀv reads L by rows (axpy form), never down a column with stride p.</li>
 * </ul>
 *
 * <p>Workspaces are sized once for p; {@link #fit} allocates only when its knot buffers grow. Not thread-safe.
 */
final class ContiguousLassoKernel {

    private static final double PIVOT_TOLERANCE = 1e-10;

    private final int p;
    private final double[] g;
    private final double[] rows;
    private final double[] l;
    private final int[] column;
    private final double[] chat;
    private final double[] beta;
    private final double[] signs;
    private final double[] q;
    private final double[] v;
    private final double[] w;
    private final double[] a;
    private int size;
    private double lambda;
    private double directionScale;
    private int dropPosition;
    private boolean stoppedOnPivot;
    private double[] knotPenalty = new double[16];
    private int knots;

    ContiguousLassoKernel(int p) {
        if (p < 1) {
            throw new IllegalArgumentException("p must be >= 1, was " + p);
        }
        this.p = p;
        this.g = new double[p * p];
        this.rows = new double[p * p];
        this.l = new double[p * p];
        this.column = new int[p];
        this.chat = new double[p];
        this.beta = new double[p];
        this.signs = new double[p];
        this.q = new double[p];
        this.v = new double[p];
        this.w = new double[p];
        this.a = new double[p];
    }

    /**
     * Computes the lasso path for at most {@code maxSteps} steps (0: to the end) and returns the number of
     * steps taken (knots − 1). Coefficients of the last knot: {@link #standardizedCoefficients()}.
     *
     * @throws IllegalArgumentException if {@code in.p()} differs from this kernel's p, maxSteps &lt; 0, or a
     *     column has zero variance
     */
    int fit(GramInput in, int maxSteps) {
        if (in.p() != p) {
            throw new IllegalArgumentException("in.p() must be " + p + ", was " + in.p());
        }
        if (maxSteps < 0) {
            throw new IllegalArgumentException("maxSteps must be >= 0, was " + maxSteps);
        }
        standardize(in);
        int limit = maxSteps == 0 ? 10 * (p + 1) : maxSteps;
        int entrant = largestCorrelation();
        knots = 0;
        int justLeft = -1;
        for (int step = 0; ; step++) {
            if (entrant >= 0 && !enter(entrant)) {
                stoppedOnPivot = true;
                recordKnot();
                return step;
            }
            recordKnot();
            boolean moved = entrant >= 0 || justLeft >= 0;
            if ((step > 0 && !moved) || step >= limit || size == 0) {
                return step;
            }
            entrant = advance(justLeft);
            justLeft = -1;
            if (entrant < 0 && dropPosition >= 0) {
                leave(dropPosition);
                justLeft = size;
            }
            if (entrant < 0 && justLeft < 0) {
                lambda = 0;
            }
        }
    }

    /** Whether the last fit stopped because a joining column's squared pivot was at most 10⁻¹⁰. */
    boolean stoppedOnPivot() {
        return stoppedOnPivot;
    }

    /** Penalties of the knots of the last fit, λ_max first. */
    double[] penalties() {
        return java.util.Arrays.copyOf(knotPenalty, knots);
    }

    /** Standardized coefficients of the last knot, by original column index. */
    double[] standardizedCoefficients() {
        double[] out = new double[p];
        for (int k = 0; k < p; k++) {
            out[column[k]] = beta[k];
        }
        return out;
    }

    private void standardize(GramInput in) {
        double[] d = q;
        for (int j = 0; j < p; j++) {
            double cjj = in.cxx(j, j);
            if (!(cjj > 0)) {
                throw new IllegalArgumentException("column " + j + " has zero variance: C_jj=" + cjj);
            }
            d[j] = Math.sqrt(cjj);
        }
        for (int i = 0; i < p; i++) {
            int row = i * p;
            for (int j = 0; j < p; j++) {
                g[row + j] = in.cxx(i, j) / (d[i] * d[j]);
            }
            g[row + i] = 1;
            chat[i] = in.cxy(i) / d[i];
            column[i] = i;
            beta[i] = 0;
        }
        size = 0;
        stoppedOnPivot = false;
        lambda = 0;
        for (int j = 0; j < p; j++) {
            lambda = Math.max(lambda, Math.abs(chat[j]));
        }
    }

    private int largestCorrelation() {
        int best = -1;
        double bestValue = 0;
        for (int j = 0; j < p; j++) {
            if (Math.abs(chat[j]) > bestValue) {
                best = j;
                bestValue = Math.abs(chat[j]);
            }
        }
        return best;
    }

    private void recordKnot() {
        if (knots == knotPenalty.length) {
            knotPenalty = java.util.Arrays.copyOf(knotPenalty, 2 * knots);
        }
        knotPenalty[knots++] = lambda;
    }

    /** Moves inactive position {@code pos} to position |A|, copies its Gram row and grows the factor. */
    private boolean enter(int pos) {
        int k = size;
        if (pos != k) {
            swapPositions(k, pos);
        }
        int src = column[k] * p;
        int dst = k * p;
        for (int i = 0; i < p; i++) {
            rows[dst + i] = g[src + column[i]];
        }
        double norm = 0;
        int lk = k * p;
        for (int i = 0; i < k; i++) {
            int li = i * p;
            double x = (rows[dst + i] - dot(l, li, l, lk, i)) / l[li + i];
            l[lk + i] = x;
            norm += x * x;
        }
        double pivotSquared = rows[dst + k] - norm;
        if (!(pivotSquared > PIVOT_TOLERANCE * rows[dst + k])) {
            return false;
        }
        l[lk + k] = Math.sqrt(pivotSquared);
        signs[k] = chat[k] >= 0 ? 1 : -1;
        size++;
        extendV();
        return true;
    }

    private void swapPositions(int x, int y) {
        int tc = column[x];
        column[x] = column[y];
        column[y] = tc;
        double t = chat[x];
        chat[x] = chat[y];
        chat[y] = t;
        t = beta[x];
        beta[x] = beta[y];
        beta[y] = t;
        for (int k = 0; k < size; k++) {
            int row = k * p;
            t = rows[row + x];
            rows[row + x] = rows[row + y];
            rows[row + y] = t;
        }
    }

    /** Takes one step; returns the joining position or −1 (then {@link #dropPosition} may be ≥ 0). */
    private int advance(int justLeft) {
        direction();
        double cap = lambda / directionScale;
        double drop = dropStep();
        double limit = Math.min(cap, drop);
        int hitter = -1;
        double gamma = limit;
        for (int j = size; j < p; j++) {
            double cj = chat[j];
            double up = branch(lambda - cj, directionScale - a[j]);
            double down = branch(lambda + cj, directionScale + a[j]);
            if (j == justLeft) {
                if (cj > 0) {
                    up = Double.POSITIVE_INFINITY;
                } else {
                    down = Double.POSITIVE_INFINITY;
                }
            }
            double gj = Math.min(up, down);
            if (gj < gamma) {
                gamma = gj;
                hitter = j;
            }
        }
        if (hitter >= 0 || !(drop < cap)) {
            dropPosition = -1;
        }
        for (int k = 0; k < size; k++) {
            beta[k] += gamma * w[k];
            chat[k] -= gamma * directionScale * signs[k];
        }
        if (dropPosition >= 0) {
            beta[dropPosition] = 0;
        }
        for (int j = size; j < p; j++) {
            chat[j] -= gamma * a[j];
        }
        lambda -= gamma * directionScale;
        return hitter;
    }

    /**
     * v = L⁻¹s (kept up to date by {@link #extendV()}, refreshed after a drop), q = L⁻ᵀv by a back
     * substitution that reads rows of L (axpy form, contiguous), A_A = ‖v‖⁻¹ since sᵀG_AA⁻¹s = ‖v‖²,
     * w = A_A q, and a_I = Σ_k w_k rows[k][I] over the inactive positions I, four rows per pass over a.
     */
    private void direction() {
        int k = size;
        double sq = 0;
        for (int i = 0; i < k; i++) {
            q[i] = v[i];
            sq += v[i] * v[i];
        }
        for (int i = k - 1; i >= 0; i--) {
            int li = i * p;
            double x = q[i] / l[li + i];
            q[i] = x;
            for (int m = 0; m < i; m++) {
                q[m] -= l[li + m] * x;
            }
        }
        directionScale = 1 / Math.sqrt(sq);
        for (int i = 0; i < k; i++) {
            w[i] = directionScale * q[i];
        }
        java.util.Arrays.fill(a, k, p, 0.0);
        int r = 0;
        for (; r + 3 < k; r += 4) {
            double w0 = w[r];
            double w1 = w[r + 1];
            double w2 = w[r + 2];
            double w3 = w[r + 3];
            int r0 = r * p;
            int r1 = r0 + p;
            int r2 = r1 + p;
            int r3 = r2 + p;
            for (int j = k; j < p; j++) {
                a[j] += w0 * rows[r0 + j] + w1 * rows[r1 + j] + w2 * rows[r2 + j] + w3 * rows[r3 + j];
            }
        }
        for (; r < k; r++) {
            double wr = w[r];
            int row = r * p;
            for (int j = k; j < p; j++) {
                a[j] += wr * rows[row + j];
            }
        }
    }

    /** Appends entry |A| − 1 of v = L⁻¹s after a column joined (one row of the forward solve). */
    private void extendV() {
        int i = size - 1;
        int li = i * p;
        v[i] = (signs[i] - dot(l, li, v, 0, i)) / l[li + i];
    }

    /** Recomputes v = L⁻¹s by a full forward solve (after a drop changed L). */
    private void refreshV() {
        for (int i = 0; i < size; i++) {
            int li = i * p;
            v[i] = (signs[i] - dot(l, li, v, 0, i)) / l[li + i];
        }
    }

    /**
     * Σ_{m &lt; n} x[xo + m]·y[yo + m] with four partial sums, so the loop is not bound by the latency of one
     * chain of dependent additions (the JIT does not reorder floating-point sums by itself).
     */
    private static double dot(double[] x, int xo, double[] y, int yo, int n) {
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        double s3 = 0;
        int m = 0;
        for (; m + 3 < n; m += 4) {
            s0 += x[xo + m] * y[yo + m];
            s1 += x[xo + m + 1] * y[yo + m + 1];
            s2 += x[xo + m + 2] * y[yo + m + 2];
            s3 += x[xo + m + 3] * y[yo + m + 3];
        }
        for (; m < n; m++) {
            s0 += x[xo + m] * y[yo + m];
        }
        return (s0 + s1) + (s2 + s3);
    }

    private double dropStep() {
        double best = Double.POSITIVE_INFINITY;
        dropPosition = -1;
        for (int k = 0; k < size; k++) {
            double gk = -beta[k] / w[k];
            if (gk > 0 && gk < best) {
                best = gk;
                dropPosition = k;
            }
        }
        return best;
    }

    private static double branch(double numerator, double denominator) {
        return denominator > 0 ? Math.max(numerator, 0) / denominator : Double.POSITIVE_INFINITY;
    }

    /**
     * Moves active position m to position |A| − 1 (later positions shift down by one, in every active row
     * with one memmove each), drops it from A and downdates the factor.
     */
    private void leave(int m) {
        int last = size - 1;
        for (int r = 0; r < size; r++) {
            int row = r * p;
            double v = rows[row + m];
            System.arraycopy(rows, row + m + 1, rows, row + m, last - m);
            rows[row + last] = v;
        }
        System.arraycopy(rows, (m + 1) * p, rows, m * p, (last - m) * p);
        rotateLeft(column, m, last);
        rotateLeft(chat, m, last);
        rotateLeft(beta, m, last);
        rotateLeft(signs, m, last);
        for (int i = m; i < last; i++) {
            System.arraycopy(l, (i + 1) * p, l, i * p, i + 2);
        }
        size--;
        for (int i = m; i < size; i++) {
            rotate(i);
        }
        refreshV();
    }

    private static void rotateLeft(double[] x, int from, int to) {
        double v = x[from];
        System.arraycopy(x, from + 1, x, from, to - from);
        x[to] = v;
    }

    private static void rotateLeft(int[] x, int from, int to) {
        int v = x[from];
        System.arraycopy(x, from + 1, x, from, to - from);
        x[to] = v;
    }

    /** Zeroes L(i, i+1) by rotating columns i and i+1 of rows i … |A|−1 (Givens). */
    private void rotate(int i) {
        double x0 = l[i * p + i];
        double y0 = l[i * p + i + 1];
        double r = Math.hypot(x0, y0);
        double c = x0 / r;
        double s = y0 / r;
        for (int row = i; row < size; row++) {
            int base = row * p;
            double x = l[base + i];
            double y = l[base + i + 1];
            l[base + i] = c * x + s * y;
            l[base + i + 1] = -s * x + c * y;
        }
        l[i * p + i + 1] = 0;
    }
}
