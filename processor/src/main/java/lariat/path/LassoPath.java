package lariat.path;

import java.util.List;

/**
 * A computed path: its knots from λ_max down, the columns set aside, and why it stopped. Immutable.
 *
 * <p>Between two knots every coefficient and the intercept are linear in λ (Efron et al., Annals of
 * Statistics 32(2), 2004, section 3; the lasso modification keeps the path piecewise linear), so the fit
 * at any penalty between λ_max and the last knot is an exact linear interpolation of its two neighbours.
 */
public final class LassoPath {

    private final int p;
    private final List<Knot> knots;
    private final List<ExcludedColumn> excluded;
    private final double lambdaMax;
    private final StopReason stopReason;
    private final boolean reachedEnd;
    private final double[] penalties;

    private LassoPath(int p, List<Knot> knots, List<ExcludedColumn> excluded, StopReason stopReason) {
        if (knots.isEmpty()) {
            throw new IllegalArgumentException("knots must not be empty");
        }
        this.p = p;
        this.knots = List.copyOf(knots);
        this.excluded = List.copyOf(excluded);
        this.lambdaMax = knots.get(0).penalty();
        this.stopReason = stopReason;
        this.reachedEnd = stopReason == StopReason.COMPLETE || stopReason == StopReason.RANK;
        this.penalties = new double[knots.size()];
        for (int k = 0; k < penalties.length; k++) {
            penalties[k] = knots.get(k).penalty();
        }
    }

    static LassoPath of(int p, List<Knot> knots, List<ExcludedColumn> excluded, StopReason stopReason) {
        return new LassoPath(p, knots, excluded, stopReason);
    }

    public int p() {
        return p;
    }

    /** Knots in path order; knot 0 is β = 0 at λ_max. */
    public List<Knot> knots() {
        return knots;
    }

    /** Columns set aside as constant or collinear, in the order they were found. */
    public List<ExcludedColumn> excluded() {
        return excluded;
    }

    /** The penalty at knot 0, the smallest λ at which all coefficients are zero. */
    public double lambdaMax() {
        return lambdaMax;
    }

    public StopReason stopReason() {
        return stopReason;
    }

    /** The last knot. */
    public Knot last() {
        return knots.get(knots.size() - 1);
    }

    /**
     * Standardized coefficients at {@code lambda}: zero for λ ≥ λ_max, otherwise the interpolation between
     * the two knots around λ.
     *
     * @throws IllegalArgumentException if λ is negative or NaN, or lies below the last knot of a path that
     *                                  stopped early (that part of the path was not computed)
     */
    public double[] standardizedCoefficientsAt(double lambda) {
        return interpolate(lambda, Coordinate.STANDARDIZED);
    }

    /** Raw-unit coefficients at {@code lambda}; see {@link #standardizedCoefficientsAt(double)}. */
    public double[] rawCoefficientsAt(double lambda) {
        return interpolate(lambda, Coordinate.RAW);
    }

    /** Intercept at {@code lambda}; see {@link #standardizedCoefficientsAt(double)}. */
    public double interceptAt(double lambda) {
        int k = segment(lambda);
        double t = weight(k, lambda);
        Knot a = knots.get(k);
        Knot b = knots.get(Math.min(k + 1, knots.size() - 1));
        return (1 - t) * a.intercept() + t * b.intercept();
    }

    private enum Coordinate { STANDARDIZED, RAW }

    private double[] interpolate(double lambda, Coordinate coordinate) {
        int k = segment(lambda);
        double t = weight(k, lambda);
        Knot a = knots.get(k);
        Knot b = knots.get(Math.min(k + 1, knots.size() - 1));
        double[] x = coordinate == Coordinate.RAW ? a.raw() : a.standardized();
        double[] y = coordinate == Coordinate.RAW ? b.raw() : b.standardized();
        for (int j = 0; j < p; j++) {
            x[j] = (1 - t) * x[j] + t * y[j];
        }
        return x;
    }

    /** Index k of the knot that starts the segment holding λ (the last knot when λ is at or below it). */
    private int segment(double lambda) {
        if (!(lambda >= 0)) {
            throw new IllegalArgumentException("lambda must be >= 0, was " + lambda);
        }
        int last = penalties.length - 1;
        if (lambda < penalties[last]) {
            if (!reachedEnd) {
                throw new IllegalArgumentException("lambda=" + lambda + " is below the last computed knot ("
                        + penalties[last] + "); the path stopped early: " + stopReason);
            }
            return last;
        }
        for (int k = 0; k < last; k++) {
            if (lambda >= penalties[k + 1]) {
                return k;
            }
        }
        return last;
    }

    private double weight(int k, double lambda) {
        if (k == penalties.length - 1 || lambda >= penalties[k]) {
            return 0;
        }
        double width = penalties[k] - penalties[k + 1];
        return width > 0 ? (penalties[k] - lambda) / width : 1;
    }
}
