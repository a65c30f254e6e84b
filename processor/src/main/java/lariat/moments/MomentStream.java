package lariat.moments;

import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;
import java.util.Arrays;

/**
 * Per-key accumulator: fixed-size blocks aligned to the record count, event-time forgetting, pending
 * partial block kept raw.
 *
 * <p>Records 0..B−1 form the first block, B..2B−1 the second, and so on (B = block size). A block is merged
 * into the state with {@link Moments}' block update when its last record arrives; the records of an
 * unfinished block stay raw. The state therefore depends only on the ordered records, never on how a
 * caller grouped its {@link #add} calls or when it took snapshots or serialized: the same records in the
 * same order give bit-identical bytes and fingerprints.
 *
 * <p>Gathered blocks: when the state may use two or more threads and the width is moderate
 * ({@link Moments#threadsUsed(int, int, int)}), completed blocks wait raw until a group of up to
 * {@value Moments#MAX_GROUP} has completed; then the blocks' own means and co-moments are computed side by
 * side on the shared worker threads and merged one after another in record order, so every bit is as if each
 * block had merged on its own. A block whose merge could overflow (a value or weight above
 * {@value Moments#GROUP_SAFE_ABS} in magnitude, or a state near overflow) never waits, so an overflow is still
 * reported by the record that completes its block. {@link #snapshot()}, {@link #fingerprint()} and
 * {@link #toBytes()} include waiting blocks as merged.
 *
 * <p>Forgetting with half-life h (event time, never wall-clock time): the intended result is the batch
 * moments in which record i has weight w_i · 2^(−(T − t_i)/h), T the largest event time seen. When a block
 * is merged, let t_s be the state's largest event time and t_b = max(t_s, largest time in the block). The
 * state's W and C are scaled by f = 2^(−(t_b − t_s)/h) and Σ w² by f², and block row i enters with weight
 * w_i · 2^(−(t_b − t_i)/h), so a late record gets less weight. The factors are computed in plain IEEE 754
 * arithmetic from a fixed table, the same bits on every platform and without allocating. A weight that
 * underflows to zero leaves the record counted but weightless; a state whose weight underflows becomes
 * empty in weight. With h = +∞ no weight is ever scaled.
 *
 * <p>Canonical bytes ({@link #toBytes()}), big-endian: format version (1 byte, {@value #FORMAT_VERSION}),
 * width (int), block size (int), half-life in ms (double, +∞ for none), count (long), pending rows p (int),
 * the state's {@link Moments#toBytes()}, then p raw rows each as d doubles, weight (double), event time
 * (long). Not thread-safe.
 */
public final class MomentStream {

    /** Format version written as the first byte of {@link #toBytes()}. */
    public static final byte FORMAT_VERSION = 1;

    private static final int HEADER_BYTES = 1 + 4 + 4 + 8 + 8 + 4;

    private final int d;
    private final int blockSize;
    private final double halfLifeMs;
    private Moments state;
    private long count;
    private int pending;
    private double[][] pendingRows;
    private double[] pendingWeights;
    private long[] pendingTimes;
    private double[] decayedWeights;
    /** A buffered row holds a value or weight above {@link Moments#GROUP_SAFE_ABS}. */
    private boolean largeWaiting;
    /** Per block of a group merge: the factor scaling the state before it. */
    private double[] factors;

    /**
     * Creates an empty stream.
     *
     * @param width number of columns d (features first, target last)
     * @param blockSize records per block, &gt;= 1
     * @param halfLifeMs forgetting half-life in event-time milliseconds, &gt; 0; {@link Double#POSITIVE_INFINITY}
     *     means no forgetting
     * @throws IllegalArgumentException on an invalid argument (the message names it)
     */
    public MomentStream(int width, int blockSize, double halfLifeMs) {
        this.state = new Moments(width);
        this.d = width;
        if (blockSize < 1 || (long) blockSize * width > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("blockSize must be >= 1 with blockSize * width < 2^31, was "
                    + blockSize + " for width " + width);
        }
        if (!(halfLifeMs > 0.0)) {
            throw new IllegalArgumentException("halfLifeMs must be > 0 or +Infinity, was " + halfLifeMs);
        }
        this.blockSize = blockSize;
        this.halfLifeMs = halfLifeMs;
        int capacity = Math.min(blockSize, 8);
        this.pendingRows = new double[capacity][width];
        this.pendingWeights = new double[capacity];
        this.pendingTimes = new long[capacity];
    }

