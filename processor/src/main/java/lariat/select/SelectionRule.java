package lariat.select;

import java.util.Locale;

/** How a model is chosen on the path. */
public enum SelectionRule {
    /** The model at a fixed relative penalty λ/λmax (parameter: r in [0, 1]). */
    RELATIVE_PENALTY,
    /** The least penalized knot with at most m nonzero coefficients (parameter: m). */
    MAX_ACTIVE,
    /** The most penalized model whose R² reaches the target, exactly between knots (parameter: R²). */
    TARGET_R2,
    /** The knot minimizing Cp. */
    CP,
    /** The knot minimizing AIC. */
    AIC,
    /** The knot minimizing BIC. */
    BIC,
    /** K-fold cross-validation from fold moments (parameter: K), minimum or one standard error. */
    CV;

    /** The command-line spelling: lower case with hyphens ({@code relative-penalty}). */
    public String label() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    /** The rule for a command-line spelling, case-insensitive. */
    public static SelectionRule parse(String label) {
        for (SelectionRule r : values()) {
            if (r.label().equalsIgnoreCase(label.strip())) {
                return r;
            }
        }
        throw new IllegalArgumentException("unknown selection rule '" + label
                + "'; expected relative-penalty, max-active, target-r2, cp, aic, bic or cv");
    }
}
