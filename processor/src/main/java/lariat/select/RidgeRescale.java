package lariat.select;

/**
 * The elastic-net estimate from the naive one: the chosen model's coefficients multiplied by 1 + λ₂.
 *
 * <p>With a ridge penalty λ₂ the path solves, on the standardized scale (centered features scaled to unit
 * weighted norm, centered target), the naive elastic net ½‖y − Xβ‖² + ½λ₂‖β‖² + λ‖β‖₁. Twice that
 * objective is ‖y − Xβ‖² + λ₂‖β‖² + 2λ‖β‖₁, the naive elastic-net criterion of Zou &amp; Hastie,
 * "Regularization and variable selection via the elastic net", J. R. Statist. Soc. B 67(2), 2005,
 * 301–320, with the same λ₂ and their λ₁ = 2λ. Their section 3.2 defines the elastic-net estimate as
 * (1 + λ₂) times the naive estimate, undoing the extra ridge shrinkage while keeping the naive fit's
 * active set (stated from memory of that section; the equation number is not given here because it
 * was not checked).
 *
 * <p>{@link #apply} multiplies the standardized coefficients by f = 1 + λ₂, recomputes the raw ones as
 * β_j / d_j with d_j = √C_jj, the intercept μ_y − μ_xᵀβ_raw, and RSS and R² from the moments
 * (RSS = C_yy − 2βᵀC_xy + βᵀC_xxβ at that intercept, {@link RegressionMoments#squaredError}); Cp, AIC and
 * BIC are recomputed from the new RSS with the same σ̂² and effective size. Everything else is the
 * chosen model's own: the rule, penalty and active set (chosen on the naive path), the least-squares
 * refit on the active set (which does not depend on the scale), the cross-validation curve (of the naive
 * path) and the note.
 */
public final class RidgeRescale {

    private RidgeRescale() {
    }

    /**
     * The elastic-net version of {@code naive}; {@code naive} itself when {@code ridge} is 0.
     *
     * @param naive the model chosen on a path fitted with ridge penalty {@code ridge} on {@code m};
     *              not yet rescaled
     * @param m     the moments the path was fitted on
     * @param ridge λ₂ &gt;= 0, finite
     * @throws IllegalArgumentException when {@code ridge} is negative or not finite, {@code naive} is
     *                                  already rescaled, or its width is not {@code m}'s
     */
    public static SelectedModel apply(SelectedModel naive, RegressionMoments m, double ridge) {
        if (!(ridge >= 0) || Double.isInfinite(ridge)) {
            throw new IllegalArgumentException("ridge must be finite and >= 0, was " + ridge);
        }
        if (naive.coefficientScale() != 1.0) {
            throw new IllegalArgumentException("model is already rescaled by " + naive.coefficientScale());
        }
        int p = m.p();
        if (naive.rawCoefficients().length != p) {
            throw new IllegalArgumentException("model has " + naive.rawCoefficients().length
                    + " coefficients but the moments have p = " + p);
        }
        if (ridge == 0) {
            return naive;
        }
        double factor = 1 + ridge;
        double[] cxx = m.cxx();
        SelectedModel.Builder b = naive.toBuilder();
        for (int j = 0; j < p; j++) {
            double s = factor * b.standardized[j];
            b.standardized[j] = s;
            b.raw[j] = s == 0 ? 0 : s / Math.sqrt(cxx[j * p + j]);
        }
        b.coefficientScale = factor;
        b.intercept = m.interceptFor(b.raw);
        b.rss = m.squaredError(b.intercept, b.raw);
        b.r2 = m.cyy() > 0 ? 1 - b.rss / m.cyy() : 0.0;
        Criteria c = naive.criteria();
        if (c != null) {
            b.criteria = Criteria.of(b.rss, m.totalWeight(), b.active.length, c.effectiveSize(), c.sigma2());
        }
        return SelectedModel.of(b);
    }
}
