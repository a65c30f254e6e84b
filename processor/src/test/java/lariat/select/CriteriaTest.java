package lariat.select;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class CriteriaTest {

    static final double TOL = 1e-12;

    @Test
    void of_smallCase_matchesHandComputation() {
        // n = W = 10 (unit weights), RSS = 5, df = 2, sigma2 = 0.4, so m = RSS/W = 0.5:
        //   Cp  = 0.5 + 2*2*0.4/10          = 0.66
        //   AIC = 0.5/0.4 + 2*2/10          = 1.25 + 0.4 = 1.65
        //   BIC = 0.5/0.4 + ln(10)*2/10     = 1.25 + 0.460517018598809 = 1.710517018598809
        Criteria c = Criteria.of(5, 10, 2, 10, 0.4);
        assertEquals(0.66, c.cp(), TOL);
        assertEquals(1.65, c.aic(), TOL);
        assertEquals(1.710517018598809, c.bic(), TOL);
    }

    @Test
    void of_weights_useResidualMeanSquarePerUnitWeight() {
        // W = 20 with n_eff = 10: m = 10/20 = 0.5, so the values equal the unit-weight case above.
        Criteria c = Criteria.of(10, 20, 2, 10, 0.4);
        assertEquals(0.66, c.cp(), TOL);
        assertEquals(1.65, c.aic(), TOL);
    }

    @Test
    void of_zeroSigma_isRefused() {
        assertThrows(IllegalArgumentException.class, () -> Criteria.of(1, 1, 0, 5, 0));
    }
}
