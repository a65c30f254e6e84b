package lariat.bench;

import java.util.LinkedHashMap;
import java.util.Map;

/** The outcome of one moments benchmark: shape, block size, threads and timings of the full passes. Immutable. */
public final class MomentsResult implements BenchReport {

    private final int features;
    private final int rows;
    private final int blockSize;
    private final int threads;
    private final int threadsUsed;
    private final Timings timings;
    private final Timings cpu;
    private final Timings callerCpu;
    private final double warmupSeconds;

    private MomentsResult(int features, int rows, int blockSize, int threads, int threadsUsed, Timings timings,
                          Timings cpu, Timings callerCpu, double warmupSeconds) {
        this.features = features;
        this.rows = rows;
        this.blockSize = blockSize;
        this.threads = threads;
        this.threadsUsed = threadsUsed;
        this.timings = timings;
        this.cpu = cpu;
        this.callerCpu = callerCpu;
        this.warmupSeconds = warmupSeconds;
    }

    /**
     * @param threads the threads the stream was allowed to use
     * @param threadsUsed the threads its block updates split their work between (1 for narrow widths)
     * @param cpu the same passes' CPU time of all Java threads (worker threads included)
     * @param callerCpu the same passes' CPU time of the benchmark thread alone
     * @param warmupSeconds the wall time of the untimed warm-up passes before them
     */
    static MomentsResult of(int features, int rows, int blockSize, int threads, int threadsUsed, Timings timings,
                            Timings cpu, Timings callerCpu, double warmupSeconds) {
        return new MomentsResult(features, rows, blockSize, threads, threadsUsed, timings, cpu, callerCpu,
                warmupSeconds);
    }

    /** Records per second of the median pass. */
    public double recordsPerSecond() {
        return rows / timings.median();
    }

    /**
     * Records per second of CPU time of all Java threads, median pass (steadier than wall time on a loaded
     * machine; counts the stream's worker threads, as a whole-process CPU time of another program would).
     */
    public double recordsPerCpuSecond() {
        return rows / cpu.median();
    }

    /** Records per second of CPU time of the benchmark thread alone, median pass. */
    public double recordsPerCallerCpuSecond() {
        return rows / callerCpu.median();
    }

    /**
     * The JSON object: records_per_s (the contract), then features, width, rows, block_size, threads (used),
     * threads_allowed, repeat,
     * the median, minimum and maximum pass time in seconds, records_per_cpu_s (all Java threads) and
     * records_per_caller_cpu_s (benchmark thread), and warmup_s (wall time of the untimed warm-up).
     */
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("records_per_s", recordsPerSecond());
        m.put("features", features);
        m.put("width", features + 1);
        m.put("rows", rows);
        m.put("block_size", blockSize);
        m.put("threads", threadsUsed);
        m.put("threads_allowed", threads);
        m.put("repeat", timings.runs());
        m.put("median_s", timings.median());
        m.put("min_s", timings.min());
        m.put("max_s", timings.max());
        m.put("records_per_cpu_s", recordsPerCpuSecond());
        m.put("records_per_caller_cpu_s", recordsPerCallerCpuSecond());
        m.put("warmup_s", warmupSeconds);
        return m;
    }

    public String table() {
        String head = String.format("%8s %6s %8s %6s %7s %7s %12s %14s %18s %18s %9s%n", "features", "width",
                "rows", "block", "threads", "repeat", "median_s", "records_per_s", "records_per_cpu_s",
                "caller_cpu_rec_s", "warmup_s");
        String row = String.format("%8d %6d %8d %6d %7d %7d %12.6f %14.1f %18.1f %18.1f %9.2f%n", features,
                features + 1, rows, blockSize, threadsUsed, timings.runs(), timings.median(), recordsPerSecond(),
                recordsPerCpuSecond(), recordsPerCallerCpuSecond(), warmupSeconds);
        return head + row;
    }
}
