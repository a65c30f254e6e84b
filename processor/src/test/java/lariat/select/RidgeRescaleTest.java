package lariat.select;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;
import org.junit.jupiter.api.Test;

/**
 * {@link RidgeRescale} against naive computations on the raw rows: the elastic-net estimate of Zou &amp;
 * Hastie (J. R. Statist. Soc. B 67(2), 2005, section 3.2, from memory) is (1 + λ₂) times the naive one.
 */
class RidgeRescaleTest {

    /** Relative tolerance of squared errors, intercepts and correlations from moments against direct sums. */
    static final double SUM_TOL = 1e-9;
    /** Relative tolerance of a ratio of two coefficients that differ by one rounded product and quotient. */
    static final double RATIO_TOL = 1e-14;

    static final double RIDGE = 0.7;

    /** A model chosen on a ridge path over random rows; the columns have means far from zero. */
    private static final class Case {
        final RawRows rows;
        final RegressionMoments m;
        final SelectedModel naive;
        final SelectedModel rescaled;

        Case(long seed, SelectionSpec spec) {
            rows = new RawRows(seed, 80 + (int) (seed * 7 % 50), 6, seed % 2 == 0);
            m = RegressionMoments.of(rows.moments(null), rows.features(), rows.p);
            LassoPath path = new PathEngine(rows.p).fit(m.gramInput(), PathOptions.builder().ridge(RIDGE).build());
            naive = ModelSelector.select(path, m, spec, null);
            rescaled = RidgeRescale.apply(naive, m, RIDGE);
        }

        /** Weighted mean of column j (the target for j = p), summed directly. */
        double mean(int j) {
            double sw = 0;
            double s = 0;
            for (int i = 0; i < rows.n; i++) {
                sw += rows.w[i];
                s += rows.w[i] * (j == rows.p ? rows.y[i] : rows.x[i][j]);
            }
            return s / sw;
        }

        /** Σ w (u − ū)(v − v̄) of columns j and k (the target for p), summed directly. */
        double comoment(int j, int k) {
            double mj = mean(j);
            double mk = mean(k);
            double s = 0;
            for (int i = 0; i < rows.n; i++) {
                double a = (j == rows.p ? rows.y[i] : rows.x[i][j]) - mj;
                double b = (k == rows.p ? rows.y[i] : rows.x[i][k]) - mk;
                s += rows.w[i] * a * b;
            }
            return s;
        }
    }

    private static SelectionSpec relative(double r) {
        return SelectionSpec.of(SelectionRule.RELATIVE_PENALTY, r, false, true);
    }

    @Test
    void apply_ridgePath_interceptRssAndR2EqualDirectSumsOnRawRows() {
        for (long seed = 1; seed <= 12; seed++) {
            Case c = new Case(seed, relative(0.05 + 0.03 * seed));
            double[] beta = c.rescaled.rawCoefficients();
            double a = c.mean(c.rows.p);
            for (int j = 0; j < c.rows.p; j++) {
                a -= c.mean(j) * beta[j];
            }
            assertEquals(a, c.rescaled.intercept(), SUM_TOL * Math.abs(c.mean(c.rows.p)) + SUM_TOL, "seed " + seed);
            double direct = c.rows.squaredError(null, a, beta);
            assertEquals(direct, c.rescaled.rss(), SUM_TOL * direct, "seed " + seed);
            double tss = c.comoment(c.rows.p, c.rows.p);
            assertEquals(1 - direct / tss, c.rescaled.r2(), SUM_TOL, "seed " + seed);
            assertTrue(c.rescaled.rss() != c.naive.rss(), "seed " + seed + ": the rescaled model must have its own RSS");
        }
    }

