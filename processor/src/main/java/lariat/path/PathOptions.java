package lariat.path;

import java.util.Objects;

/**
 * What path to compute and where to stop. Immutable; build with {@link #builder()}.
 *
 * <p>Defaults: {@link PathMethod#LASSO}, not positive, no ridge, and no stopping rule, so the path runs to
 * its end (the least-squares fit, or the fit at the rank when p exceeds the number of rows), and a collinear
 * tolerance of {@value #DEFAULT_COLLINEAR_TOLERANCE}.
 */
public final class PathOptions {

    /** The default {@link #collinearTolerance()}. */
    public static final double DEFAULT_COLLINEAR_TOLERANCE = 1e-10;

    private final PathMethod method;
    private final boolean positive;
    private final double ridge;
    private final int maxActive;
    private final double targetR2;
    private final double minRelativePenalty;
    private final int maxSteps;
    private final double collinearTolerance;

    private PathOptions(Builder b) {
        this.method = b.method;
        this.positive = b.positive;
        this.ridge = b.ridge;
        this.maxActive = b.maxActive;
        this.targetR2 = b.targetR2;
        this.minRelativePenalty = b.minRelativePenalty;
        this.maxSteps = b.maxSteps;
        this.collinearTolerance = b.collinearTolerance;
    }

    /** A builder holding the defaults. */
    public static Builder builder() {
        return new Builder();
    }

    /** The defaults: the whole lasso path. */
    public static PathOptions defaults() {
        return builder().build();
    }

    public PathMethod method() {
        return method;
    }

    /**
     * Whether coefficients are constrained to be non-negative on the standardized scale (the positive
     * lasso of Efron et al. 2004, section 3.4): only positive correlations join the active set and the
     * penalty is max_j c_j instead of max_j |c_j|.
     */
    public boolean positive() {
        return positive;
    }

    /**
     * The ridge penalty λ₂ ≥ 0 of the naive elastic net of Zou and Hastie, "Regularization and variable
     * selection via the elastic net", J. R. Statist. Soc. B 67(2), 2005: the path solves
     * ½‖y − Xβ‖² + ½λ₂‖β‖² + λ‖β‖₁ on the standardized scale.
     */
    public double ridge() {
        return ridge;
    }

    /** The largest active-set size allowed; {@link Integer#MAX_VALUE} when unlimited. */
    public int maxActive() {
        return maxActive;
    }

    /** The R² at which the path stops; {@link Double#POSITIVE_INFINITY} when there is no such rule. */
    public double targetR2() {
        return targetR2;
    }

    /** The relative penalty λ/λ_max at or below which the path stops; 0 when there is no such rule. */
    public double minRelativePenalty() {
        return minRelativePenalty;
    }

    /** The largest number of steps; {@link Integer#MAX_VALUE} when unlimited (the engine still has a guard). */
    public int maxSteps() {
        return maxSteps;
    }

    /**
     * The relative squared Cholesky pivot at or below which a joining column is collinear with the active
     * set: it is set aside when G_jj − ‖L⁻¹G_{A,j}‖² ≤ tolerance·G_jj, that is when its squared multiple
     * correlation with the active columns exceeds 1 − tolerance.
     */
    public double collinearTolerance() {
        return collinearTolerance;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof PathOptions x && x.method == method && x.positive == positive
                && Double.compare(x.ridge, ridge) == 0 && x.maxActive == maxActive
                && Double.compare(x.targetR2, targetR2) == 0
                && Double.compare(x.minRelativePenalty, minRelativePenalty) == 0 && x.maxSteps == maxSteps
                && Double.compare(x.collinearTolerance, collinearTolerance) == 0;
    }

    @Override
    public int hashCode() {
        return Objects.hash(method, positive, ridge, maxActive, targetR2, minRelativePenalty, maxSteps,
                collinearTolerance);
    }

    @Override
    public String toString() {
        return "PathOptions{method=" + method + ", positive=" + positive + ", ridge=" + ridge
                + ", maxActive=" + maxActive + ", targetR2=" + targetR2
                + ", minRelativePenalty=" + minRelativePenalty + ", maxSteps=" + maxSteps
                + ", collinearTolerance=" + collinearTolerance + "}";
    }

    /** Mutable builder; each setter validates its argument. */
    public static final class Builder {
        private PathMethod method = PathMethod.LASSO;
        private boolean positive;
        private double ridge;
        private int maxActive = Integer.MAX_VALUE;
        private double targetR2 = Double.POSITIVE_INFINITY;
        private double minRelativePenalty;
        private int maxSteps = Integer.MAX_VALUE;
        private double collinearTolerance = DEFAULT_COLLINEAR_TOLERANCE;

        private Builder() {
        }

        public Builder method(PathMethod method) {
            if (method == null) {
                throw new IllegalArgumentException("method must not be null");
            }
            this.method = method;
            return this;
        }

        public Builder positive(boolean positive) {
            this.positive = positive;
            return this;
        }

        /** @param ridge λ₂, finite and ≥ 0 */
        public Builder ridge(double ridge) {
            if (!(ridge >= 0) || !Double.isFinite(ridge)) {
                throw new IllegalArgumentException("ridge must be finite and >= 0, was " + ridge);
            }
            this.ridge = ridge;
            return this;
        }

        /** @param maxActive ≥ 1 */
        public Builder maxActive(int maxActive) {
            if (maxActive < 1) {
                throw new IllegalArgumentException("maxActive must be >= 1, was " + maxActive);
            }
            this.maxActive = maxActive;
            return this;
        }

        /** @param targetR2 in (0, 1] */
        public Builder targetR2(double targetR2) {
            if (!(targetR2 > 0 && targetR2 <= 1)) {
                throw new IllegalArgumentException("targetR2 must be in (0, 1], was " + targetR2);
            }
            this.targetR2 = targetR2;
            return this;
        }

        /** @param minRelativePenalty in [0, 1) */
        public Builder minRelativePenalty(double minRelativePenalty) {
            if (!(minRelativePenalty >= 0 && minRelativePenalty < 1)) {
                throw new IllegalArgumentException("minRelativePenalty must be in [0, 1), was " + minRelativePenalty);
            }
            this.minRelativePenalty = minRelativePenalty;
            return this;
        }

        /** @param maxSteps ≥ 1 */
        public Builder maxSteps(int maxSteps) {
            if (maxSteps < 1) {
                throw new IllegalArgumentException("maxSteps must be >= 1, was " + maxSteps);
            }
            this.maxSteps = maxSteps;
            return this;
        }

        /** @param collinearTolerance in (0, 1) */
        public Builder collinearTolerance(double collinearTolerance) {
            if (!(collinearTolerance > 0 && collinearTolerance < 1)) {
                throw new IllegalArgumentException("collinearTolerance must be in (0, 1), was " + collinearTolerance);
            }
            this.collinearTolerance = collinearTolerance;
            return this;
        }

        public PathOptions build() {
            return new PathOptions(this);
        }
    }
}
