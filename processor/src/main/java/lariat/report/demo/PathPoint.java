package lariat.report.demo;

import java.util.Map;

/**
 * One knot of a lasso path: the penalty relative to the largest penalty of the path
 * (λ/λ_max, from 1 down to 0) and the coefficients of the channels active there (absent = 0).
 * The report draws the path as straight segments between knots, which is exact because the
 * lasso path is piecewise linear in λ (Efron, Hastie, Johnstone &amp; Tibshirani 2004, Annals of
 * Statistics 32(2)).
 */
public final class PathPoint {

    private final double relativePenalty;
    private final Map<String, Double> coefficients;

    private PathPoint(double relativePenalty, Map<String, Double> coefficients) {
        if (!(relativePenalty >= 0 && relativePenalty <= 1)) {
            throw new IllegalArgumentException("relativePenalty must be in [0, 1], got " + relativePenalty);
        }
        this.relativePenalty = relativePenalty;
        this.coefficients = Checks.coefficients(coefficients, "coefficients");
    }

    public static PathPoint of(double relativePenalty, Map<String, Double> coefficients) {
        return new PathPoint(relativePenalty, coefficients);
    }

    public double relativePenalty() {
        return relativePenalty;
    }

    /** Channel → coefficient at this knot (unmodifiable); channels not listed are 0. */
    public Map<String, Double> coefficients() {
        return coefficients;
    }

    public double coefficient(String channel) {
        return coefficients.getOrDefault(channel, 0.0);
    }
}
