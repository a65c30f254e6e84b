package lariat.bench;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The outcome of one path benchmark: the shape, the steps the path actually took (knots − 1), the final
 * active count, why the path stopped and the refit timings. Immutable.
 */
public final class PathResult implements BenchReport {

    private final int features;
    private final int rows;
    private final int steps;
    private final int finalActive;
    private final String stopReason;
    private final Timings timings;
    private final Timings cpu;

    private PathResult(int features, int rows, int steps, int finalActive, String stopReason, Timings timings,
                       Timings cpu) {
        this.features = features;
        this.rows = rows;
        this.steps = steps;
        this.finalActive = finalActive;
        this.stopReason = stopReason;
        this.timings = timings;
        this.cpu = cpu;
    }

    /** @param cpu the same runs' CPU time of the benchmark thread (steadier than wall time on a loaded machine) */
    static PathResult of(int features, int rows, int steps, int finalActive, String stopReason, Timings timings,
                         Timings cpu) {
        return new PathResult(features, rows, steps, finalActive, stopReason, timings, cpu);
    }

    /**
     * The JSON object: features, rows, steps, median_s, min_s, max_s (the contract), then repeat,
     * final_active and stop_reason.
     */
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("features", features);
        m.put("rows", rows);
        m.put("steps", steps);
        m.put("median_s", timings.median());
        m.put("min_s", timings.min());
        m.put("max_s", timings.max());
        m.put("repeat", timings.runs());
        m.put("cpu_median_s", cpu.median());
        m.put("final_active", finalActive);
        m.put("stop_reason", stopReason);
        return m;
    }

    /** A two-line readable table. */
    public String table() {
        String head = String.format("%8s %7s %6s %7s %7s %12s %12s %12s %12s%n", "features", "rows", "steps",
                "active", "repeat", "median_s", "min_s", "max_s", "cpu_median_s");
        String row = String.format("%8d %7d %6d %7d %7d %12.6f %12.6f %12.6f %12.6f%n", features, rows, steps,
                finalActive, timings.runs(), timings.median(), timings.min(), timings.max(), cpu.median());
        return head + row;
    }
}
