package lariat.bench;

import lariat.path.GramInput;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;

/**
 * Times the lasso path refit alone: {@link PathEngine#fit} on a prebuilt {@link GramInput} (the Gram build
 * is not timed) of a {@link SyntheticRows} problem. Untimed warm-up fits of the same problem run first
 * so the JIT has compiled the engine, until {@code warmupSeconds} have passed (the last may overrun; none
 * for 0, which suits fits of several seconds, whose loops are compiled during their first steps).
 */
public final class PathBench {

    private PathBench() {
    }

    /**
     * @param steps the path's maximum step count; 0 for the whole path
     * @throws IllegalArgumentException if features &lt; 1, rows &lt; 2, steps &lt; 0, repeat &lt; 1 or warmupSeconds &lt; 0
     */
    public static PathResult run(int features, int rows, int steps, int repeat, long seed, double warmupSeconds) {
        return run(features, rows, steps, repeat, seed, warmupSeconds, false);
    }

    /**
     * As {@link #run(int, int, int, int, long, double)}, timing the {@link ContiguousLassoKernel} prototype
     * instead of the engine when {@code prototype} is set.
     */
    public static PathResult run(int features, int rows, int steps, int repeat, long seed, double warmupSeconds,
                                 boolean prototype) {
        if (steps < 0) {
            throw new IllegalArgumentException("steps must be >= 0 (0 = whole path), was " + steps);
        }
        if (repeat < 1) {
            throw new IllegalArgumentException("repeat must be >= 1, was " + repeat);
        }
        if (!(warmupSeconds >= 0) || Double.isInfinite(warmupSeconds)) {
            throw new IllegalArgumentException("warmup-s must be finite and >= 0, was " + warmupSeconds);
        }
        GramInput input = GramFromRows.of(SyntheticRows.of(features, rows, seed));
        if (prototype) {
            return runPrototype(input, steps, repeat, warmupSeconds);
        }
        PathOptions.Builder b = PathOptions.builder();
        if (steps > 0) {
            b.maxSteps(steps);
        }
        PathOptions options = b.build();
        PathEngine engine = new PathEngine(features);
        long warmStart = System.nanoTime();
        while ((System.nanoTime() - warmStart) * 1e-9 < warmupSeconds) {
            engine.fit(input, options);
        }
        double[] seconds = new double[repeat];
        double[] cpu = new double[repeat];
        LassoPath path = null;
        for (int r = 0; r < repeat; r++) {
            long c0 = CpuClock.nanos();
            long t0 = System.nanoTime();
            path = engine.fit(input, options);
            seconds[r] = (System.nanoTime() - t0) * 1e-9;
            cpu[r] = (CpuClock.nanos() - c0) * 1e-9;
        }
        int actual = path.knots().size() - 1;
        int active = path.last().active().length;
        return PathResult.of(features, rows, actual, active, path.stopReason().name(), Timings.of(seconds),
                Timings.of(cpu));
    }

    private static PathResult runPrototype(GramInput input, int steps, int repeat, double warmupSeconds) {
        ContiguousLassoKernel kernel = new ContiguousLassoKernel(input.p());
        long warmStart = System.nanoTime();
        while ((System.nanoTime() - warmStart) * 1e-9 < warmupSeconds) {
            kernel.fit(input, steps);
        }
        double[] seconds = new double[repeat];
        double[] cpu = new double[repeat];
        int actual = 0;
        for (int r = 0; r < repeat; r++) {
            long c0 = CpuClock.nanos();
            long t0 = System.nanoTime();
            actual = kernel.fit(input, steps);
            seconds[r] = (System.nanoTime() - t0) * 1e-9;
            cpu[r] = (CpuClock.nanos() - c0) * 1e-9;
        }
        int active = 0;
        for (double b : kernel.standardizedCoefficients()) {
            active += b != 0 ? 1 : 0;
        }
        String reason = kernel.stoppedOnPivot() ? "PIVOT" : steps > 0 && actual >= steps ? "MAX_STEPS" : "COMPLETE";
        return PathResult.of(input.p(), (int) input.count(), actual, active, "PROTOTYPE_" + reason,
                Timings.of(seconds), Timings.of(cpu));
    }
}
