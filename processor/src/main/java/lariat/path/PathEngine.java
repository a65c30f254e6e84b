package lariat.path;

import java.util.ArrayList;
import java.util.List;

/**
 * Computes the LAR or lasso path of one problem from its moments alone.
 *
 * <p>Algorithm: least angle regression with the lasso modification, Efron, Hastie, Johnstone and
 * Tibshirani, "Least angle regression", Annals of Statistics 32(2), 2004, 407-499, equations (2.10)-(2.15)
 * and (3.4)-(3.6), run on the correlation matrix instead of the rows:
 * <ul>
 *   <li>Standardize from the moments: d_j = sqrt(C_jj), G = D⁻¹C_xxD⁻¹ (plus λ₂I for the elastic net of
 *       Zou and Hastie, J. R. Statist. Soc. B 67(2), 2005), c = D⁻¹C_xy. The response is centered, not
 *       scaled. Weighted inner products need no special care: the moments are already weighted.</li>
 *   <li>Current correlations ĉ = c − Gβ; the penalty is λ = max_j |ĉ_j| (positive variant: max_j ĉ_j).
 *       ĉ is updated in place after each step in a fixed order of operations, so a path is a pure function
 *       of its input, bit for bit: ĉ_j ← ĉ_j − γa_j for inactive j, ĉ_j ← ĉ_j − γA_A s_j for active j (their
 *       exact change, since G_AA w = A_A s_A), and after a drop of column k with rounding residue β_k,
 *       ĉ ← ĉ + β_k G_{·k} before β_k is set to 0.</li>
 *   <li>With active set A and signs s: G_AA q = s_A, A_A = (s_Aᵀq)^(−1/2), w = A_A q, a = G_{·A}w. Moving
 *       β_A += γw lowers every active |ĉ_j| by γA_A. The step is the smallest γ ≥ 0 of (λ − ĉ_j)/(A_A − a_j)
 *       and (λ + ĉ_j)/(A_A + a_j) over inactive j (only the first in the positive variant), capped by
 *       λ/A_A, which reaches the least-squares fit on A.</li>
 *   <li>Lasso: if an active β_j reaches zero first (γ_j = −β_j/w_j, smallest positive), the step stops
 *       there, j leaves A, and the next step admits no column.</li>
 * </ul>
 *
 * <p>Layout, so that a step costs O(|A|² + |A|·(p − |A|)) and short paths never touch all of C_xx:
 * <ul>
 *   <li>Standardizing is O(p) (d, c and the constant columns); the Gram row of a column is computed from
 *       row j of C_xx (and column j, unless C_xx is exactly symmetric) only when j joins or leaves.</li>
 *   <li>Columns live in storage positions: the active ones first (in any order), then the inactive ones,
 *       then the excluded ones; every per-column loop of a step runs over a contiguous range.</li>
 *   <li>Besides the Cholesky factor L of G_AA ({@link ActiveCholesky}) the engine keeps R = L⁻¹G_{A,I},
 *       the active rows of a Cholesky factorization of the whole Gram matrix in storage order, over the
 *       inactive positions I. Then a_I = A_A R_Iᵀv with v = L⁻¹s_A (no back solve), the probe of a
 *       candidate j is column j of R (l = L⁻¹G_{A,j}, no forward solve), and the row of a joining column,
 *       (G_{j,I} − lᵀR_I)/L_jj, is built in the same pass over R as the next a. A drop applies the Givens
 *       rotations that downdate L to the rows of R. The back solve q = L⁻ᵀv is the only triangular solve
 *       per step.</li>
 *   <li>Element-wise loops over contiguous rows are written with {@link Math#fma} (exactly rounded, the
 *       same bits everywhere), four rows per pass, so the JIT compiles them to vector instructions.</li>
 * </ul>
 *
 * <p>Numerical rules (each a documented choice):
 * <ul>
 *   <li>A column is {@link ExcludedColumn.Reason#CONSTANT} if C_jj = 0, or C_jj ≤ 10⁻²⁴·max_k C_kk, or
 *       C_jj ≤ 10⁻²⁴·W·μ_j² (a relative spread below 10⁻¹² of its scale or its mean).</li>
 *   <li>G_jk = ½(C_jk + C_kj)/(d_j d_k), symmetric bit for bit; for an exactly symmetric C_xx this is
 *       ½(C_jk + C_jk)/(d_j d_k), the same value, computed from row j alone.</li>
 *   <li>A column about to join A is {@link ExcludedColumn.Reason#COLLINEAR} if its squared Cholesky pivot
 *       G_jj − ‖L⁻¹G_{A,j}‖² is at most τ·G_jj, τ = {@link PathOptions#collinearTolerance()} (default
 *       10⁻¹⁰), that is its squared multiple correlation with the active columns exceeds 1 − τ. It is set
 *       aside for the rest of the path, which is then the path of the remaining columns. Rank deficiency
 *       never produces NaN or an exception.</li>
 *   <li>Ties (in λ at the start, in γ later) go to the lowest column index.</li>
 *   <li>The knot reached by the capped step has λ = 0 exactly (λ − γA_A = 0 there).</li>
 *   <li>A response with C_yy = 0 or C_yy ≤ 10⁻²⁴·W·μ_y², or with λ_max = 0, gives one knot (β = 0).</li>
 *   <li>The engine takes at most 10·(p + 1) steps whatever {@link PathOptions#maxSteps()} says.</li>
 *   <li>A knot's intercept is μ_y − Σ μ_j β_raw,j summed over the active columns in order of entry.</li>
 * </ul>
 *
 * <p>Workspaces of O(p) are sized in the constructor; the p-long rows of R and of L are allocated when the
 * active set first grows to them (a short path allocates O(p·steps), not O(p²)) and reused by later fits.
 * Otherwise {@link #fit} allocates only the knot records and the lists holding them. Reusable, not
 * thread-safe.
 */
