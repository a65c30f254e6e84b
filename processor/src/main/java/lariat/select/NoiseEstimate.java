package lariat.select;

import java.util.HashSet;
import java.util.Set;
import lariat.path.ExcludedColumn;
import lariat.path.LassoPath;

/**
 * The noise variance σ² from the full least-squares fit on every usable feature (those the path did
 * not set aside), with the effective sample size n = W²/Σw² (Kish 1965) standing for the row count:
 * <pre>
 *   σ̂² = (RSS_LS / W) · n / (n − q − 1),   q = number of usable features,
 * </pre>
 * which is the usual unbiased estimate RSS/(n − q − 1) when every weight is 1. It exists only when
 * n &gt; q + 1 and the least-squares solve succeeds; otherwise {@link #available()} is false and
 * {@link #reason()} says why. Immutable.
 */
public final class NoiseEstimate {

    private final double sigma2;
    private final double effectiveSize;
    private final int usableFeatures;
    private final String reason;

    private NoiseEstimate(double sigma2, double effectiveSize, int usableFeatures, String reason) {
        this.sigma2 = sigma2;
        this.effectiveSize = effectiveSize;
        this.usableFeatures = usableFeatures;
        this.reason = reason;
    }

    /** The estimate for the features of {@code path} fitted on {@code m}. */
    public static NoiseEstimate of(LassoPath path, RegressionMoments m) {
        Set<Integer> excluded = new HashSet<>();
        for (ExcludedColumn e : path.excluded()) {
            excluded.add(e.column());
        }
        int[] usable = new int[m.p() - excluded.size()];
        int q = 0;
        for (int j = 0; j < m.p(); j++) {
            if (!excluded.contains(j)) {
                usable[q++] = j;
            }
        }
        double n = m.effectiveSize();
        if (!(n > q + 1)) {
            return new NoiseEstimate(Double.NaN, n, q, String.format(java.util.Locale.ROOT,
                    "no full least-squares fit: effective sample size %.4g is not above q + 1 = %d usable "
                            + "features + 1", n, q + 1));
        }
        LeastSquaresFit ls = LeastSquaresFit.of(m, usable);
        if (!ls.solved()) {
            return new NoiseEstimate(Double.NaN, n, q, "no full least-squares fit: " + ls.reason());
        }
        double sigma2 = ls.rss() / m.totalWeight() * n / (n - q - 1);
        return new NoiseEstimate(sigma2, n, q, null);
    }

    public boolean available() {
        return reason == null;
    }

    /** Why σ² is unavailable, or {@code null}. */
    public String reason() {
        return reason;
    }

    /** σ̂², or NaN when unavailable. */
    public double sigma2() {
        return sigma2;
    }

    /** n = W²/Σw². */
    public double effectiveSize() {
        return effectiveSize;
    }

    /** q, the number of features the path did not set aside. */
    public int usableFeatures() {
        return usableFeatures;
    }
}
