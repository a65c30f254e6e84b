package lariat.scenario;

/**
 * A fixed, self-contained pseudorandom stream, so that a seed gives the same numbers on every JVM
 * and every Java version.
 *
 * <p>Uniform 64-bit values: SplitMix64, a Weyl sequence with increment 0x9e3779b97f4a7c15 passed
 * through a 64-bit mixing function (Steele, Lea &amp; Flood 2014, "Fast splittable pseudorandom
 * number generators", OOPSLA 2014). Doubles take the top 53 bits. Normal deviates: the polar
 * method of Marsaglia &amp; Bray (1964, SIAM Review 6(3), 260–264), with {@link StrictMath} so the
 * logarithm gives the same bits everywhere.
 *
 * <p>Mutable and not thread-safe.
 */
final class SplitMix64 {

    private static final long GAMMA = 0x9e3779b97f4a7c15L;

    private long state;
    private double spare;
    private boolean hasSpare;

    SplitMix64(long seed) {
        this.state = seed;
    }

    long nextLong() {
        state += GAMMA;
        long z = state;
        z = (z ^ (z >>> 30)) * 0xbf58476d1ce4e5b9L;
        z = (z ^ (z >>> 27)) * 0x94d049bb133111ebL;
        return z ^ (z >>> 31);
    }

    /** Uniform on [0, 1). */
    double nextDouble() {
        return (nextLong() >>> 11) * 0x1.0p-53;
    }

    /** Uniform on [lo, hi). */
    double uniform(double lo, double hi) {
        return lo + (hi - lo) * nextDouble();
    }

    /** Uniform integer on [0, bound), bound &gt; 0 (by rejection, without bias). */
    int nextInt(int bound) {
        long limit = Long.MAX_VALUE - Long.MAX_VALUE % bound;
        long r;
        do {
            r = nextLong() >>> 1;
        } while (r >= limit);
        return (int) (r % bound);
    }

    /** Standard normal deviate. */
    double nextGaussian() {
        if (hasSpare) {
            hasSpare = false;
            return spare;
        }
        double u;
        double v;
        double s;
        do {
            u = 2 * nextDouble() - 1;
            v = 2 * nextDouble() - 1;
            s = u * u + v * v;
        } while (s >= 1 || s == 0);
        double m = StrictMath.sqrt(-2 * StrictMath.log(s) / s);
        spare = v * m;
        hasSpare = true;
        return u * m;
    }
}
