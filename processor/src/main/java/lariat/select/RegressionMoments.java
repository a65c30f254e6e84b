package lariat.select;

import java.util.Arrays;
import lariat.moments.Moments;
import lariat.path.GramInput;

/**
 * The centered weighted moments of a regression of one target on a subset of features: C_xx (p × p),
 * C_xy, C_yy, the means, the total weight W, Σ w² and the record count, taken from a {@link Moments}
 * accumulator's centered co-moments (never from raw sums). Immutable; arrays are copied in and out.
 *
 * <p>The weighted squared error of any affine predictor is exact from these moments. Writing
 * y − a − xᵀβ = (y − μ_y) − (x − μ_x)ᵀβ + (μ_y − a − μ_xᵀβ) and summing with weights, the cross terms
 * vanish because Σ w (z − μ) = 0:
 * <pre>
 *   Σ w (y − a − xᵀβ)² = C_yy − 2 βᵀ C_xy + βᵀ C_xx β + W (μ_y − a − μ_xᵀβ)².
 * </pre>
 */
public final class RegressionMoments {

    private final int p;
    private final double[] cxx;
    private final double[] cxy;
    private final double cyy;
    private final double[] meanX;
    private final double meanY;
    private final double totalWeight;
    private final double sumSquaredWeights;
    private final long count;

    private RegressionMoments(double[] cxx, double[] cxy, double cyy, double[] meanX, double meanY,
                              double totalWeight, double sumSquaredWeights, long count) {
        this.p = cxy.length;
        this.cxx = cxx;
        this.cxy = cxy;
        this.cyy = cyy;
        this.meanX = meanX;
        this.meanY = meanY;
        this.totalWeight = totalWeight;
        this.sumSquaredWeights = sumSquaredWeights;
        this.count = count;
    }

    /**
     * The moments of target column {@code targetCol} on feature columns {@code featureCols} (in that
     * order) of {@code m}.
     *
     * @throws IllegalArgumentException if a column index is out of range, repeated, or equals the target
     */
    public static RegressionMoments of(Moments m, int[] featureCols, int targetCol) {
        if (m == null) {
            throw new IllegalArgumentException("m is null");
        }
        int d = m.width();
        checkColumn(targetCol, d, "targetCol");
        boolean[] seen = new boolean[d];
        seen[targetCol] = true;
        for (int c : featureCols) {
            checkColumn(c, d, "featureCols");
            if (seen[c]) {
                throw new IllegalArgumentException("featureCols repeats column " + c + " or names the target");
            }
            seen[c] = true;
        }
        int p = featureCols.length;
        double[] c = m.comomentMatrix();
        double[] mu = m.means();
        double[] cxx = new double[p * p];
        double[] cxy = new double[p];
        double[] meanX = new double[p];
        for (int i = 0; i < p; i++) {
            int ri = featureCols[i] * d;
            for (int j = 0; j < p; j++) {
                cxx[i * p + j] = c[ri + featureCols[j]];
            }
            cxy[i] = c[ri + targetCol];
            meanX[i] = mu[featureCols[i]];
        }
        return new RegressionMoments(cxx, cxy, c[targetCol * d + targetCol], meanX, mu[targetCol],
                m.totalWeight(), m.sumSquaredWeights(), m.count());
    }

    /** Moments given directly (for tests and adapters); see the class comment for the meaning. */
    public static RegressionMoments of(double[] cxx, double[] cxy, double cyy, double[] meanX, double meanY,
                                       double totalWeight, double sumSquaredWeights, long count) {
        int p = cxy.length;
        if (cxx.length != p * p || meanX.length != p) {
            throw new IllegalArgumentException("cxx must be p x p and meanX of length p, p = " + p + "; got "
                    + cxx.length + " and " + meanX.length);
        }
        if (!(totalWeight >= 0) || !(sumSquaredWeights >= 0) || count < 0) {
            throw new IllegalArgumentException("totalWeight, sumSquaredWeights, count must be >= 0: " + totalWeight
                    + ", " + sumSquaredWeights + ", " + count);
        }
        return new RegressionMoments(cxx.clone(), cxy.clone(), cyy, meanX.clone(), meanY, totalWeight,
                sumSquaredWeights, count);
    }

    /** The input of the path engine: the same moments. */
    public GramInput gramInput() {
        return GramInput.of(cxx, cxy, cyy, meanX, meanY, totalWeight, sumSquaredWeights, count);
    }

    /**
     * Σ w (y − a − xᵀβ)² by the identity in the class comment.
     *
     * @param intercept a
     * @param beta      raw coefficients, length p; read only
     */
    public double squaredError(double intercept, double[] beta) {
        checkLength(beta);
        double quad = 0;
        double lin = 0;
        double offset = meanY - intercept;
        for (int i = 0; i < p; i++) {
            double bi = beta[i];
            if (bi == 0) {
                continue;
            }
            lin += bi * cxy[i];
            offset -= meanX[i] * bi;
            double row = 0;
            for (int j = 0; j < p; j++) {
                row += cxx[i * p + j] * beta[j];
            }
            quad += bi * row;
        }
        return Math.max(0.0, cyy - 2 * lin + quad) + totalWeight * offset * offset;
    }

    /** The intercept that minimizes the squared error for given β: μ_y − μ_xᵀβ. */
    public double interceptFor(double[] beta) {
        checkLength(beta);
        double a = meanY;
        for (int i = 0; i < p; i++) {
            a -= meanX[i] * beta[i];
        }
        return a;
    }

    /** 1 − RSS / C_yy for the best intercept, or 0 when C_yy = 0. */
    public double r2(double[] beta) {
        return cyy > 0 ? 1 - squaredError(interceptFor(beta), beta) / cyy : 0.0;
    }

    public int p() {
        return p;
    }

    public double[] cxx() {
        return cxx.clone();
    }

    public double[] cxy() {
        return cxy.clone();
    }

    public double cyy() {
        return cyy;
    }

    public double[] meanX() {
        return meanX.clone();
    }

    public double meanY() {
        return meanY;
    }

    public double totalWeight() {
        return totalWeight;
    }

    public double sumSquaredWeights() {
        return sumSquaredWeights;
    }

    public long count() {
        return count;
    }

    /** Kish's effective sample size W² / Σ w² (0 when W = 0). */
    public double effectiveSize() {
        return totalWeight == 0 ? 0 : totalWeight / sumSquaredWeights * totalWeight;
    }

    @Override
    public String toString() {
        return "RegressionMoments[p=" + p + ", W=" + totalWeight + ", count=" + count + ", meanX="
                + Arrays.toString(meanX) + ", meanY=" + meanY + "]";
    }

    private void checkLength(double[] beta) {
        if (beta == null || beta.length != p) {
            throw new IllegalArgumentException("beta must have length " + p + ", was "
                    + (beta == null ? "null" : beta.length));
        }
    }

    private static void checkColumn(int c, int d, String name) {
        if (c < 0 || c >= d) {
            throw new IllegalArgumentException(name + " holds " + c + ", outside [0, " + d + ")");
        }
    }
}