public final class PathEngine {

    /** Relative variance at or below which a column is constant. */
    public static final double CONSTANT_TOLERANCE = 1e-24;
    /**
     * The default relative squared pivot at or below which a joining column is collinear with the active
     * set; {@link PathOptions#collinearTolerance()} sets it per fit.
     */
    public static final double COLLINEAR_TOLERANCE = PathOptions.DEFAULT_COLLINEAR_TOLERANCE;

    private static final int INACTIVE = 0;
    private static final int ACTIVE = 1;
    private static final int EXCLUDED = 2;

    private final int p;
    /** By column: d_j, c_j = C_xy,j / d_j, β_j (standardized) and the column's status. */
    private final double[] d;
    private final double[] c;
    private final double[] beta;
    private final int[] status;
    /**
     * Storage positions: active columns in [0, |A|) (in any order), then inactive ones, then (from
     * {@link #end}) excluded ones.
     */
    private final int[] columnAt;
    private final int[] positionOf;
    /** By position: current correlations ĉ and a = G_{·A}w (inactive positions only). */
    private final double[] chat;
    private final double[] a;
    /** By active position (order of entry). */
    private final int[] active;
    private final int[] signs;
    private final double[] signValues;
    private final double[] v;
    private final double[] q;
    private final double[] w;
    /**
     * rows[k][j] = (L⁻¹G_{A,·})_k at inactive storage position j: row k of the active rows of a Cholesky
     * factorization of the whole Gram matrix in storage order (the part right of Lᵀ). Allocated on first use.
     */
    private final double[][] rows;
    /** l = L⁻¹G_{A,j} of the last probed column, then of the column that joined last. */
    private final double[] gramColumn;
    private final double[] pendingRow;
    private final double[] gramRow;
    private final double[] partial;
    private final ActiveCholesky cholesky;

    private GramInput in;
    private PathOptions options;
    private List<ExcludedColumn> excluded;
    private int size;
    private int end;
    private double lambda;
    private double lambdaMax;
    private double directionScale;
    private double hitStep;
    private int dropPosition;
    private boolean collinearFound;
    private int currentStep;
    private int vSolved;
    private int probedColumn;
    private double probedPivotSquared;
    private boolean pendingJoin;

    /** @param p number of predictor columns of every input this engine will fit, ≥ 1 */
    public PathEngine(int p) {
        if (p < 1) {
            throw new IllegalArgumentException("p must be >= 1, was " + p);
        }
        this.p = p;
        this.d = new double[p];
        this.c = new double[p];
        this.beta = new double[p];
        this.status = new int[p];
        this.columnAt = new int[p];
        this.positionOf = new int[p];
        this.chat = new double[p];
        this.a = new double[p];
        this.active = new int[p];
        this.signs = new int[p];
        this.signValues = new double[p];
        this.v = new double[p];
        this.q = new double[p];
        this.w = new double[p];
        this.rows = new double[p][];
        this.gramColumn = new double[p];
        this.pendingRow = new double[p];
        this.gramRow = new double[p];
        this.partial = new double[p];
        this.cholesky = new ActiveCholesky(p);
    }

