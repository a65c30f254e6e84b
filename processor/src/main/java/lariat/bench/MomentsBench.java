package lariat.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;

import lariat.moments.MomentStream;
import lariat.moments.Moments;

/**
 * Times the streaming moments update: every row of a {@link SyntheticRows} problem (z of width p + 1) goes
 * through {@link MomentStream#add} with unit weight and no forgetting, then one {@link MomentStream#snapshot()}
 * folds in the partial block. Row generation is not timed. Untimed warm-up passes come first, each on a fresh
 * stream, so that the JIT compiler has compiled the update before the clock runs (a short fixed warm-up left
 * the kernel half compiled: at p = 100 the median of three passes was half the steady rate): one over up to
 * {@link #WARMUP_ROWS} rows, then passes over all rows until {@code warmupSeconds} have passed (the last may
 * overrun). Then {@code repeat} timed passes, each on a fresh stream. The stream
 * uses the given number of threads ({@link MomentStream#setThreads}); CPU time is measured both for all Java
 * threads (the stream's worker threads included) and for the benchmark thread alone.
 */
public final class MomentsBench {

    /** Block size used when the caller gives none; {@link MomentStream} itself has no default. */
    public static final int DEFAULT_BLOCK_SIZE = 256;
    /** Rows in the warm-up pass (fewer if the problem has fewer). */
    public static final int WARMUP_ROWS = 20_000;

    private MomentsBench() {
    }

    /** Seconds of warm-up when the caller gives none. */
    public static final double DEFAULT_WARMUP_SECONDS = 1.0;

    /**
     * {@link #run(int, int, int, int, long, int, double)} with {@link Moments#defaultThreads()} threads and
     * {@link #DEFAULT_WARMUP_SECONDS}.
     */
    public static MomentsResult run(int features, int rows, int blockSize, int repeat, long seed) {
        return run(features, rows, blockSize, repeat, seed, Moments.defaultThreads(), DEFAULT_WARMUP_SECONDS);
    }

    /**
     * @throws IllegalArgumentException if features &lt; 1, rows &lt; 2, blockSize &lt; 1, repeat &lt; 1, threads is
     *     outside [1, 64] or warmupSeconds is negative or not finite
     */
    public static MomentsResult run(int features, int rows, int blockSize, int repeat, long seed, int threads,
                                    double warmupSeconds) {
        if (threads < 1 || threads > 64) {
            throw new IllegalArgumentException("threads must be in [1, 64], was " + threads);
        }
        if (blockSize < 1) {
            throw new IllegalArgumentException("block-size must be >= 1, was " + blockSize);
        }
        if (repeat < 1) {
            throw new IllegalArgumentException("repeat must be >= 1, was " + repeat);
        }
        if (!(warmupSeconds >= 0) || Double.isInfinite(warmupSeconds)) {
            throw new IllegalArgumentException("warmup-s must be finite and >= 0, was " + warmupSeconds);
        }
        SyntheticRows data = SyntheticRows.of(features, rows, seed);
        int d = features + 1;
        double[] z = new double[d];
        long warmStart = System.nanoTime();
        pass(data, Math.min(rows, WARMUP_ROWS), blockSize, threads, z);
        while ((System.nanoTime() - warmStart) * 1e-9 < warmupSeconds) {
            pass(data, rows, blockSize, threads, z);
        }
        double warmedSeconds = (System.nanoTime() - warmStart) * 1e-9;
        double[] seconds = new double[repeat];
        double[] cpu = new double[repeat];
        double[] callerCpu = new double[repeat];
        for (int r = 0; r < repeat; r++) {
            long p0 = processCpuNanos();
            long c0 = CpuClock.nanos();
            long t0 = System.nanoTime();
            Moments m = pass(data, rows, blockSize, threads, z);
            seconds[r] = (System.nanoTime() - t0) * 1e-9;
            callerCpu[r] = (CpuClock.nanos() - c0) * 1e-9;
            cpu[r] = (processCpuNanos() - p0) * 1e-9;
            if (m.count() != rows) {
                throw new IllegalStateException("stream counted " + m.count() + " of " + rows + " rows");
            }
        }
        return MomentsResult.of(features, rows, blockSize, threads, Moments.threadsUsed(d, blockSize, threads),
                Timings.of(seconds), Timings.of(cpu), Timings.of(callerCpu), warmedSeconds);
    }

    /**
     * CPU time in nanoseconds of all live Java threads (the stream's workers included; the JVM's compiler
     * and collector threads are not Java threads). The process total the operating system reports has a
     * resolution of 10 ms on Linux, too coarse for one pass; wall time if thread CPU time is unsupported.
     */
    private static long processCpuNanos() {
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        if (!mx.isThreadCpuTimeSupported()) {
            return System.nanoTime();
        }
        long total = 0;
        for (long id : mx.getAllThreadIds()) {
            total += Math.max(0L, mx.getThreadCpuTime(id));
        }
        return total;
    }

    private static Moments pass(SyntheticRows data, int rows, int blockSize, int threads, double[] z) {
        int d = z.length;
        double[] all = data.data();
        MomentStream stream = new MomentStream(d, blockSize, Double.POSITIVE_INFINITY);
        stream.setThreads(threads);
        for (int i = 0; i < rows; i++) {
            System.arraycopy(all, i * d, z, 0, d);
            stream.add(z, 1.0, i);
        }
        return stream.snapshot();
    }
}
