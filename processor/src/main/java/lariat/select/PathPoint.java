package lariat.select;

import java.util.List;
import lariat.path.Knot;
import lariat.path.LassoPath;

/**
 * The model at one relative penalty r = λ/λmax on a path, by exact linear interpolation between the two
 * knots around λ = r·λmax (the lasso and LARS paths are piecewise linear in λ; Efron, Hastie, Johnstone &amp;
 * Tibshirani 2004, Annals of Statistics 32(2), Lemma 1 and Theorem 1). Below the last knot's penalty
 * the last knot is used: the path was stopped there, or ended at the least-squares fit. Immutable.
 */
public final class PathPoint {

    private final double penalty;
    private final double relativePenalty;
    private final double[] raw;
    private final double[] standardized;
    private final double intercept;

    private PathPoint(double penalty, double relativePenalty, double[] raw, double[] standardized,
                      double intercept) {
        this.penalty = penalty;
        this.relativePenalty = relativePenalty;
        this.raw = raw;
        this.standardized = standardized;
        this.intercept = intercept;
    }

    /** The model at relative penalty {@code relativePenalty} in [0, 1]. */
    public static PathPoint at(LassoPath path, double relativePenalty) {
        if (!(relativePenalty >= 0 && relativePenalty <= 1)) {
            throw new IllegalArgumentException("relativePenalty must be in [0, 1], was " + relativePenalty);
        }
        List<Knot> knots = path.knots();
        Knot last = knots.get(knots.size() - 1);
        double lambda = relativePenalty * path.lambdaMax();
        if (lambda <= last.penalty()) {
            double rel = path.lambdaMax() > 0 ? last.penalty() / path.lambdaMax() : 0.0;
            return new PathPoint(last.penalty(), Math.max(rel, relativePenalty), last.raw(), last.standardized(),
                    last.intercept());
        }
        return new PathPoint(lambda, relativePenalty, path.rawCoefficientsAt(lambda),
                path.standardizedCoefficientsAt(lambda), path.interceptAt(lambda));
    }

    /** The model at knot {@code k}. */
    public static PathPoint atKnot(LassoPath path, int k) {
        Knot knot = path.knots().get(k);
        return new PathPoint(knot.penalty(), knot.relativePenalty(), knot.raw(), knot.standardized(),
                knot.intercept());
    }

    /** λ actually used (never below the last knot's). */
    public double penalty() {
        return penalty;
    }

    /** The relative penalty asked for, or the last knot's when that is larger. */
    public double relativePenalty() {
        return relativePenalty;
    }

    public double[] raw() {
        return raw.clone();
    }

    public double[] standardized() {
        return standardized.clone();
    }

    public double intercept() {
        return intercept;
    }

    /** Indices of the nonzero coefficients, ascending. */
    public int[] nonzero() {
        int n = 0;
        for (double b : raw) {
            if (b != 0) {
                n++;
            }
        }
        int[] out = new int[n];
        n = 0;
        for (int j = 0; j < raw.length; j++) {
            if (raw[j] != 0) {
                out[n++] = j;
            }
        }
        return out;
    }
}