    public int p() {
        return p;
    }

    /**
     * Computes the path.
     *
     * @throws IllegalArgumentException if an argument is null or {@code in.p()} differs from {@link #p()}
     */
    public LassoPath fit(GramInput input, PathOptions opt) {
        if (input == null || opt == null) {
            throw new IllegalArgumentException("input and options must not be null: " + input + ", " + opt);
        }
        if (input.p() != p) {
            throw new IllegalArgumentException("input.p() must be " + p + ", was " + input.p());
        }
        this.in = input;
        this.options = opt;
        try {
            return run();
        } finally {
            this.in = null;
            this.options = null;
            this.excluded = null;
        }
    }

    private LassoPath run() {
        reset();
        standardize();
        lambda = currentLambda();
        lambdaMax = lambda;
        List<Knot> knots = new ArrayList<>(2 * p + 2);
        if (responseIsConstant() || !(lambdaMax > 0)) {
            knots.add(knot(0, -1, -1));
            return LassoPath.of(p, knots, excluded, StopReason.COMPLETE);
        }
        StopReason reason = walk(knots, firstEntrant());
        return LassoPath.of(p, knots, excluded, reason);
    }

    private StopReason walk(List<Knot> knots, int firstEntrant) {
        int entrant = firstEntrant;
        int left = -1;
        int step = 0;
        int guard = 10 * (p + 1);
        while (true) {
            boolean full = entrant >= 0 && size >= options.maxActive();
            if (entrant >= 0 && !full) {
                addActive(entrant);
            }
            Knot knot = knot(step, full ? -1 : entrant, left);
            knots.add(knot);
            if (full) {
                return StopReason.MAX_ACTIVE;
            }
            if (entrant < 0 && left < 0 && step > 0) {
                return endReason();
            }
            StopReason rule = ruleStop(knot, step, guard);
            if (rule != null) {
                return rule;
            }
            if (size == 0) {
                return endReason();
            }
            int justLeft = left;
            left = -1;
            currentStep = step + 1;
            entrant = advance(justLeft);
            if (entrant < 0 && dropPosition >= 0) {
                left = active[dropPosition];
                removeActive(dropPosition);
            }
            if (entrant < 0 && left < 0) {
                lambda = 0;
            } else {
                lambda = currentLambda();
            }
            step++;
        }
    }

    private StopReason ruleStop(Knot knot, int step, int guard) {
        if (knot.r2() >= options.targetR2()) {
            return StopReason.TARGET_R2;
        }
        if (options.minRelativePenalty() > 0 && knot.relativePenalty() <= options.minRelativePenalty()) {
            return StopReason.MIN_PENALTY;
        }
        if (step >= options.maxSteps() || step >= guard) {
            return StopReason.MAX_STEPS;
        }
        return null;
    }

    private void reset() {
        excluded = new ArrayList<>();
        size = 0;
        collinearFound = false;
        currentStep = 0;
        vSolved = 0;
        cholesky.clear();
        java.util.Arrays.fill(beta, 0);
        java.util.Arrays.fill(status, INACTIVE);
        probedColumn = -1;
        pendingJoin = false;
    }

