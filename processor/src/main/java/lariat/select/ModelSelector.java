package lariat.select;

import java.util.List;
import java.util.Locale;
import lariat.path.Knot;
import lariat.path.LassoPath;

/**
 * Chooses one model on a lasso or LARS path by a {@link SelectionSpec}:
 * <ul>
 *   <li>relative penalty r: the model at λ = r·λmax, exactly interpolated between knots;</li>
 *   <li>max active m: the least penalized knot with at most m nonzero coefficients;</li>
 *   <li>target R² t: the most penalized model with R² ≥ t. On the segment between knots k−1 and k the
 *       coefficients are β(s) = β_{k−1} + sΔ, so RSS(s) = RSS_{k−1} + 2s Δᵀ(C_xx β_{k−1} − C_xy)
 *       + s² ΔᵀC_xxΔ, and the smallest s ∈ [0, 1] with RSS(s) = (1 − t) C_yy is a quadratic root;
 *       if the path never reaches t its last knot is chosen and the note says so;</li>
 *   <li>Cp, AIC, BIC: the knot minimizing the criterion ({@link Criteria}; ties go to the earlier,
 *       sparser knot); refused with an {@link IllegalArgumentException} when σ² cannot be estimated;</li>
 *   <li>CV: the grid point of the {@link CvCurve} with least error, or its one-standard-error point.</li>
 * </ul>
 * RSS and R² of the chosen model are recomputed from the moments, whatever the rule.
 */
public final class ModelSelector {

    private ModelSelector() {
    }

    /**
     * @param path the path fitted on {@code m}
     * @param m    the moments the path was fitted on
     * @param spec the rule
     * @param cv   the cross-validation curve when the rule is CV, otherwise ignored (may be null)
     * @throws IllegalArgumentException when the rule cannot be applied (no CV curve for CV; no σ² for
     *                                  Cp, AIC or BIC), with the reason
     */
    public static SelectedModel select(LassoPath path, RegressionMoments m, SelectionSpec spec, CvCurve cv) {
        if (path.p() != m.p()) {
            throw new IllegalArgumentException("path has p = " + path.p() + " but moments have p = " + m.p());
        }
        NoiseEstimate noise = NoiseEstimate.of(path, m);
        SelectedModel.Builder b = new SelectedModel.Builder();
        b.rule = spec.rule();
        PathPoint point;
        switch (spec.rule()) {
            case RELATIVE_PENALTY -> {
                b.parameter = spec.value();
                point = PathPoint.at(path, spec.value());
            }
            case MAX_ACTIVE -> {
                b.parameter = spec.value();
                point = PathPoint.atKnot(path, lastKnotWithAtMost(path, (int) spec.value()));
            }
            case TARGET_R2 -> {
                b.parameter = spec.value();
                point = targetR2(path, m, spec.value(), b);
            }
            case CP, AIC, BIC -> {
                if (!noise.available()) {
                    throw new IllegalArgumentException(spec.rule().label() + " needs the noise variance: "
                            + noise.reason() + "; choose cv, relative-penalty, max-active or target-r2");
                }
                point = PathPoint.atKnot(path, bestByCriterion(path, m, noise, spec.rule()));
            }
            case CV -> {
                if (cv == null) {
                    throw new IllegalArgumentException("rule cv needs a cross-validation curve");
                }
                b.parameter = cv.folds();
                b.cv = cv;
                int g = spec.oneStandardError() ? cv.oneSeIndex() : cv.minIndex();
                point = PathPoint.at(path, cv.relativePenalties()[g]);
            }
            default -> throw new IllegalArgumentException("unknown rule " + spec.rule());
        }
        b.penalty = point.penalty();
        b.relativePenalty = point.relativePenalty();
        b.raw = point.raw();
        b.standardized = point.standardized();
        b.intercept = point.intercept();
        b.active = point.nonzero();
        b.rss = m.squaredError(b.intercept, b.raw);
        b.r2 = m.cyy() > 0 ? 1 - b.rss / m.cyy() : 0.0;
        if (noise.available()) {
            b.criteria = Criteria.of(b.rss, m.totalWeight(), b.active.length, noise);
        } else {
            b.note = join(b.note, "criteria not computed: " + noise.reason());
        }
        if (spec.refit()) {
            LeastSquaresFit refit = LeastSquaresFit.of(m, b.active);
            if (refit.solved()) {
                b.refit = refit;
            } else {
                b.note = join(b.note, "no least-squares refit: " + refit.reason());
            }
        }
        return SelectedModel.of(b);
    }

