package lariat.select;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;
import org.junit.jupiter.api.Test;

/** Selection rules on the hand-checkable orthogonal path of {@link HadamardCase}. */
class ModelSelectorTest {

    /** Tolerance on coefficients, R², criteria of the hand case. */
    static final double TOL = 1e-10;

    private static SelectedModel select(SelectionRule rule, double value, boolean refit) {
        return ModelSelector.select(HadamardCase.path(), HadamardCase.regression(),
                SelectionSpec.of(rule, value, false, refit), null);
    }

    @Test
    void path_hadamardCase_hasTheHandComputedKnots() {
        LassoPath path = HadamardCase.path();
        assertEquals(4, path.knots().size());
        double[] rel = {1, 2.0 / 3, 1.0 / 6, 0};
        for (int k = 0; k < 4; k++) {
            assertEquals(rel[k], path.knots().get(k).relativePenalty(), TOL);
        }
    }

    @Test
    void relativePenalty_half_interpolatesSoftThreshold() {
        SelectedModel s = select(SelectionRule.RELATIVE_PENALTY, 0.5, false);
        assertArrayEquals(new double[] {1.5, -0.5, 0}, s.rawCoefficients(), TOL);
        assertArrayEquals(new int[] {0, 1}, s.active());
        assertEquals(10, s.intercept(), TOL);
        // residual coefficients (1.5, -1.5, 0.5, 2): RSS = 8 * 8.75 = 70
        assertEquals(70, s.rss(), 1e-9);
        assertEquals(1 - 70.0 / 138, s.r2(), TOL);
        assertEquals(2, s.df());
    }

    @Test
    void maxActive_one_takesLastKnotWithOneNonzero() {
        SelectedModel s = select(SelectionRule.MAX_ACTIVE, 1, false);
        assertArrayEquals(new double[] {1, 0, 0}, s.rawCoefficients(), TOL);
        assertEquals(2.0 / 3, s.relativePenalty(), TOL);
        assertArrayEquals(new double[] {0, 0, 0}, select(SelectionRule.MAX_ACTIVE, 0, false).rawCoefficients(), 0);
    }

    @Test
    void targetR2_betweenKnots_solvesTheQuadraticExactly() {
        // On r in [1/6, 2/3]: RSS = 8 (18 r² + 4.25). R² = 0.7 means RSS = 41.4, so r = sqrt(0.925 / 18).
        SelectedModel s = select(SelectionRule.TARGET_R2, 0.7, false);
        double r = Math.sqrt(0.925 / 18);
        assertEquals(r, s.relativePenalty(), 1e-9);
        assertEquals(0.7, s.r2(), 1e-9);
        assertArrayEquals(new double[] {3 - 3 * r, -(2 - 3 * r), 0}, s.rawCoefficients(), 1e-9);
        assertNull(s.note());
    }

    @Test
    void targetR2_unreachable_takesLastKnotAndSaysSo() {
        SelectedModel s = select(SelectionRule.TARGET_R2, 0.9, false);
        assertArrayEquals(new double[] {3, -2, 0.5}, s.rawCoefficients(), TOL);
        assertTrue(s.note().contains("not reached"), s.note());
    }

    @Test
    void criteria_hadamardCase_chooseKnotTwoWithHandValues() {
        // sigma2 = RSS_LS / (n - q - 1) = 32 / 4 = 8; m = RSS / 8 = 17.25, 12.25, 4.75, 4; df = 0, 1, 2, 3.
        // Cp  = m + 2 df:               17.25, 14.25, 8.75, 10
        // AIC = m/8 + 2 df/8:           2.15625, 1.78125, 1.09375, 1.25
        // BIC = m/8 + ln(8) df/8:       2.15625, 1.79118, 1.11361, 1.27979
        for (SelectionRule rule : new SelectionRule[] {SelectionRule.CP, SelectionRule.AIC, SelectionRule.BIC}) {
            SelectedModel s = select(rule, Double.NaN, false);
            assertArrayEquals(new double[] {2.5, -1.5, 0}, s.rawCoefficients(), TOL, rule.label());
            assertEquals(8.75, s.criteria().cp(), TOL);
            assertEquals(1.09375, s.criteria().aic(), TOL);
            assertEquals(0.59375 + 2 * Math.log(8) / 8, s.criteria().bic(), TOL);
            assertEquals(8, s.criteria().sigma2(), TOL);
        }
    }

    @Test
    void refit_onActiveSet_removesShrinkage() {
        SelectedModel s = select(SelectionRule.RELATIVE_PENALTY, 0.5, true);
        assertNotNull(s.refit());
        assertArrayEquals(new double[] {3, -2, 0}, s.refit().coefficients(), TOL);
        assertEquals(10, s.refit().intercept(), TOL);
    }

    @Test
    void criteria_pGreaterThanN_refusedWithReason() {
        Moments m = new Moments(6);
        for (int i = 0; i < 4; i++) {
            m.add(new double[] {i, i * i, Math.sin(i), Math.cos(i), i % 2, 2 * i + Math.sin(3 * i)}, 1, i);
        }
        RegressionMoments rm = RegressionMoments.of(m, new int[] {0, 1, 2, 3, 4}, 5);
        LassoPath path = new PathEngine(5).fit(rm.gramInput(), PathOptions.defaults());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ModelSelector.select(path, rm, SelectionSpec.of(SelectionRule.BIC, Double.NaN, false, false),
                        null));
        assertTrue(e.getMessage().contains("effective sample size"), e.getMessage());
        SelectedModel s = ModelSelector.select(path, rm,
                SelectionSpec.of(SelectionRule.RELATIVE_PENALTY, 0.5, false, false), null);
        assertNull(s.criteria());
        assertTrue(s.note().contains("criteria not computed"), s.note());
    }

    @Test
    void spec_outOfRangeValue_isRefusedNamingRule() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> SelectionSpec.of(SelectionRule.RELATIVE_PENALTY, 1.5, false, false));
        assertTrue(e.getMessage().contains("relative-penalty") && e.getMessage().contains("1.5"));
        assertThrows(IllegalArgumentException.class, () -> SelectionSpec.of(SelectionRule.MAX_ACTIVE, 2.5, false, false));
    }
}