    /**
     * The O(p) part of the standardization: d_j, the constant columns, c = D⁻¹C_xy, ĉ = c (β = 0) and the
     * storage positions (candidates in column order, then the constant columns). A Gram row is built only
     * when its column joins or leaves ({@link #buildRow}).
     */
    private void standardize() {
        double maxDiag = 0;
        for (int j = 0; j < p; j++) {
            maxDiag = Math.max(maxDiag, in.cxx(j, j));
        }
        int front = 0;
        int back = p;
        for (int j = 0; j < p; j++) {
            double cjj = in.cxx(j, j);
            double mean = in.meanX(j);
            if (cjj <= 0 || cjj <= CONSTANT_TOLERANCE * maxDiag
                    || cjj <= CONSTANT_TOLERANCE * in.totalWeight() * mean * mean) {
                status[j] = EXCLUDED;
                d[j] = 0;
                c[j] = 0;
                excluded.add(ExcludedColumn.of(j, ExcludedColumn.Reason.CONSTANT, 0, "C_jj=" + cjj
                        + " (max_k C_kk=" + maxDiag + ", W*mean^2=" + in.totalWeight() * mean * mean + ")"));
                back--;
                columnAt[back] = j;
                positionOf[j] = back;
            } else {
                d[j] = Math.sqrt(cjj);
                c[j] = in.cxy(j) / d[j];
                columnAt[front] = j;
                positionOf[j] = front;
                front++;
            }
        }
        end = front;
        java.util.Arrays.sort(columnAt, end, p);
        for (int k = end; k < p; k++) {
            positionOf[columnAt[k]] = k;
        }
        for (int k = 0; k < p; k++) {
            chat[k] = c[columnAt[k]];
        }
    }

    /**
     * Writes the standardized Gram row of {@code column} into {@code row} by storage position:
     * G_jk = ½(C_jk + C_kj)/(d_j d_k), and 1 + λ₂ on the diagonal (entries of excluded columns are 0). The
     * formula is symmetric in (j, k) bit for bit, so G_{A,j} can be read from the rows of the active
     * columns. When C_xx is exactly symmetric, C_kj is C_jk and only row j of C_xx is read.
     */
    private void buildRow(int column, double[] row) {
        double[] cxx = in.cxxShared();
        int offset = column * p;
        double dj = d[column];
        if (in.exactlySymmetric()) {
            for (int k = 0; k < p; k++) {
                double x = cxx[offset + k];
                row[positionOf[k]] = status[k] == EXCLUDED ? 0 : 0.5 * (x + x) / (dj * d[k]);
            }
        } else {
            for (int k = 0; k < p; k++) {
                row[positionOf[k]] = status[k] == EXCLUDED ? 0
                        : 0.5 * (cxx[offset + k] + cxx[k * p + column]) / (dj * d[k]);
            }
        }
        row[positionOf[column]] = 1 + options.ridge();
    }

    private boolean responseIsConstant() {
        double cyy = in.cyy();
        return cyy <= 0 || cyy <= CONSTANT_TOLERANCE * in.totalWeight() * in.meanY() * in.meanY();
    }

    /** λ = max |ĉ_j| (positive variant: max ĉ_j) over the candidate (active and inactive) columns. */
    private double currentLambda() {
        double max = 0;
        for (int k = 0; k < end; k++) {
            max = Math.max(max, options.positive() ? chat[k] : Math.abs(chat[k]));
        }
        return max;
    }

    /** The inactive column with the largest (absolute, unless positive) correlation; probes it. */
    private int firstEntrant() {
        while (true) {
            int best = -1;
            double bestValue = 0;
            for (int k = size; k < end; k++) {
                double value = options.positive() ? chat[k] : Math.abs(chat[k]);
                int column = columnAt[k];
                if (value > bestValue || (value == bestValue && best >= 0 && column < best)) {
                    best = column;
                    bestValue = value;
                }
            }
            if (best < 0 || !isCollinear(best)) {
                return best;
            }
            exclude(best);
        }
    }

    /**
     * Probes {@code column} against the active set: l = L⁻¹G_{A,j} is column j of the active rows, and the
     * squared pivot is G_jj − ‖l‖².
     */
    private boolean isCollinear(int column) {
        if (pendingJoin) {
            throw new IllegalStateException("probe of column " + column + " before the row of the last join");
        }
        int position = positionOf[column];
        double norm = 0;
        for (int k = 0; k < size; k++) {
            double x = rows[k][position];
            gramColumn[k] = x;
            norm += x * x;
        }
        double diagonal = 1 + options.ridge();
        probedColumn = column;
        probedPivotSquared = diagonal - norm;
        return !(probedPivotSquared > options.collinearTolerance() * diagonal);
    }

