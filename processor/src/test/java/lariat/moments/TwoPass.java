package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Test oracle: the textbook two-pass weighted computation on raw rows (first μ = Σ w z / W, then
 * C = Σ w (z − μ)(z − μ)ᵀ), written independently of the production update formulas. Also holds the one
 * tolerance per quantity that the moments tests share.
 */
final class TwoPass {

    /** Relative tolerance on W and Σ w² (sums in a different order). */
    static final double WEIGHT_TOLERANCE = 1e-13;
    /** Tolerance on a mean, relative to |μ_i| + the column's standard deviation. */
    static final double MEAN_TOLERANCE = 1e-12;
    /**
     * Tolerance on C_ij, relative to sqrt(C_ii C_jj), plus an absolute floor: the reference's own mean can be
     * off by a few units in the last place (e_i), which moves its co-moment by W·e_i·e_j, visible only when
     * the spread is that small (a single row, whose exact co-moment is 0).
     */
    static final double COMOMENT_TOLERANCE = 1e-11;
    /** Units in the last place by which the reference's rounded mean may miss the exact mean. */
    static final double REFERENCE_ULPS = 4.0;

    final double totalWeight;
    final double sumSquaredWeights;
    final double[] mean;
    final double[] comoment;
    final int width;

    private TwoPass(double totalWeight, double sumSquaredWeights, double[] mean, double[] comoment) {
        this.totalWeight = totalWeight;
        this.sumSquaredWeights = sumSquaredWeights;
        this.mean = mean;
        this.comoment = comoment;
        this.width = mean.length;
    }

    /** Rows {@code rows[0..n-1]} with weights; rows of weight 0 contribute nothing. */
    static TwoPass of(double[][] rows, double[] weights, int n) {
        int d = rows[0].length;
        double w = 0.0;
        double s2 = 0.0;
        double[] mu = new double[d];
        for (int r = 0; r < n; r++) {
            w += weights[r];
            s2 += weights[r] * weights[r];
            for (int c = 0; c < d; c++) {
                mu[c] += weights[r] * rows[r][c];
            }
        }
        for (int c = 0; c < d; c++) {
            mu[c] /= w;
        }
        double[] cm = new double[d * d];
        for (int r = 0; r < n; r++) {
            for (int i = 0; i < d; i++) {
                for (int j = 0; j < d; j++) {
                    cm[i * d + j] += weights[r] * (rows[r][i] - mu[i]) * (rows[r][j] - mu[j]);
                }
            }
        }
        return new TwoPass(w, s2, mu, cm);
    }

    double correlation(int i, int j) {
        return comoment[i * width + j] / Math.sqrt(comoment[i * width + i] * comoment[j * width + j]);
    }

    /** Asserts that {@code m} agrees with this reference within the shared tolerances. */
    void assertMatches(Moments m) {
        assertEquals(width, m.width(), "width");
        assertEquals(totalWeight, m.totalWeight(), WEIGHT_TOLERANCE * totalWeight, "totalWeight");
        assertEquals(sumSquaredWeights, m.sumSquaredWeights(), WEIGHT_TOLERANCE * sumSquaredWeights,
                "sumSquaredWeights");
        for (int i = 0; i < width; i++) {
            double sd = Math.sqrt(comoment[i * width + i] / totalWeight);
            assertEquals(mean[i], m.mean(i), MEAN_TOLERANCE * (Math.abs(mean[i]) + sd), "mean " + i);
        }
        for (int i = 0; i < width; i++) {
            for (int j = 0; j < width; j++) {
                double scale = Math.sqrt(comoment[i * width + i] * comoment[j * width + j]);
                double floor = REFERENCE_ULPS * REFERENCE_ULPS * totalWeight * Math.ulp(mean[i]) * Math.ulp(mean[j]);
                assertEquals(comoment[i * width + j], m.comoment(i, j), COMOMENT_TOLERANCE * scale + floor,
                        "comoment " + i + "," + j);
            }
        }
        assertSymmetric(m);
    }

    /** C must be exactly symmetric, bit for bit. */
    static void assertSymmetric(Moments m) {
        for (int i = 0; i < m.width(); i++) {
            for (int j = 0; j < i; j++) {
                assertTrue(Double.doubleToRawLongBits(m.comoment(i, j)) == Double.doubleToRawLongBits(m.comoment(j, i)),
                        "C not exactly symmetric at " + i + "," + j);
            }
        }
    }
}