    /** Number of columns d. */
    public int width() {
        return d;
    }

    /** Records per block. */
    public int blockSize() {
        return blockSize;
    }

    /** Threads a block merge may use ({@link Moments#threads()}). */
    public int threads() {
        return state.threads();
    }

    /**
     * Sets the threads a block merge of a wide stream may use, the calling thread included (as
     * {@link Moments#setThreads(int)}: the bytes do not depend on it). The default is
     * {@link Moments#defaultThreads()}. Modifies this object only.
     *
     * @throws IllegalArgumentException unless 1 &lt;= threads &lt;= 64
     */
    public void setThreads(int threads) {
        state.setThreads(threads);
    }

    /** Forgetting half-life in milliseconds ({@link Double#POSITIVE_INFINITY} for none). */
    public double halfLifeMs() {
        return halfLifeMs;
    }

    /**
     * Accepts one record; completes and merges a block when this is its last record. Copies {@code z}.
     *
     * @throws IllegalArgumentException on a null or wrong-width row, a non-finite value (the message names
     *     the column and value), a weight that is not finite and positive, or an overflowing merge; nothing
     *     is modified then
     */
    public void add(double[] z, double weight, long eventTimeMs) {
        boolean large = RowCheck.rowAbove(z, d, Moments.GROUP_SAFE_ABS);
        RowCheck.weight(weight);
        int group = state.blockGroup(blockSize);
        ensureCapacity(pending + 1, group);
        System.arraycopy(z, 0, pendingRows[pending], 0, d);
        pendingWeights[pending] = weight;
        pendingTimes[pending] = eventTimeMs;
        int rows = pending + 1;
        if (rows % blockSize == 0 && (rows / blockSize >= group || !mayWait(large, weight))) {
            mergeFullBlocks(rows / blockSize);
            pending = 0;
            largeWaiting = false;
        } else {
            pending = rows;
            largeWaiting |= large || weight > Moments.GROUP_SAFE_ABS;
        }
        count++;
    }

    /** New moments: the merged blocks plus the pending rows, merged into a copy as blocks would be. */
    public Moments snapshot() {
        Moments s = state.copy();
        int full = pending / blockSize;
        if (full > 0) {
            mergeRows(s, full);
        }
        int rest = pending - full * blockSize;
        if (rest > 0) {
            mergeRows(s, full * blockSize, rest);
        }
        return s;
    }

    /** Records accepted. */
    public long count() {
        return count;
    }

    /** Records of the unfinished block, kept raw. */
    public int pendingRows() {
        return pending % blockSize;
    }

    /** An independent deep copy. */
    public MomentStream copy() {
        MomentStream c = new MomentStream(d, blockSize, halfLifeMs);
        c.state = state.copy();
        c.count = count;
        c.pending = pending;
        c.pendingRows = new double[pendingRows.length][];
        for (int r = 0; r < pendingRows.length; r++) {
            c.pendingRows[r] = pendingRows[r].clone();
        }
        c.pendingWeights = pendingWeights.clone();
        c.pendingTimes = pendingTimes.clone();
        c.largeWaiting = largeWaiting;
        return c;
    }

    /** Canonical bytes (layout in the class comment), including the raw pending rows. */
    public byte[] toBytes() {
        settle();
        int length = HEADER_BYTES + Moments.byteLength(d) + pending * (8 * d + 16);
        ByteBuffer buf = ByteBuffer.allocate(length);
        buf.put(FORMAT_VERSION).putInt(d).putInt(blockSize).putDouble(halfLifeMs).putLong(count).putInt(pending);
        state.write(buf);
        for (int r = 0; r < pending; r++) {
            for (int c = 0; c < d; c++) {
                buf.putDouble(pendingRows[r][c]);
            }
            buf.putDouble(pendingWeights[r]).putLong(pendingTimes[r]);
        }
        return buf.array();
    }

    /**
     * Reads bytes written by {@link #toBytes()}.
     *
     * @throws IllegalArgumentException if the bytes are null, truncated, of another version, carry trailing
     *     bytes, or describe an invalid stream (bad parameters, counts that do not add up, a non-finite value
     *     or bad weight in a pending row)
     */
    public static MomentStream fromBytes(byte[] b) {
        if (b == null) {
            throw new IllegalArgumentException("bytes is null");
        }
        ByteBuffer buf = ByteBuffer.wrap(b);
        try {
            MomentStream s = readUnchecked(buf);
            if (buf.hasRemaining()) {
                throw new IllegalArgumentException("bytes has " + buf.remaining() + " trailing bytes");
            }
            return s;
        } catch (BufferUnderflowException e) {
            throw new IllegalArgumentException("stream bytes are truncated", e);
        }
    }