    @Test
    void apply_ridgePath_factorIsExactlyOnePlusRidgeOnStandardizedScale() {
        for (long seed = 1; seed <= 12; seed++) {
            Case c = new Case(seed, relative(0.1));
            double[] s0 = c.naive.standardizedCoefficients();
            double[] s1 = c.rescaled.standardizedCoefficients();
            double[] r0 = c.naive.rawCoefficients();
            double[] r1 = c.rescaled.rawCoefficients();
            assertTrue(c.naive.active().length > 0, "seed " + seed);
            for (int j = 0; j < c.rows.p; j++) {
                assertEquals((1 + RIDGE) * s0[j], s1[j], 0.0, "seed " + seed + " column " + j);
                if (r0[j] == 0) {
                    assertEquals(0.0, r1[j], 0.0);
                    continue;
                }
                assertEquals(1 + RIDGE, r1[j] / r0[j], RATIO_TOL, "seed " + seed + " column " + j);
                double d = Math.sqrt(c.comoment(j, j));
                assertEquals(s1[j], r1[j] * d, SUM_TOL * Math.abs(s1[j]), "seed " + seed + " column " + j);
            }
            assertEquals(1 + RIDGE, c.rescaled.coefficientScale(), 0.0);
            assertEquals(1.0, c.naive.coefficientScale(), 0.0);
            assertArrayEquals(c.naive.active(), c.rescaled.active());
            assertEquals(c.naive.penalty(), c.rescaled.penalty(), 0.0);
            assertSame(c.naive.refit(), c.rescaled.refit());
        }
    }

    /**
     * The rescaled coefficients solve the problem of Zou &amp; Hastie's Theorem 1 (as recalled):
     * min βᵀ((XᵀX + λ₂I)/(1 + λ₂))β − 2yᵀXβ + λ₁‖β‖₁ with λ₁ = 2λ; its optimality conditions on the
     * standardized scale are c_j − [(G + λ₂I)β]_j / (1 + λ₂) = λ sign(β_j) on the active set and at most λ
     * in absolute value off it, with G and c computed here directly from the raw rows.
     */
    @Test
    void apply_ridgePath_rescaledCoefficientsMeetTheElasticNetOptimalityConditions() {
        for (long seed = 1; seed <= 12; seed++) {
            Case c = new Case(seed, relative(0.05 + 0.03 * seed));
            int p = c.rows.p;
            double[] beta = c.rescaled.standardizedCoefficients();
            double[] d = new double[p];
            for (int j = 0; j < p; j++) {
                d[j] = Math.sqrt(c.comoment(j, j));
            }
            double lambda = c.rescaled.penalty();
            for (int j = 0; j < p; j++) {
                double g = RIDGE * beta[j];
                for (int k = 0; k < p; k++) {
                    g += c.comoment(j, k) / (d[j] * d[k]) * beta[k];
                }
                double corr = c.comoment(j, p) / d[j] - g / (1 + RIDGE);
                double tol = SUM_TOL * Math.sqrt(c.comoment(p, p));
                if (beta[j] != 0) {
                    assertEquals(Math.signum(beta[j]) * lambda, corr, tol, "seed " + seed + " column " + j);
                } else {
                    assertTrue(Math.abs(corr) <= lambda + tol, "seed " + seed + " column " + j + ": " + corr);
                }
            }
        }
    }

    @Test
    void apply_criteria_recomputedForTheRescaledRss() {
        Case c = new Case(3, SelectionSpec.of(SelectionRule.BIC, Double.NaN, false, false));
        Criteria before = c.naive.criteria();
        Criteria after = c.rescaled.criteria();
        Criteria expected = Criteria.of(c.rescaled.rss(), c.m.totalWeight(), c.rescaled.df(),
                before.effectiveSize(), before.sigma2());
        assertEquals(expected.bic(), after.bic(), 0.0);
        assertEquals(expected.cp(), after.cp(), 0.0);
        assertEquals(before.sigma2(), after.sigma2(), 0.0);
    }

    @Test
    void apply_zeroRidge_returnsTheModelUnchanged() {
        RawRows rows = new RawRows(5, 60, 4, true);
        RegressionMoments m = RegressionMoments.of(rows.moments(null), rows.features(), rows.p);
        LassoPath path = new PathEngine(rows.p).fit(m.gramInput(), PathOptions.defaults());
        SelectedModel naive = ModelSelector.select(path, m, relative(0.2), null);
        assertSame(naive, RidgeRescale.apply(naive, m, 0.0));
        assertEquals(1.0, naive.coefficientScale(), 0.0);
    }

    @Test
    void apply_badArguments_areRefused() {
        Case c = new Case(2, relative(0.2));
        assertThrows(IllegalArgumentException.class, () -> RidgeRescale.apply(c.naive, c.m, -0.1));
        assertThrows(IllegalArgumentException.class, () -> RidgeRescale.apply(c.naive, c.m, Double.NaN));
        assertThrows(IllegalArgumentException.class, () -> RidgeRescale.apply(c.rescaled, c.m, RIDGE));
    }
}
