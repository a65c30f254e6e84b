package lariat.bench;

import java.util.LinkedHashMap;
import java.util.Map;

/** The outcome of one moments benchmark: shape, block size and timings of the full passes. Immutable. */
public final class MomentsResult {

    private final int features;
    private final int rows;
    private final int blockSize;
    private final Timings timings;
    private final Timings cpu;

    private MomentsResult(int features, int rows, int blockSize, Timings timings, Timings cpu) {
        this.features = features;
        this.rows = rows;
        this.blockSize = blockSize;
        this.timings = timings;
        this.cpu = cpu;
    }

    /** @param cpu the same passes' CPU time of the benchmark thread */
    static MomentsResult of(int features, int rows, int blockSize, Timings timings, Timings cpu) {
        return new MomentsResult(features, rows, blockSize, timings, cpu);
    }

    /** Records per second of the median pass. */
    public double recordsPerSecond() {
        return rows / timings.median();
    }

    /** Records per second of CPU time of the median pass (steadier than wall time on a loaded machine). */
    public double recordsPerCpuSecond() {
        return rows / cpu.median();
    }

    /**
     * The JSON object: records_per_s (the contract), then features, width, rows, block_size, repeat, the
     * median, minimum and maximum pass time in seconds, and records_per_cpu_s.
     */
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("records_per_s", recordsPerSecond());
        m.put("features", features);
        m.put("width", features + 1);
        m.put("rows", rows);
        m.put("block_size", blockSize);
        m.put("repeat", timings.runs());
        m.put("median_s", timings.median());
        m.put("min_s", timings.min());
        m.put("max_s", timings.max());
        m.put("records_per_cpu_s", recordsPerCpuSecond());
        return m;
    }

    public String table() {
        String head = String.format("%8s %6s %8s %6s %7s %12s %14s %18s%n", "features", "width", "rows", "block",
                "repeat", "median_s", "records_per_s", "records_per_cpu_s");
        String row = String.format("%8d %6d %8d %6d %7d %12.6f %14.1f %18.1f%n", features, features + 1, rows,
                blockSize, timings.runs(), timings.median(), recordsPerSecond(), recordsPerCpuSecond());
        return head + row;
    }
}
