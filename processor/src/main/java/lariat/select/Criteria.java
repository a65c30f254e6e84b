package lariat.select;

/**
 * Cp, AIC and BIC of one model on the path, in the form of Zou, Hastie &amp; Tibshirani, "On the 'degrees
 * of freedom' of the lasso", Annals of Statistics 35(5), 2007 (formulas as recalled from that paper),
 * with df = the number of nonzero coefficients (their unbiased estimate of the lasso's degrees of
 * freedom), n = the effective sample size and the residual mean square m = RSS / W per unit weight:
 * <pre>
 *   Cp  = m + 2 df σ̂² / n
 *   AIC = m / σ̂² + 2 df / n
 *   BIC = m / σ̂² + ln(n) df / n
 * </pre>
 * with σ̂² from {@link NoiseEstimate}. With unit weights m = RSS/n, and Cp is Mallows' Cp (Mallows 1973,
 * Technometrics 15(4)) divided by n/σ̂² and shifted by a constant, so the three rank models like the
 * classical criteria. Immutable.
 */
public final class Criteria {

    private final double cp;
    private final double aic;
    private final double bic;
    private final int df;
    private final double effectiveSize;
    private final double sigma2;

    private Criteria(double cp, double aic, double bic, int df, double effectiveSize, double sigma2) {
        this.cp = cp;
        this.aic = aic;
        this.bic = bic;
        this.df = df;
        this.effectiveSize = effectiveSize;
        this.sigma2 = sigma2;
    }

    /**
     * @param rss         Σ w (y − a − xᵀβ)²
     * @param totalWeight W &gt; 0
     * @param df          number of nonzero coefficients
     * @param noise       an available noise estimate
     */
    public static Criteria of(double rss, double totalWeight, int df, NoiseEstimate noise) {
        if (!noise.available()) {
            throw new IllegalArgumentException("noise estimate unavailable: " + noise.reason());
        }
        return of(rss, totalWeight, df, noise.effectiveSize(), noise.sigma2());
    }

    /** The criteria for explicit n and σ̂² (both &gt; 0). */
    public static Criteria of(double rss, double totalWeight, int df, double effectiveSize, double sigma2) {
        if (!(rss >= 0) || !(totalWeight > 0) || df < 0 || !(effectiveSize > 0) || !(sigma2 > 0)) {
            throw new IllegalArgumentException("need rss >= 0, totalWeight > 0, df >= 0, effectiveSize > 0, "
                    + "sigma2 > 0; got " + rss + ", " + totalWeight + ", " + df + ", " + effectiveSize + ", " + sigma2);
        }
        double m = rss / totalWeight;
        double n = effectiveSize;
        return new Criteria(m + 2 * df * sigma2 / n, m / sigma2 + 2.0 * df / n, m / sigma2 + Math.log(n) * df / n,
                df, n, sigma2);
    }

    public double cp() {
        return cp;
    }

    public double aic() {
        return aic;
    }

    public double bic() {
        return bic;
    }

    public int df() {
        return df;
    }

    public double effectiveSize() {
        return effectiveSize;
    }

    public double sigma2() {
        return sigma2;
    }
}