    /** Sets aside {@code column}, just probed by {@link #isCollinear}, moving it to the excluded positions. */
    private void exclude(int column) {
        double pivotSquared = probedPivotSquared;
        status[column] = EXCLUDED;
        collinearFound = true;
        int[] act = java.util.Arrays.copyOf(active, size);
        excluded.add(ExcludedColumn.of(column, ExcludedColumn.Reason.COLLINEAR, currentStep, "squared pivot "
                + pivotSquared + " <= " + options.collinearTolerance() + " * G_jj=" + (1 + options.ridge())
                + " against active columns " + java.util.Arrays.toString(act)));
        swapPositions(positionOf[column], end - 1);
        end--;
    }

    /** Exchanges storage positions x and y in the position arrays and in every active row. */
    private void swapPositions(int x, int y) {
        if (x == y) {
            return;
        }
        int cx = columnAt[x];
        int cy = columnAt[y];
        columnAt[x] = cy;
        columnAt[y] = cx;
        positionOf[cx] = y;
        positionOf[cy] = x;
        double t = chat[x];
        chat[x] = chat[y];
        chat[y] = t;
        t = a[x];
        a[x] = a[y];
        a[y] = t;
        for (int k = 0; k < size; k++) {
            double[] row = rows[k];
            t = row[x];
            row[x] = row[y];
            row[y] = t;
        }
    }

    /**
     * Appends the last probe of {@code column} to L and moves the column to position |A|; its row of
     * {@link #rows} is built by the next {@link #direction()}, in the same pass that computes a.
     */
    private void addActive(int column) {
        if (probedColumn != column || !(probedPivotSquared > 0)) {
            throw new IllegalStateException("no positive probe for column " + column);
        }
        cholesky.join(gramColumn, probedPivotSquared);
        System.arraycopy(gramColumn, 0, pendingRow, 0, size);
        pendingJoin = true;
        probedColumn = -1;
        swapPositions(positionOf[column], size);
        active[size] = column;
        signs[size] = options.positive() || chat[size] >= 0 ? 1 : -1;
        signValues[size] = signs[size];
        status[column] = ACTIVE;
        size++;
    }

    /**
     * Removes active position {@code position}; its column moves to the first inactive storage position j.
     * Since G_{A,j} = L·(row k of L)ᵀ, column j of the active rows becomes row k of L; then the Givens
     * rotations that restore L (see {@link ActiveCholesky#remove(int)}) are applied to the pairs of active
     * rows (i, i+1), i = k … |A|−2, over the inactive positions: with L_{−k}Q = [L' 0],
     * G_{A',·} = L'·(first |A|−1 rows of QᵀL⁻¹G_{A,·}). The same rotations carry v = L⁻¹s_A, computed by
     * this step's {@link #direction()}, to L'⁻¹s_{A'} (s_{A'} is s_A without entry k), so no forward solve
     * follows a drop.
     */
    private void removeActive(int position) {
        int column = active[position];
        int m = size;
        int j0 = m - 1;
        swapPositions(positionOf[column], j0);
        for (int i = 0; i < m; i++) {
            rows[i][j0] = i <= position ? cholesky.entry(position, i) : 0;
        }
        cholesky.remove(position);
        for (int i = position; i < m - 1; i++) {
            double cs = cholesky.rotationCos(i);
            double sn = cholesky.rotationSin(i);
            RowKernels.rotate(rows[i], rows[i + 1], j0, end, cs, sn);
            double x = v[i];
            double y = v[i + 1];
            v[i] = cs * x + sn * y;
            v[i + 1] = -sn * x + cs * y;
        }
        System.arraycopy(active, position + 1, active, position, size - position - 1);
        System.arraycopy(signs, position + 1, signs, position, size - position - 1);
        System.arraycopy(signValues, position + 1, signValues, position, size - position - 1);
        size--;
        vSolved = Math.min(vSolved, size);
        beta[column] = 0;
        status[column] = INACTIVE;
    }

    /**
     * Takes one step. Returns the column that will join at the new knot, or −1; leaves {@link #dropPosition}
     * ≥ 0 when an active coefficient reached zero instead, and both negative when the step was the capped one.
     * Inactive correlations move by −γa_j (ĉ_j = fma(−γ, a_j, ĉ_j)); active ones by −γA_A s_j, their exact
     * change (G_AA w = A_A s_A).
     */
    private int advance(int justLeft) {
        direction();
        double cap = lambda / directionScale;
        double drop = options.method() == PathMethod.LASSO ? dropStep() : Double.POSITIVE_INFINITY;
        int hitter = hitter(Math.min(cap, drop), justLeft);
        double gamma = hitter >= 0 ? hitStep : Math.min(cap, drop);
        if (hitter >= 0 || !(drop < cap)) {
            dropPosition = -1;
        }
        double activeStep = gamma * directionScale;
        for (int k = 0; k < size; k++) {
            beta[active[k]] += gamma * w[k];
            chat[positionOf[active[k]]] -= activeStep * signValues[k];
        }
        RowKernels.fma1(chat, size, end, -gamma, a);
        if (dropPosition >= 0) {
            settleDrop(active[dropPosition]);
        }
        return hitter;
    }

