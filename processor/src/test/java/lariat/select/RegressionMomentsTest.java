package lariat.select;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.Random;
import lariat.moments.Moments;
import org.junit.jupiter.api.Test;

class RegressionMomentsTest {

    /** Relative tolerance for squared errors from moments against direct sums on raw rows. */
    static final double ERROR_TOL = 1e-9;

    @Test
    void squaredError_anyInterceptAndBeta_equalsDirectSumOnRawRows() {
        for (long seed = 1; seed <= 40; seed++) {
            Random rnd = new Random(seed);
            RawRows rows = new RawRows(seed, 5 + rnd.nextInt(60), 1 + rnd.nextInt(6), seed % 2 == 0);
            RegressionMoments m = RegressionMoments.of(rows.moments(null), rows.features(), rows.p);
            double[] beta = new double[rows.p];
            for (int j = 0; j < beta.length; j++) {
                beta[j] = rnd.nextGaussian() * 2;
            }
            double a = rnd.nextGaussian() * 5;
            double direct = rows.squaredError(null, a, beta);
            assertEquals(direct, m.squaredError(a, beta), ERROR_TOL * direct, "seed " + seed);
        }
    }

    @Test
    void of_featureSubsetInOtherOrder_picksThoseComoments() {
        RawRows rows = new RawRows(7, 30, 4, true);
        Moments all = rows.moments(null);
        RegressionMoments m = RegressionMoments.of(all, new int[] {2, 0}, 4);
        assertEquals(all.comoment(2, 0), m.cxx()[1], 0.0);
        assertEquals(all.comoment(0, 0), m.cxx()[3], 0.0);
        assertArrayEquals(new double[] {all.comoment(2, 4), all.comoment(0, 4)}, m.cxy(), 0.0);
        assertArrayEquals(new double[] {all.mean(2), all.mean(0)}, m.meanX(), 0.0);
        assertEquals(all.comoment(4, 4), m.cyy(), 0.0);
        assertEquals(all.effectiveSize(), m.effectiveSize(), 1e-12 * all.effectiveSize());
    }

    @Test
    void of_targetAmongFeatures_isRefused() {
        Moments m = new Moments(3);
        assertThrows(IllegalArgumentException.class, () -> RegressionMoments.of(m, new int[] {0, 2}, 2));
        assertThrows(IllegalArgumentException.class, () -> RegressionMoments.of(m, new int[] {0, 3}, 2));
    }
}