    static int lastKnotWithAtMost(LassoPath path, int maxActive) {
        List<Knot> knots = path.knots();
        int best = 0;
        for (int k = 0; k < knots.size(); k++) {
            if (PathPoint.atKnot(path, k).nonzero().length <= maxActive) {
                best = k;
            }
        }
        return best;
    }

    static int bestByCriterion(LassoPath path, RegressionMoments m, NoiseEstimate noise, SelectionRule rule) {
        int best = -1;
        double bestValue = Double.POSITIVE_INFINITY;
        for (int k = 0; k < path.knots().size(); k++) {
            PathPoint pt = PathPoint.atKnot(path, k);
            Criteria c = Criteria.of(m.squaredError(pt.intercept(), pt.raw()), m.totalWeight(), pt.nonzero().length,
                    noise);
            double v = rule == SelectionRule.CP ? c.cp() : rule == SelectionRule.AIC ? c.aic() : c.bic();
            if (v < bestValue) {
                bestValue = v;
                best = k;
            }
        }
        return Math.max(best, 0);
    }

    private static PathPoint targetR2(LassoPath path, RegressionMoments m, double target, SelectedModel.Builder b) {
        double goal = (1 - target) * m.cyy();
        List<Knot> knots = path.knots();
        PathPoint prev = PathPoint.atKnot(path, 0);
        if (m.squaredError(prev.intercept(), prev.raw()) <= goal) {
            return prev;
        }
        for (int k = 1; k < knots.size(); k++) {
            PathPoint cur = PathPoint.atKnot(path, k);
            if (m.squaredError(cur.intercept(), cur.raw()) <= goal) {
                double s = crossing(m, prev.raw(), cur.raw(), goal);
                double lambda = prev.penalty() + s * (cur.penalty() - prev.penalty());
                if (s >= 1 || path.lambdaMax() <= 0) {
                    return cur;
                }
                return PathPoint.at(path, Math.min(1.0, Math.max(0.0, lambda / path.lambdaMax())));
            }
            prev = cur;
        }
        b.note = join(b.note, String.format(Locale.ROOT, "target R² %.4g not reached; the path ends at R² %.4g",
                target, m.r2(prev.raw())));
        return prev;
    }

    /** Smallest s in [0, 1] with RSS(β0 + s(β1 − β0)) = goal, given RSS(β0) &gt; goal &gt;= RSS(β1). */
    static double crossing(RegressionMoments m, double[] beta0, double[] beta1, double goal) {
        int p = m.p();
        double[] cxx = m.cxx();
        double[] cxy = m.cxy();
        double lin = 0;
        double quad = 0;
        for (int i = 0; i < p; i++) {
            double di = beta1[i] - beta0[i];
            if (di == 0) {
                continue;
            }
            double rowB = 0;
            double rowD = 0;
            for (int j = 0; j < p; j++) {
                rowB += cxx[i * p + j] * beta0[j];
                rowD += cxx[i * p + j] * (beta1[j] - beta0[j]);
            }
            lin += 2 * di * (rowB - cxy[i]);
            quad += di * rowD;
        }
        double c0 = m.squaredError(m.interceptFor(beta0), beta0) - goal;
        double s;
        if (Math.abs(quad) <= 1e-15 * Math.abs(lin)) {
            s = lin != 0 ? -c0 / lin : 1.0;
        } else {
            double disc = Math.max(0.0, lin * lin - 4 * quad * c0);
            double q = -0.5 * (lin + Math.copySign(Math.sqrt(disc), lin));
            double r1 = q / quad;
            double r2 = q != 0 ? c0 / q : r1;
            double lo = Math.min(r1, r2);
            double hi = Math.max(r1, r2);
            s = lo >= 0 ? lo : hi;
        }
        return Math.min(1.0, Math.max(0.0, s));
    }

    private static String join(String a, String b) {
        return a == null ? b : a + "; " + b;
    }
}