    /** ĉ ← ĉ + β_k G_{·k} for the column k whose coefficient reached zero (up to rounding), then β_k = 0. */
    private void settleDrop(int column) {
        buildRow(column, gramRow);
        RowKernels.fma1(chat, 0, end, beta[column], gramRow);
        beta[column] = 0;
    }

    /**
     * Fills q, w (by active position), A_A and a = G_{I,A}w over the inactive positions I. With v = L⁻¹s_A
     * (kept across steps: one new entry per joining column, rotated with L after a drop), s_AᵀG_AA⁻¹s_A = ‖v‖², so A_A = 1/‖v‖ and q = L⁻ᵀv. Since G_{A,I} = L·R_I with R = {@link #rows},
     * a = A_A·R_Iᵀv, built four rows per pass: a_j = fma(u₃, ·, fma(u₂, ·, fma(u₁, ·, fma(u₀, ·, a_j)))) with
     * u_k = A_A v_k; no back solve is needed for a.
     */
    private void direction() {
        cholesky.forward(signValues, v, vSolved);
        vSolved = size;
        double sq = 0;
        for (int k = 0; k < size; k++) {
            q[k] = v[k];
            sq += v[k] * v[k];
        }
        cholesky.backward(q);
        directionScale = 1 / Math.sqrt(sq);
        for (int k = 0; k < size; k++) {
            w[k] = directionScale * q[k];
        }
        int lo = size;
        int hi = end;
        java.util.Arrays.fill(a, lo, hi, 0);
        if (pendingJoin) {
            directionWithJoin(lo, hi);
            return;
        }
        double u = directionScale;
        int k = 0;
        for (; k + 3 < size; k += 4) {
            RowKernels.fma4(a, lo, hi, u * v[k], rows[k], u * v[k + 1], rows[k + 1], u * v[k + 2], rows[k + 2],
                    u * v[k + 3], rows[k + 3]);
        }
        for (; k < size; k++) {
            RowKernels.fma1(a, lo, hi, u * v[k], rows[k]);
        }
    }

    /**
     * The pass of {@link #direction()} after a join at active position n = |A| − 1: one sweep over rows
     * 0 … n−1 accumulates both t = Σ_k l_k·rows[k] (l = L⁻¹G_{A,j} of the joining column j, saved at the
     * join) and Σ_k A_A v_k·rows[k]; then the new row is (G_{j,·} − t)/L_nn, the next row of the Cholesky
     * factorization, and a gets its last term.
     */
    private void directionWithJoin(int lo, int hi) {
        int n = size - 1;
        if (rows[n] == null) {
            rows[n] = new double[p];
        }
        java.util.Arrays.fill(partial, lo, hi, 0);
        double u = directionScale;
        double[] l = pendingRow;
        int k = 0;
        for (; k + 3 < n; k += 4) {
            RowKernels.fma4Twice(a, partial, lo, hi, u * v[k], u * v[k + 1], u * v[k + 2], u * v[k + 3],
                    l[k], l[k + 1], l[k + 2], l[k + 3], rows[k], rows[k + 1], rows[k + 2], rows[k + 3]);
        }
        for (; k < n; k++) {
            RowKernels.fma1Twice(a, partial, lo, hi, u * v[k], l[k], rows[k]);
        }
        buildRow(active[n], gramRow);
        double pivot = cholesky.entry(n, n);
        double vn = directionScale * v[n];
        double[] rn = rows[n];
        for (int j = lo; j < hi; j++) {
            double z = (gramRow[j] - partial[j]) / pivot;
            rn[j] = z;
            a[j] = Math.fma(vn, z, a[j]);
        }
        pendingJoin = false;
    }