    private static MomentStream readUnchecked(ByteBuffer buf) {
        byte version = buf.get();
        if (version != FORMAT_VERSION) {
            throw new IllegalArgumentException("unsupported stream format version " + version);
        }
        int width = buf.getInt();
        int blockSize = buf.getInt();
        double halfLife = buf.getDouble();
        MomentStream s = new MomentStream(width, blockSize, halfLife);
        long count = buf.getLong();
        int pending = buf.getInt();
        if (pending < 0 || pending >= blockSize || count < pending || (count - pending) % blockSize != 0) {
            throw new IllegalArgumentException("pending rows " + pending + " and count " + count
                    + " do not fit block size " + blockSize);
        }
        Moments state = Moments.read(buf);
        if (state.width() != width || state.count() != count - pending) {
            throw new IllegalArgumentException("state has width " + state.width() + " and count " + state.count()
                    + ", expected width " + width + " and count " + (count - pending));
        }
        if (buf.remaining() < (long) pending * (8 * width + 16)) {
            throw new IllegalArgumentException("stream bytes are truncated: " + pending + " pending rows expected");
        }
        s.state = state;
        s.count = count;
        s.ensureCapacity(pending, 1);
        double[] rows = new double[pending * width];
        for (int r = 0; r < pending; r++) {
            for (int c = 0; c < width; c++) {
                rows[r * width + c] = buf.getDouble();
            }
            s.pendingWeights[r] = buf.getDouble();
            s.pendingTimes[r] = buf.getLong();
        }
        RowCheck.block(rows, s.pendingWeights, s.pendingTimes, pending, width);
        for (int r = 0; r < pending; r++) {
            System.arraycopy(rows, r * width, s.pendingRows[r], 0, width);
            s.largeWaiting |= RowCheck.rowAbove(s.pendingRows[r], width, Moments.GROUP_SAFE_ABS)
                    || s.pendingWeights[r] > Moments.GROUP_SAFE_ABS;
        }
        s.pending = pending;
        return s;
    }

    /** Lowercase hexadecimal SHA-256 of the canonical bytes of {@link #snapshot()}. */
    public String fingerprint() {
        return snapshot().fingerprint();
    }

    @Override
    public String toString() {
        return "MomentStream[width=" + d + ", blockSize=" + blockSize + ", halfLifeMs=" + halfLifeMs
                + ", count=" + count + ", pending=" + pending + "]";
    }

    /**
     * Whether the blocks just completed may wait, unmerged, for the rest of their group: only if no buffered
     * value or weight (the new record's included) is large and the state is far from overflow, so that their
     * merge cannot fail later. A merge that can fail thus happens when its last record arrives, as it would
     * without gathering, and that record's {@link #add} reports it.
     */
    private boolean mayWait(boolean large, double weight) {
        return !largeWaiting && !large && weight <= Moments.GROUP_SAFE_ABS && state.farFromOverflow();
    }

    /**
     * Merges the full blocks among the buffered rows into the state, leaving fewer than a block buffered (the
     * canonical form that {@link #toBytes()} writes). Changes no result: the same blocks merge in the same order
     * whenever they merge.
     */
    private void settle() {
        int full = pending / blockSize;
        if (full > 0) {
            int rest = pending - full * blockSize;
            mergeFullBlocks(full);
            pending = rest;
        }
    }

    /**
     * Merges the first {@code blocks} full blocks of buffered rows into the state and moves the buffered rows
     * after them to the front (the caller sets {@code pending}). If a merge fails, the blocks merged before it
     * are dropped from the buffer all the same ({@code pending} is lowered by their rows) and the failure is
     * rethrown: the stream then holds the same records as before the call.
     */
    private void mergeFullBlocks(int blocks) {
        int merged = blocks;
        try {
            mergeRows(state, blocks);
        } catch (Moments.MergeStopped e) {
            merged = e.merged;
            throw e;
        } catch (IllegalArgumentException e) {
            merged = 0;
            throw e;
        } finally {
            if (merged > 0) {
                dropFront(merged * blockSize);
                if (merged < blocks) {
                    pending -= merged * blockSize;
                }
            }
        }
    }

