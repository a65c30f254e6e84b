package lariat.bench;

import lariat.moments.MomentStream;
import lariat.moments.Moments;

/**
 * Times the streaming moments update: every row of a {@link SyntheticRows} problem (z of width p + 1) goes
 * through {@link MomentStream#add} with unit weight and no forgetting, then one {@link MomentStream#snapshot()}
 * folds in the partial block. Row generation is not timed. One untimed warm-up pass over up to
 * {@link #WARMUP_ROWS} rows comes first; then {@code repeat} timed passes, each on a fresh stream.
 */
public final class MomentsBench {

    /** Block size used when the caller gives none; {@link MomentStream} itself has no default. */
    public static final int DEFAULT_BLOCK_SIZE = 256;
    /** Rows in the warm-up pass (fewer if the problem has fewer). */
    public static final int WARMUP_ROWS = 20_000;

    private MomentsBench() {
    }

    /** @throws IllegalArgumentException if features &lt; 1, rows &lt; 2, blockSize &lt; 1 or repeat &lt; 1 */
    public static MomentsResult run(int features, int rows, int blockSize, int repeat, long seed) {
        if (blockSize < 1) {
            throw new IllegalArgumentException("block-size must be >= 1, was " + blockSize);
        }
        if (repeat < 1) {
            throw new IllegalArgumentException("repeat must be >= 1, was " + repeat);
        }
        SyntheticRows data = SyntheticRows.of(features, rows, seed);
        int d = features + 1;
        double[] z = new double[d];
        pass(data, Math.min(rows, WARMUP_ROWS), blockSize, z);
        double[] seconds = new double[repeat];
        double[] cpu = new double[repeat];
        for (int r = 0; r < repeat; r++) {
            long c0 = CpuClock.nanos();
            long t0 = System.nanoTime();
            Moments m = pass(data, rows, blockSize, z);
            seconds[r] = (System.nanoTime() - t0) * 1e-9;
            cpu[r] = (CpuClock.nanos() - c0) * 1e-9;
            if (m.count() != rows) {
                throw new IllegalStateException("stream counted " + m.count() + " of " + rows + " rows");
            }
        }
        return MomentsResult.of(features, rows, blockSize, Timings.of(seconds), Timings.of(cpu));
    }

    private static Moments pass(SyntheticRows data, int rows, int blockSize, double[] z) {
        int d = z.length;
        double[] all = data.data();
        MomentStream stream = new MomentStream(d, blockSize, Double.POSITIVE_INFINITY);
        for (int i = 0; i < rows; i++) {
            System.arraycopy(all, i * d, z, 0, d);
            stream.add(z, 1.0, i);
        }
        return stream.snapshot();
    }
}