    /** Smallest positive γ at which an active coefficient reaches zero; sets {@link #dropPosition}. */
    private double dropStep() {
        double best = Double.POSITIVE_INFINITY;
        dropPosition = -1;
        for (int k = 0; k < size; k++) {
            double gk = -beta[active[k]] / w[k];
            if (gk > 0 && gk < best) {
                best = gk;
                dropPosition = k;
            }
        }
        return best;
    }

    /**
     * The inactive column whose correlation reaches the active level first, strictly before {@code limit}
     * (equal steps: the lowest column index); collinear candidates found on the way are excluded. Sets
     * {@link #hitStep}. Returns −1 if none.
     */
    private int hitter(double limit, int justLeft) {
        while (true) {
            int best = -1;
            double bestStep = limit;
            for (int j = size; j < end; j++) {
                int column = columnAt[j];
                double gj = entryStep(j, column == justLeft);
                if (gj < bestStep || (gj == bestStep && best >= 0 && column < best)) {
                    best = column;
                    bestStep = gj;
                }
            }
            if (best < 0 || !isCollinear(best)) {
                hitStep = bestStep;
                return best;
            }
            exclude(best);
        }
    }

    /**
     * γ at which the inactive column at storage position j reaches ±λ; for the column that just left, the
     * branch it left from is skipped (its numerator is zero there, the column would re-enter at once).
     */
    private double entryStep(int j, boolean justLeft) {
        double cj = chat[j];
        double up = branch(lambda - cj, directionScale - a[j]);
        double down = options.positive() ? Double.POSITIVE_INFINITY : branch(lambda + cj, directionScale + a[j]);
        if (justLeft) {
            if (options.positive() || cj > 0) {
                up = Double.POSITIVE_INFINITY;
            } else {
                down = Double.POSITIVE_INFINITY;
            }
        }
        return Math.min(up, down);
    }

    private static double branch(double numerator, double denominator) {
        return denominator > 0 ? Math.max(numerator, 0) / denominator : Double.POSITIVE_INFINITY;
    }

    /**
     * At the end of the path: {@link StopReason#RANK} if a column was set aside as collinear or a remaining
     * inactive column is collinear with the final active set (such columns stay inactive, not excluded).
     */
    private StopReason endReason() {
        boolean rank = collinearFound;
        for (int j = size; j < end && !rank; j++) {
            rank = isCollinear(columnAt[j]);
        }
        return rank ? StopReason.RANK : StopReason.COMPLETE;
    }

    /**
     * The knot at the current state. Only active columns have nonzero coefficients; the intercept
     * μ_y − Σ μ_j β_raw,j sums over them in order of entry.
     */
    private Knot knot(int step, int entered, int left) {
        int[] act = java.util.Arrays.copyOf(active, size);
        int[] sg = java.util.Arrays.copyOf(signs, size);
        double[] std = new double[size];
        double[] raw = new double[size];
        double intercept = in.meanY();
        int df = 0;
        for (int k = 0; k < size; k++) {
            int j = active[k];
            double b = beta[j];
            if (b != 0) {
                std[k] = b;
                raw[k] = b / d[j];
                intercept -= in.meanX(j) * raw[k];
                df++;
            }
        }
        double rss = residualSumOfSquares();
        double r2 = in.cyy() > 0 ? 1 - rss / in.cyy() : 0;
        double relative = lambdaMax > 0 ? lambda / lambdaMax : 1;
        return Knot.builder().step(step).penalty(lambda, step == 0 ? 1 : relative).active(act, sg)
                .coefficients(p, std, raw, intercept).fit(rss, r2, df).events(entered, left).build();
    }

    /**
     * C_yy − 2βᵀc + βᵀGβ with G the correlation matrix (ridge removed), from the current correlations: since
     * (G + λ₂I)β = c − ĉ, it equals C_yy − βᵀ(c + ĉ + λ₂β), a sum over the active set only (O(|A|) instead
     * of O(|A|²)). Negatives from rounding become 0.
     */
    private double residualSumOfSquares() {
        double ridge = options.ridge();
        double rss = in.cyy();
        for (int k = 0; k < size; k++) {
            int i = active[k];
            rss -= beta[i] * (c[i] + chat[positionOf[i]] + ridge * beta[i]);
        }
        return Math.max(rss, 0);
    }
}
