package lariat.config;

/** How one point on the path is chosen for publication ({@code select.rule}). */
public enum SelectRule implements Choice {
    /** The point at a fixed ratio of penalty to the path's largest penalty ({@code select.relative.penalty}). */
    RELATIVE_PENALTY("relative-penalty"),
    /** The last point with at most {@code select.max.active} active features. */
    MAX_ACTIVE("max-active"),
    /** The first point whose R-squared reaches {@code select.target.r2}. */
    TARGET_R2("target-r2"),
    /** Mallows' Cp. */
    CP("cp"),
    /** Akaike's information criterion. */
    AIC("aic"),
    /** Schwarz's Bayesian information criterion. */
    BIC("bic"),
    /** K-fold cross-validation from fold moments ({@code select.cv.folds}). */
    CV("cv");

    private final String id;

    SelectRule(String id) {
        this.id = id;
    }

    @Override
    public String id() {
        return id;
    }
}
