package lariat.select;

/**
 * K-fold cross-validation error along a grid of relative penalties r_g = λ/λmax (descending). For fold k
 * with held-out weight W_k and held-out squared error e_kg, the fold's mean squared error is
 * m_kg = e_kg / W_k; the curve is the pooled mean M_g = Σ_k e_kg / Σ_k W_k with standard error
 * SE_g = sqrt( Σ_k W_k (m_kg − M_g)² / ((K − 1) Σ_k W_k) ), which is sd(m_kg)/√K when the folds
 * weigh the same. The minimum is the first grid point with the smallest M_g; the one-standard-error
 * choice is the first (most penalized, sparsest) grid point with M_g ≤ M_min + SE_min, a rule of common
 * practice in cross-validated model selection. Immutable; arrays are copied in and out.
 */
public final class CvCurve {

    private final double[] relativePenalties;
    private final double[][] foldErrors;
    private final double[] foldWeights;
    private final double[] mean;
    private final double[] standardError;
    private final int minIndex;
    private final int oneSeIndex;

    private CvCurve(double[] relativePenalties, double[][] foldErrors, double[] foldWeights, double[] mean,
                    double[] standardError, int minIndex, int oneSeIndex) {
        this.relativePenalties = relativePenalties;
        this.foldErrors = foldErrors;
        this.foldWeights = foldWeights;
        this.mean = mean;
        this.standardError = standardError;
        this.minIndex = minIndex;
        this.oneSeIndex = oneSeIndex;
    }

    /**
     * @param relativePenalties the grid, length G, non-increasing
     * @param foldErrors        {@code foldErrors[k][g]}: held-out weighted squared error of fold k at r_g
     * @param foldWeights       held-out total weight W_k of each fold, positive
     */
    public static CvCurve of(double[] relativePenalties, double[][] foldErrors, double[] foldWeights) {
        int g = relativePenalties.length;
        int k = foldErrors.length;
        if (g == 0 || k < 2 || foldWeights.length != k) {
            throw new IllegalArgumentException("need a non-empty grid, >= 2 folds and one weight per fold; got "
                    + g + " grid points, " + k + " folds, " + foldWeights.length + " weights");
        }
        double total = 0;
        for (int f = 0; f < k; f++) {
            if (!(foldWeights[f] > 0) || foldErrors[f].length != g) {
                throw new IllegalArgumentException("fold " + f + ": weight " + foldWeights[f] + " must be > 0 and "
                        + "errors must have " + g + " values");
            }
            total += foldWeights[f];
        }
        double[][] errors = new double[k][];
        for (int f = 0; f < k; f++) {
            errors[f] = foldErrors[f].clone();
        }
        double[] mean = new double[g];
        double[] se = new double[g];
        for (int i = 0; i < g; i++) {
            double sum = 0;
            for (int f = 0; f < k; f++) {
                sum += errors[f][i];
            }
            mean[i] = sum / total;
            double ss = 0;
            for (int f = 0; f < k; f++) {
                double dev = errors[f][i] / foldWeights[f] - mean[i];
                ss += foldWeights[f] * dev * dev;
            }
            se[i] = Math.sqrt(ss / ((k - 1) * total));
        }
        int min = 0;
        for (int i = 1; i < g; i++) {
            if (mean[i] < mean[min]) {
                min = i;
            }
        }
        int oneSe = min;
        for (int i = 0; i < min; i++) {
            if (mean[i] <= mean[min] + se[min]) {
                oneSe = i;
                break;
            }
        }
        return new CvCurve(relativePenalties.clone(), errors, foldWeights.clone(), mean, se, min, oneSe);
    }

    public int folds() {
        return foldErrors.length;
    }

    public double[] relativePenalties() {
        return relativePenalties.clone();
    }

    /** Pooled held-out mean squared error per unit weight at each grid point. */
    public double[] mean() {
        return mean.clone();
    }

    public double[] standardError() {
        return standardError.clone();
    }

    /** Held-out weighted squared error of fold k at each grid point. */
    public double[] foldErrors(int fold) {
        return foldErrors[fold].clone();
    }

    public double[] foldWeights() {
        return foldWeights.clone();
    }

    public int minIndex() {
        return minIndex;
    }

    public int oneSeIndex() {
        return oneSeIndex;
    }
}
