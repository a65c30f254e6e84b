package lariat.path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Optimality certificates of a path, checked against naive computations on the raw rows.
 *
 * <p>Lasso (Karush-Kuhn-Tucker conditions of ½‖ỹ − X̃β‖² + ½λ₂‖β‖² + λ‖β‖₁; Efron et al., Ann. Statist.
 * 32(2), 2004, lemma 8 and section 3; Zou and Hastie, JRSS B 67(2), 2005, for the ridge term): with
 * ĉ = X̃ᵀ(ỹ − X̃β) − λ₂β, ĉ_j = s_jλ on the active set, sign(β_j) = s_j where β_j ≠ 0, |ĉ_j| ≤ λ elsewhere.
 * Positive lasso: ĉ_j = λ on A, ĉ_j ≤ λ off A, β ≥ 0. LAR: equal absolute correlations λ on A with signs
 * s, |ĉ_j| ≤ λ off A (Efron et al. 2004, equations (2.14)-(2.16)).
 */
final class PathCertificates {

    /** Correlations, relative to λ_max. */
    static final double CORRELATION_TOLERANCE = 1e-9;
    /** Coefficients, relative to the largest absolute reference coefficient (at least 1). */
    static final double COEFFICIENT_TOLERANCE = 1e-8;
    /** Residual sums of squares, relative to C_yy. */
    static final double RSS_TOLERANCE = 1e-9;

    private PathCertificates() {
    }

    /**
     * Every certificate at every knot and at the midpoint of every segment, and λ_max equal to the largest
     * (positive variant: largest signed) correlation of the raw standardized columns with the response.
     */
    static void assertPath(LassoPath path, RawProblem problem, PathOptions opt) {
        List<Knot> knots = path.knots();
        double expectedMax = 0;
        for (double cj : problem.correlations(new double[problem.p], 0)) {
            expectedMax = Math.max(expectedMax, opt.positive() ? cj : Math.abs(cj));
        }
        assertEquals(expectedMax, path.lambdaMax(), CORRELATION_TOLERANCE * Math.max(expectedMax, 1e-300), "lambda max");
        double tol = CORRELATION_TOLERANCE * Math.max(path.lambdaMax(), 1e-300);
        for (Knot k : knots) {
            assertOptimal(k.standardized(), k.penalty(), k.active(), k.signs(), excludedBy(path, k.step()),
                    problem, opt, tol);
            assertFit(k, problem);
        }
        for (int i = 0; i + 1 < knots.size(); i++) {
            Knot k = knots.get(i);
            double mid = 0.5 * (k.penalty() + knots.get(i + 1).penalty());
            double[] beta = path.standardizedCoefficientsAt(mid);
            assertOptimal(beta, mid, k.active(), k.signs(), excludedBy(path, k.step()), problem, opt, tol);
            assertRawConsistent(beta, path.rawCoefficientsAt(mid), path.interceptAt(mid), problem);
        }
    }

    /** Columns set aside at or before {@code step}: they must have zero coefficients, no other condition. */
    static Set<Integer> excludedBy(LassoPath path, int step) {
        Set<Integer> out = new HashSet<>();
        path.excluded().stream().filter(e -> e.step() <= step).forEach(e -> out.add(e.column()));
        return out;
    }

    static void assertOptimal(double[] beta, double lambda, int[] active, int[] signs, Set<Integer> excluded,
                              RawProblem problem, PathOptions opt, double tol) {
        double[] c = problem.correlations(beta, opt.ridge());
        Set<Integer> onA = new HashSet<>();
        for (int k = 0; k < active.length; k++) {
            int j = active[k];
            onA.add(j);
            assertEquals(signs[k] * lambda, c[j], tol, () -> "correlation of active column " + j);
            if (opt.positive()) {
                assertEquals(1, signs[k], "sign of active column " + j);
            }
            if (opt.method() == PathMethod.LASSO) {
                assertTrue(beta[j] * signs[k] >= -tol, () -> "sign of beta " + j + "=" + beta[j]);
            }
        }
        for (int j = 0; j < beta.length; j++) {
            if (opt.positive()) {
                assertTrue(beta[j] >= -tol, "positive beta " + j + "=" + beta[j]);
            }
            if (excluded.contains(j)) {
                assertEquals(0, beta[j], 0, "excluded column has a coefficient: " + j);
            } else if (!onA.contains(j)) {
                double cj = opt.positive() ? c[j] : Math.abs(c[j]);
                assertTrue(cj <= lambda + tol, "inactive column " + j + " correlation " + c[j] + " > " + lambda);
            }
        }
    }

    /** RSS and R² of the knot against the raw rows, df against the nonzero count. */
    static void assertFit(Knot k, RawProblem problem) {
        double cyy = problem.cyy();
        double rss = problem.rss(k.raw(), k.intercept());
        assertEquals(rss, k.rss(), RSS_TOLERANCE * Math.max(cyy, 1e-300), "rss at knot " + k.step());
        double r2 = cyy > 0 ? 1 - rss / cyy : 0;
        assertEquals(r2, k.r2(), RSS_TOLERANCE, "r2 at knot " + k.step());
        int nonzero = 0;
        for (double b : k.standardized()) {
            nonzero += b != 0 ? 1 : 0;
        }
        assertEquals(nonzero, k.df(), "df at knot " + k.step());
    }

    /** β_raw = β/d and intercept = μ_y − μ_xᵀβ_raw, with d and μ from the rows. */
    static void assertRawConsistent(double[] standardized, double[] raw, double intercept, RawProblem problem) {
        double[] d = problem.scales();
        double[] mx = problem.meanX();
        double expectedIntercept = problem.meanY();
        double scale = 1;
        for (int j = 0; j < raw.length; j++) {
            double expected = d[j] == 0 ? 0 : standardized[j] / d[j];
            assertEquals(expected, raw[j], COEFFICIENT_TOLERANCE * Math.max(Math.abs(expected), 1e-300) + 1e-300,
                    "raw coefficient " + j);
            expectedIntercept -= mx[j] * expected;
            scale = Math.max(scale, Math.abs(mx[j] * expected));
        }
        assertEquals(expectedIntercept, intercept, COEFFICIENT_TOLERANCE * Math.max(scale, Math.abs(problem.meanY())),
                "intercept");
    }

    static void assertCoefficients(double[] expected, double[] actual, String what) {
        double scale = 1;
        for (double v : expected) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (int j = 0; j < expected.length; j++) {
            assertEquals(expected[j], actual[j], COEFFICIENT_TOLERANCE * scale, what + " coefficient " + j);
        }
    }
}