    /** Moves buffered rows {@code rows..} to the front, keeping every row array (the buffer is a ring of them). */
    private void dropFront(int rows) {
        int capacity = pendingRows.length;
        if (rows % capacity == 0) {
            return;
        }
        double[][] moved = new double[capacity][];
        for (int r = 0; r < capacity; r++) {
            moved[r] = pendingRows[(r + rows) % capacity];
        }
        pendingRows = moved;
        System.arraycopy(pendingWeights, rows, pendingWeights, 0, capacity - rows);
        System.arraycopy(pendingTimes, rows, pendingTimes, 0, capacity - rows);
    }

    /**
     * Merges buffered rows {@code base..base+n-1} into {@code target} as one block, with forgetting, and
     * threads for a wide block.
     */
    private void mergeRows(Moments target, int base, int n) {
        if (halfLifeMs == Double.POSITIVE_INFINITY) {
            target.mergeBlock(pendingRows, base, pendingWeights, pendingTimes, n, 1.0);
            return;
        }
        double factor = decayWeights(target.count(), target.maxEventTimeMs(), base, n);
        target.mergeBlock(pendingRows, base, decayedWeights, pendingTimes, n, factor);
    }

    /**
     * Merges the first {@code blocks} full blocks of buffered rows into {@code target} in order, as that many
     * calls of {@link #mergeRows(Moments, int, int)} would, but with their summaries computed side by side.
     *
     * @throws Moments.MergeStopped if a merge after the first failed (the earlier blocks are merged)
     */
    private void mergeRows(Moments target, int blocks) {
        if (blocks == 1) {
            mergeRows(target, 0, blockSize);
            return;
        }
        if (factors == null || factors.length < blocks) {
            factors = new double[blocks];
        }
        double[] weights = pendingWeights;
        if (halfLifeMs == Double.POSITIVE_INFINITY) {
            Arrays.fill(factors, 1.0);
        } else {
            long merged = target.count();
            long stateMax = target.maxEventTimeMs();
            for (int b = 0; b < blocks; b++) {
                int base = b * blockSize;
                factors[b] = decayWeights(merged, stateMax, base, blockSize);
                stateMax = Math.max(stateMax, latestTime(base, blockSize));
                merged += blockSize;
            }
            weights = decayedWeights;
        }
        target.mergeBlocks(pendingRows, weights, pendingTimes, blockSize, blocks, factors);
    }

    /**
     * Writes the forgetting weights of buffered rows base..base+n−1 into {@code decayedWeights} (same indices)
     * and returns the factor for a state of {@code merged} records whose largest event time is
     * {@code stateMax}: both relative to t_b = max(t_s, the rows' largest time), as the class comment says.
     */
    private double decayWeights(long merged, long stateMax, int base, int n) {
        long reference = Math.max(stateMax, latestTime(base, n));
        if (decayedWeights == null || decayedWeights.length < pendingWeights.length) {
            decayedWeights = new double[pendingWeights.length];
        }
        for (int r = base; r < base + n; r++) {
            decayedWeights[r] = pendingWeights[r] * decay(reference, pendingTimes[r]);
        }
        return merged == 0 ? 1.0 : decay(reference, stateMax);
    }

    /** The largest event time of buffered rows base..base+n−1. */
    private long latestTime(int base, int n) {
        long latest = Long.MIN_VALUE;
        for (int r = base; r < base + n; r++) {
            latest = Math.max(latest, pendingTimes[r]);
        }
        return latest;
    }

    private double decay(long later, long earlier) {
        return Decay.factor(later, earlier, halfLifeMs);
    }

    /** Grows the buffer to hold {@code rows} rows, at most {@code group} blocks. */
    private void ensureCapacity(int rows, int group) {
        if (rows <= pendingWeights.length) {
            return;
        }
        long most = (long) blockSize * Math.max(1, group);
        int capacity = (int) Math.min(most, Math.max((long) rows, 2L * pendingWeights.length));
        int old = pendingRows.length;
        pendingRows = Arrays.copyOf(pendingRows, capacity);
        for (int r = old; r < capacity; r++) {
            pendingRows[r] = new double[d];
        }
        pendingWeights = Arrays.copyOf(pendingWeights, capacity);
        pendingTimes = Arrays.copyOf(pendingTimes, capacity);
    }
}
