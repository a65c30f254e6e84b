package lariat.select;

/**
 * The model chosen on a path: how it was chosen, where (penalty λ and λ/λmax), its active features
 * (indices of the nonzero coefficients, ascending), raw and standardized coefficients (length p), the
 * intercept, R², RSS = Σ w (y − a − xᵀβ)², df = number of nonzeros, the information criteria when σ²
 * could be estimated, the least-squares refit on the active set when asked for and solvable, the
 * cross-validation curve when the rule was CV, a note when the rule could not be met exactly, and the
 * factor the path's coefficients were multiplied by ({@link #coefficientScale()}: 1, or 1 + λ₂ for the
 * elastic-net rescaling of {@link RidgeRescale}). Immutable; arrays are copied in and out. Nullable parts: criteria, refit, cv, note.
 */
public final class SelectedModel {

    private final SelectionRule rule;
    private final double parameter;
    private final double penalty;
    private final double relativePenalty;
    private final int[] active;
    private final double[] raw;
    private final double[] standardized;
    private final double intercept;
    private final double r2;
    private final double rss;
    private final int df;
    private final Criteria criteria;
    private final LeastSquaresFit refit;
    private final CvCurve cv;
    private final String note;
    private final double coefficientScale;

    private SelectedModel(Builder b) {
        this.rule = b.rule;
        this.parameter = b.parameter;
        this.penalty = b.penalty;
        this.relativePenalty = b.relativePenalty;
        this.active = b.active.clone();
        this.raw = b.raw.clone();
        this.standardized = b.standardized.clone();
        this.intercept = b.intercept;
        this.r2 = b.r2;
        this.rss = b.rss;
        this.df = b.active.length;
        this.criteria = b.criteria;
        this.refit = b.refit;
        this.cv = b.cv;
        this.note = b.note;
        this.coefficientScale = b.coefficientScale;
    }

    /** Assembled by {@link ModelSelector}; validated here. */
    static SelectedModel of(Builder b) {
        if (b.rule == null || b.active == null || b.raw == null || b.standardized == null
                || b.raw.length != b.standardized.length) {
            throw new IllegalArgumentException("rule, active, raw and standardized (of equal length) are required");
        }
        if (!(b.coefficientScale >= 1) || Double.isInfinite(b.coefficientScale)) {
            throw new IllegalArgumentException("coefficientScale must be finite and >= 1, was " + b.coefficientScale);
        }
        if (b.refit != null && !b.refit.solved()) {
            throw new IllegalArgumentException("refit must be solved or null");
        }
        return new SelectedModel(b);
    }

    public SelectionRule rule() {
        return rule;
    }

    /** The rule's parameter (r, m, target R², or K for CV); NaN for Cp, AIC and BIC. */
    public double parameter() {
        return parameter;
    }

    public double penalty() {
        return penalty;
    }

    public double relativePenalty() {
        return relativePenalty;
    }

    public int[] active() {
        return active.clone();
    }

    public double[] rawCoefficients() {
        return raw.clone();
    }

    public double[] standardizedCoefficients() {
        return standardized.clone();
    }

    public double intercept() {
        return intercept;
    }

    public double r2() {
        return r2;
    }

    public double rss() {
        return rss;
    }

    public int df() {
        return df;
    }

    /** Cp, AIC and BIC at this model, or {@code null} when σ² could not be estimated. */
    public Criteria criteria() {
        return criteria;
    }

    /** The least-squares refit on {@link #active()}, or {@code null}. */
    public LeastSquaresFit refit() {
        return refit;
    }

    /** The cross-validation curve, or {@code null} unless the rule was CV. */
    public CvCurve cv() {
        return cv;
    }

    /** A remark (target not reached, refit not solvable, σ² unavailable), or {@code null}. */
    public String note() {
        return note;
    }

    /**
     * The factor the path's coefficients at the chosen point were multiplied by: 1 for the path's own
     * (for a ridge penalty, the naive elastic-net) coefficients, 1 + λ₂ after {@link RidgeRescale}.
     */
    public double coefficientScale() {
        return coefficientScale;
    }

    /** A builder holding every part of this model; package use only. */
    Builder toBuilder() {
        Builder b = new Builder();
        b.rule = rule;
        b.parameter = parameter;
        b.penalty = penalty;
        b.relativePenalty = relativePenalty;
        b.active = active.clone();
        b.raw = raw.clone();
        b.standardized = standardized.clone();
        b.intercept = intercept;
        b.r2 = r2;
        b.rss = rss;
        b.criteria = criteria;
        b.refit = refit;
        b.cv = cv;
        b.note = note;
        b.coefficientScale = coefficientScale;
        return b;
    }

    /** Mutable assembly of a model; package use only. */
    static final class Builder {
        SelectionRule rule;
        double parameter = Double.NaN;
        double penalty;
        double relativePenalty;
        int[] active;
        double[] raw;
        double[] standardized;
        double intercept;
        double r2;
        double rss;
        Criteria criteria;
        LeastSquaresFit refit;
        CvCurve cv;
        String note;
        double coefficientScale = 1.0;
    }
}
