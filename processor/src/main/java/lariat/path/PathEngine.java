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
 *       ĉ is updated in place after each step, ĉ ← ĉ − γa, in a fixed order of operations, so a path is
 *       a pure function of its input, bit for bit.</li>
 *   <li>With active set A and signs s: G_AA q = s_A, A_A = (s_Aᵀq)^(−1/2), w = A_A q, a = G_{·A}w. Moving
 *       β_A += γw lowers every active |ĉ_j| by γA_A. The step is the smallest γ ≥ 0 of (λ − ĉ_j)/(A_A − a_j)
 *       and (λ + ĉ_j)/(A_A + a_j) over inactive j (only the first in the positive variant), capped by
 *       λ/A_A, which reaches the least-squares fit on A.</li>
 *   <li>Lasso: if an active β_j reaches zero first (γ_j = −β_j/w_j, smallest positive), the step stops
 *       there, j leaves A, and the next step admits no column.</li>
 * </ul>
 *
 * <p>Numerical rules (each a documented choice):
 * <ul>
 *   <li>A column is {@link ExcludedColumn.Reason#CONSTANT} if C_jj = 0, or C_jj ≤ 10⁻²⁴·max_k C_kk, or
 *       C_jj ≤ 10⁻²⁴·W·μ_j² (a relative spread below 10⁻¹² of its scale or its mean).</li>
 *   <li>A column about to join A is {@link ExcludedColumn.Reason#COLLINEAR} if its squared Cholesky pivot
 *       G_jj − ‖L⁻¹G_{A,j}‖² is at most 10⁻¹⁰·G_jj, that is its squared multiple correlation with the
 *       active columns exceeds 1 − 10⁻¹⁰. It is set aside for the rest of the path, which is then the path
 *       of the remaining columns. Rank deficiency never produces NaN or an exception.</li>
 *   <li>Ties (in λ at the start, in γ later) go to the lowest column index.</li>
 *   <li>The knot reached by the capped step has λ = 0 exactly (λ − γA_A = 0 there).</li>
 *   <li>A response with C_yy = 0 or C_yy ≤ 10⁻²⁴·W·μ_y², or with λ_max = 0, gives one knot (β = 0).</li>
 *   <li>The engine takes at most 10·(p + 1) steps whatever {@link PathOptions#maxSteps()} says.</li>
 * </ul>
 *
 * <p>Workspaces are sized once for p in the constructor; {@link #fit} allocates only the knot records and
 * the lists holding them. Reusable, not thread-safe.
 */
public final class PathEngine {

    /** Relative variance at or below which a column is constant. */
    public static final double CONSTANT_TOLERANCE = 1e-24;
    /** Relative squared pivot at or below which a joining column is collinear with the active set. */
    public static final double COLLINEAR_TOLERANCE = 1e-10;

    private static final int INACTIVE = 0;
    private static final int ACTIVE = 1;
    private static final int EXCLUDED = 2;

    private final int p;
    private final double[] d;
    private final double[] g;
    private final double[] c;
    private final double[] beta;
    private final double[] chat;
    private final double[] a;
    private final double[] q;
    private final double[] w;
    private final int[] active;
    private final int[] signs;
    private final double[] signValues;
    private final double[] v;
    private final int[] status;
    private final ActiveCholesky cholesky;

    private GramInput in;
    private PathOptions options;
    private List<ExcludedColumn> excluded;
    private int size;
    private double lambda;
    private double lambdaMax;
    private double directionScale;
    private double hitStep;
    private int dropPosition;
    private boolean collinearFound;
    private int currentStep;
    private int vSolved;

    /** @param p number of predictor columns of every input this engine will fit, ≥ 1 */
    public PathEngine(int p) {
        if (p < 1) {
            throw new IllegalArgumentException("p must be >= 1, was " + p);
        }
        this.p = p;
        this.d = new double[p];
        this.g = new double[p * p];
        this.c = new double[p];
        this.beta = new double[p];
        this.chat = new double[p];
        this.a = new double[p];
        this.q = new double[p];
        this.w = new double[p];
        this.active = new int[p];
        this.signs = new int[p];
        this.signValues = new double[p];
        this.v = new double[p];
        this.status = new int[p];
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
        recomputeCorrelations();
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
    }

    private void standardize() {
        double maxDiag = 0;
        for (int j = 0; j < p; j++) {
            maxDiag = Math.max(maxDiag, in.cxx(j, j));
        }
        for (int j = 0; j < p; j++) {
            double cjj = in.cxx(j, j);
            double mean = in.meanX(j);
            if (cjj <= 0 || cjj <= CONSTANT_TOLERANCE * maxDiag
                    || cjj <= CONSTANT_TOLERANCE * in.totalWeight() * mean * mean) {
                status[j] = EXCLUDED;
                d[j] = 0;
                excluded.add(ExcludedColumn.of(j, ExcludedColumn.Reason.CONSTANT, 0, "C_jj=" + cjj
                        + " (max_k C_kk=" + maxDiag + ", W*mean^2=" + in.totalWeight() * mean * mean + ")"));
            } else {
                d[j] = Math.sqrt(cjj);
            }
        }
        double ridge = options.ridge();
        for (int i = 0; i < p; i++) {
            c[i] = status[i] == EXCLUDED ? 0 : in.cxy(i) / d[i];
            for (int j = 0; j < p; j++) {
                boolean skip = status[i] == EXCLUDED || status[j] == EXCLUDED;
                double gij = skip ? 0 : 0.5 * (in.cxx(i, j) + in.cxx(j, i)) / (d[i] * d[j]);
                g[i * p + j] = i == j && !skip ? 1 + ridge : gij;
            }
        }
    }

    private boolean responseIsConstant() {
        double cyy = in.cyy();
        return cyy <= 0 || cyy <= CONSTANT_TOLERANCE * in.totalWeight() * in.meanY() * in.meanY();
    }

    /**
     * ĉ = c − (G + λ₂I)β exactly, as |A| passes over contiguous rows of G (G is symmetric, row A_k is column
     * A_k); entries of excluded columns are not meaningful. Only the start uses it: β = 0 there, so ĉ = c.
     */
    private void recomputeCorrelations() {
        System.arraycopy(c, 0, chat, 0, p);
        for (int k = 0; k < size; k++) {
            int column = active[k];
            axpy(-beta[column], column * p, chat);
        }
    }

    /** y_j += alpha·G[offset + j] for every j. */
    private void axpy(double alpha, int offset, double[] y) {
        for (int j = 0; j < p; j++) {
            y[j] += alpha * g[offset + j];
        }
    }

    private double currentLambda() {
        double max = 0;
        for (int j = 0; j < p; j++) {
            if (status[j] != EXCLUDED) {
                max = Math.max(max, options.positive() ? chat[j] : Math.abs(chat[j]));
            }
        }
        return max;
    }

    /** The inactive column with the largest (absolute, unless positive) correlation; probes it. */
    private int firstEntrant() {
        int best = -1;
        double bestValue = 0;
        for (int j = 0; j < p; j++) {
            double v = options.positive() ? chat[j] : Math.abs(chat[j]);
            if (status[j] == INACTIVE && v > bestValue) {
                best = j;
                bestValue = v;
            }
        }
        if (best >= 0 && isCollinear(best)) {
            exclude(best);
            return firstEntrant();
        }
        return best;
    }

    private boolean isCollinear(int column) {
        double pivotSquared = cholesky.probe(g, p, active, column);
        return !(pivotSquared > COLLINEAR_TOLERANCE * g[column * p + column]);
    }

    private void exclude(int column) {
        double pivotSquared = cholesky.probe(g, p, active, column);
        status[column] = EXCLUDED;
        collinearFound = true;
        excluded.add(ExcludedColumn.of(column, ExcludedColumn.Reason.COLLINEAR, currentStep, "squared pivot "
                + pivotSquared + " <= " + COLLINEAR_TOLERANCE + " * G_jj=" + g[column * p + column]
                + " against active columns " + java.util.Arrays.toString(java.util.Arrays.copyOf(active, size))));
    }

    private void addActive(int column) {
        cholesky.commit(column);
        active[size] = column;
        signs[size] = options.positive() || chat[column] >= 0 ? 1 : -1;
        signValues[size] = signs[size];
        status[column] = ACTIVE;
        size++;
    }

    private void removeActive(int position) {
        int column = active[position];
        cholesky.remove(position);
        System.arraycopy(active, position + 1, active, position, size - position - 1);
        System.arraycopy(signs, position + 1, signs, position, size - position - 1);
        System.arraycopy(signValues, position + 1, signValues, position, size - position - 1);
        vSolved = Math.min(vSolved, position);
        size--;
        beta[column] = 0;
        status[column] = INACTIVE;
    }

    /**
     * Takes one step. Returns the column that will join at the new knot, or −1; leaves {@link #dropPosition}
     * ≥ 0 when an active coefficient reached zero instead, and both negative when the step was the capped one.
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
        for (int k = 0; k < size; k++) {
            beta[active[k]] += gamma * w[k];
        }
        for (int j = 0; j < p; j++) {
            chat[j] -= gamma * a[j];
        }
        if (dropPosition >= 0) {
            int column = active[dropPosition];
            axpy(beta[column], column * p, chat);
            beta[column] = 0;
        }
        return hitter;
    }

    /**
     * Fills q, w (by active position), A_A and a = G_{·A}w. With v = L⁻¹s_A (kept across steps: one new
     * entry per joining column, entries from the dropped position on after a drop), s_AᵀG_AA⁻¹s_A = ‖v‖², so
     * A_A = 1/‖v‖ and q = L⁻ᵀv. a is built as |A| axpy passes over contiguous rows of G, four at a time.
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
        java.util.Arrays.fill(a, 0);
        int k = 0;
        for (; k + 3 < size; k += 4) {
            double w0 = w[k];
            double w1 = w[k + 1];
            double w2 = w[k + 2];
            double w3 = w[k + 3];
            int r0 = active[k] * p;
            int r1 = active[k + 1] * p;
            int r2 = active[k + 2] * p;
            int r3 = active[k + 3] * p;
            for (int j = 0; j < p; j++) {
                a[j] += w0 * g[r0 + j] + w1 * g[r1 + j] + w2 * g[r2 + j] + w3 * g[r3 + j];
            }
        }
        for (; k < size; k++) {
            axpy(w[k], active[k] * p, a);
        }
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
     * The inactive column whose correlation reaches the active level first, strictly before {@code limit};
     * collinear candidates found on the way are excluded. Sets {@link #hitStep}. Returns −1 if none.
     */
    private int hitter(double limit, int justLeft) {
        while (true) {
            int best = -1;
            double bestStep = limit;
            for (int j = 0; j < p; j++) {
                if (status[j] == INACTIVE) {
                    double gj = entryStep(j, j == justLeft);
                    if (gj < bestStep) {
                        best = j;
                        bestStep = gj;
                    }
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
     * γ at which inactive column j reaches ±λ; for the column that just left, the branch it left from is
     * skipped (its numerator is zero there, the column would re-enter at once).
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
        for (int j = 0; j < p && !rank; j++) {
            rank = status[j] == INACTIVE && isCollinear(j);
        }
        return rank ? StopReason.RANK : StopReason.COMPLETE;
    }

    private Knot knot(int step, int entered, int left) {
        int[] act = java.util.Arrays.copyOf(active, size);
        int[] sg = java.util.Arrays.copyOf(signs, size);
        double[] std = beta.clone();
        double[] raw = new double[p];
        double intercept = in.meanY();
        int df = 0;
        for (int j = 0; j < p; j++) {
            raw[j] = std[j] == 0 ? 0 : std[j] / d[j];
            intercept -= in.meanX(j) * raw[j];
            df += std[j] != 0 ? 1 : 0;
        }
        double rss = residualSumOfSquares();
        double r2 = in.cyy() > 0 ? 1 - rss / in.cyy() : 0;
        double relative = lambdaMax > 0 ? lambda / lambdaMax : 1;
        return Knot.builder().step(step).penalty(lambda, step == 0 ? 1 : relative).active(act, sg)
                .coefficients(std, raw, intercept).fit(rss, r2, df).events(entered, left).build();
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
            rss -= beta[i] * (c[i] + chat[i] + ridge * beta[i]);
        }
        return Math.max(rss, 0);
    }
}
