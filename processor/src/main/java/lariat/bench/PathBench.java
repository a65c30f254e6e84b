package lariat.bench;

import lariat.path.GramInput;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;

/**
 * Times the lasso path refit alone: {@link PathEngine#fit} on a prebuilt {@link GramInput} (the Gram build
 * is not timed) of a {@link SyntheticRows} problem. Warm-up fits of the same problem run first so the JIT
 * has compiled the engine: at least one, then more until {@code warmups} fits or {@link #WARMUP_BUDGET_S}
 * seconds have passed, whichever is first.
 */
public final class PathBench {

    /** Wall-clock cap on warm-up, in seconds, after the first warm-up fit. */
    public static final double WARMUP_BUDGET_S = 2.0;

    private PathBench() {
    }

    /**
     * @param steps the path's maximum step count; 0 for the whole path
     * @throws IllegalArgumentException if features &lt; 1, rows &lt; 2, steps &lt; 0, repeat &lt; 1 or warmups &lt; 0
     */
    public static PathResult run(int features, int rows, int steps, int repeat, long seed, int warmups) {
        if (steps < 0) {
            throw new IllegalArgumentException("steps must be >= 0 (0 = whole path), was " + steps);
        }
        if (repeat < 1) {
            throw new IllegalArgumentException("repeat must be >= 1, was " + repeat);
        }
        if (warmups < 0) {
            throw new IllegalArgumentException("warmup must be >= 0, was " + warmups);
        }
        GramInput input = GramFromRows.of(SyntheticRows.of(features, rows, seed));
        PathOptions.Builder b = PathOptions.builder();
        if (steps > 0) {
            b.maxSteps(steps);
        }
        PathOptions options = b.build();
        PathEngine engine = new PathEngine(features);
        long warmStart = System.nanoTime();
        for (int i = 0; i < warmups; i++) {
            engine.fit(input, options);
            if (i > 0 && (System.nanoTime() - warmStart) * 1e-9 > WARMUP_BUDGET_S) {
                break;
            }
        }
        double[] seconds = new double[repeat];
        LassoPath path = null;
        for (int r = 0; r < repeat; r++) {
            long t0 = System.nanoTime();
            path = engine.fit(input, options);
            seconds[r] = (System.nanoTime() - t0) * 1e-9;
        }
        int actual = path.knots().size() - 1;
        int active = path.last().active().length;
        return PathResult.of(features, rows, actual, active, path.stopReason().name(), Timings.of(seconds));
    }
}
