package lariat.moments;

/**
 * The forgetting factor 2^(−Δt/h) of an elapsed event time Δt under half-life h, computed the same way on
 * every platform and without allocating.
 *
 * <p>With x = Δt/h = n + k/64 + r (n, k integers, 0 &lt;= k &lt; 64, 0 &lt;= r &lt; 1/64), 2^(−x) =
 * 2^(−n) · 2^(−k/64) · e^(−r ln 2): the first factor is exact ({@link Math#scalb}), the second comes from a
 * table filled once by {@link StrictMath#pow} (whose results the Java platform fixes), the third from its
 * Taylor polynomial to degree 7, whose truncation error (r ln 2)^8/8! &lt; 1e-20 is far below one unit in
 * the last place. Java 17 evaluates all of this in strict IEEE 754 arithmetic, so the value is
 * reproducible bit for bit; it is within a few units in the last place of the exact 2^(−x).
 */
final class Decay {

    private static final int STEPS = 64;
    private static final double LN2 = 0.6931471805599453;
    /** Beyond this many half-lives 2^(−x) is below the smallest subnormal double. */
    private static final double UNDERFLOW_HALF_LIVES = 1100.0;
    private static final double[] TABLE = new double[STEPS];

    static {
        for (int k = 0; k < STEPS; k++) {
            TABLE[k] = StrictMath.pow(2.0, -k / (double) STEPS);
        }
    }

    private Decay() {
    }

    /**
     * 2^(−(later − earlier)/halfLifeMs) for later &gt;= earlier and halfLifeMs &gt; 0: exactly 1 when the times
     * are equal, exactly 0 beyond about 1100 half-lives.
     */
    static double factor(long later, long earlier, double halfLifeMs) {
        long elapsed = later - earlier;
        double dt = elapsed >= 0 ? (double) elapsed : (double) later - (double) earlier;
        return pow2Negative(dt / halfLifeMs);
    }

    /** 2^(−x) for x &gt;= 0. */
    static double pow2Negative(double x) {
        if (!(x < UNDERFLOW_HALF_LIVES)) {
            return 0.0;
        }
        double whole = Math.floor(x);
        double fraction = x - whole;
        int k = (int) (fraction * STEPS);
        double y = (fraction - k / (double) STEPS) * LN2;
        double p = 1.0 - y * (1.0 - y / 2 * (1.0 - y / 3 * (1.0 - y / 4 * (1.0 - y / 5 * (1.0 - y / 6
                * (1.0 - y / 7))))));
        return Math.scalb(TABLE[k] * p, -(int) whole);
    }
}
