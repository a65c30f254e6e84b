package lariat.bench;

import java.util.LinkedHashMap;
import java.util.Map;

/** The outcome of one moments benchmark: shape, block size and timings of the full passes. Immutable. */
public final class MomentsResult {

    private final int features;
    private final int rows;
    private final int blockSize;
    private final Timings timings;

    private MomentsResult(int features, int rows, int blockSize, Timings timings) {
        this.features = features;
        this.rows = rows;
        this.blockSize = blockSize;
        this.timings = timings;
    }

    static MomentsResult of(int features, int rows, int blockSize, Timings timings) {
        return new MomentsResult(features, rows, blockSize, timings);
    }

    /** Records per second of the median pass. */
    public double recordsPerSecond() {
        return rows / timings.median();
    }

    /**
     * The JSON object: records_per_s (the contract), then features, width, rows, block_size, repeat and the
     * median, minimum and maximum pass time in seconds.
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
        return m;
    }

    public String table() {
        String head = String.format("%8s %6s %8s %6s %7s %12s %14s%n", "features", "width", "rows", "block",
                "repeat", "median_s", "records_per_s");
        String row = String.format("%8d %6d %8d %6d %7d %12.6f %14.1f%n", features, features + 1, rows, blockSize,
                timings.runs(), timings.median(), recordsPerSecond());
        return head + row;
    }
}
