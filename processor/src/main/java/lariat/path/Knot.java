package lariat.path;

/**
 * One knot of a path: the fit at a penalty where the active set changes (or the path ends).
 *
 * <p>Conventions: {@link #active()} and {@link #signs()} describe the segment that leaves this knot toward
 * smaller penalties (so a column that {@link #entered()} here is listed with a zero coefficient, and a
 * column that {@link #left()} is not); coefficients have length p, zero for inactive and excluded columns.
 * The penalty λ is on the standardized scale: max_j |x̃_jᵀr − λ₂β_j| over the candidate columns, where
 * x̃_j are the centered columns scaled to unit weighted norm and r is the weighted residual in units of y.
 */
public final class Knot {

    private final int p;
    private final int step;
    private final double penalty;
    private final double relativePenalty;
    private final int[] active;
    private final int[] signs;
    private final double[] standardized;
    private final double[] raw;
    private final double intercept;
    private final double rss;
    private final double r2;
    private final int df;
    private final int entered;
    private final int left;

    private Knot(Builder b) {
        this.p = b.p;
        this.step = b.step;
        this.penalty = b.penalty;
        this.relativePenalty = b.relativePenalty;
        this.active = b.active;
        this.signs = b.signs;
        this.standardized = b.standardized;
        this.raw = b.raw;
        this.intercept = b.intercept;
        this.rss = b.rss;
        this.r2 = b.r2;
        this.df = b.df;
        this.entered = b.entered;
        this.left = b.left;
        if (active.length != signs.length || standardized.length != active.length
                || raw.length != active.length) {
            throw new IllegalArgumentException("active/signs/coefficient lengths differ: " + active.length
                    + "/" + signs.length + "/" + standardized.length + "/" + raw.length);
        }
    }

    static Builder builder() {
        return new Builder();
    }

    /** Step number; knot 0 is β = 0 at λ_max. */
    public int step() {
        return step;
    }

    /** λ on the standardized scale (see the class comment). */
    public double penalty() {
        return penalty;
    }

    /** λ / λ_max (1 at knot 0, also when λ_max = 0). */
    public double relativePenalty() {
        return relativePenalty;
    }

    /** Active columns in order of entry. */
    public int[] active() {
        return active.clone();
    }

    /** Signs (+1 or −1) of the active columns, aligned with {@link #active()}. */
    public int[] signs() {
        return signs.clone();
    }

    /** Coefficients on the standardized scale (x̃ = (x − μ)/d, d_j = sqrt(C_jj)), length p. */
    public double[] standardized() {
        return expand(standardized);
    }

    /** Coefficients in the units of the raw columns, β_raw = β/d, length p. */
    public double[] raw() {
        return expand(raw);
    }

    /** Only active columns can have nonzero coefficients, so a knot keeps those alone (O(|A|), not O(p)). */
    private double[] expand(double[] byActive) {
        double[] out = new double[p];
        for (int k = 0; k < active.length; k++) {
            double v = byActive[k];
            if (v != 0) {
                out[active[k]] = v;
            }
        }
        return out;
    }

    /** Intercept μ_y − μ_xᵀβ_raw. */
    public double intercept() {
        return intercept;
    }

    /** Weighted residual sum of squares C_yy − 2βᵀc + βᵀGβ, with rounding negatives clamped to 0. */
    public double rss() {
        return rss;
    }

    /** 1 − RSS/C_yy; defined as 0 when C_yy = 0. */
    public double r2() {
        return r2;
    }

    /** Degrees of freedom: the number of nonzero coefficients (Zou, Hastie and Tibshirani, Ann. Statist. 2007). */
    public int df() {
        return df;
    }

    /** The column that joined the active set at this knot, or −1. */
    public int entered() {
        return entered;
    }

    /** The column that left the active set at this knot (lasso only), or −1. */
    public int left() {
        return left;
    }

    @Override
    public String toString() {
        return "Knot{step=" + step + ", penalty=" + penalty + ", active=" + java.util.Arrays.toString(active)
                + ", entered=" + entered + ", left=" + left + ", r2=" + r2 + "}";
    }

    /**
     * Package-private mutable holder used by the engine. The knot keeps the arrays it is given (no copy):
     * the caller hands over fresh arrays and does not touch them afterwards.
     */
    static final class Builder {
        private int p;
        private int step;
        private double penalty;
        private double relativePenalty;
        private int[] active = new int[0];
        private int[] signs = new int[0];
        private double[] standardized = new double[0];
        private double[] raw = new double[0];
        private double intercept;
        private double rss;
        private double r2;
        private int df;
        private int entered = -1;
        private int left = -1;

        Builder step(int v) {
            step = v;
            return this;
        }

        Builder penalty(double v, double relative) {
            penalty = v;
            relativePenalty = relative;
            return this;
        }

        Builder active(int[] columns, int[] s) {
            active = columns;
            signs = s;
            return this;
        }

        /**
         * @param columns         p
         * @param std             standardized coefficients of the active columns, aligned with them
         * @param rawCoefficients raw coefficients of the active columns, aligned with them
         */
        Builder coefficients(int columns, double[] std, double[] rawCoefficients, double icpt) {
            p = columns;
            standardized = std;
            raw = rawCoefficients;
            intercept = icpt;
            return this;
        }

        Builder fit(double residualSumOfSquares, double rSquared, int degreesOfFreedom) {
            rss = residualSumOfSquares;
            r2 = rSquared;
            df = degreesOfFreedom;
            return this;
        }

        Builder events(int enteredColumn, int leftColumn) {
            entered = enteredColumn;
            left = leftColumn;
            return this;
        }

        Knot build() {
            return new Knot(this);
        }
    }
}
