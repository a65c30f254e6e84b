package lariat.moments;

import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;
import java.util.Arrays;

/**
 * Weighted, centered co-moments over z = (z_0..z_{d-1}); callers put features first and the target last.
 *
 * <p>The state is the record count n, the total weight W = Σ w, the sum of squared weights Σ w², the
 * weighted mean μ = Σ w z / W, the centered co-moment matrix C = Σ w (z − μ)(z − μ)ᵀ and the event-time
 * range. Only centered updates are used; the raw-sum form Σ w z zᵀ − W μ μᵀ is never formed, because it
 * cancels catastrophically when |μ| is large next to the spread (Chan, Golub &amp; LeVeque 1983 bound its
 * relative error by about n·ε·κ², κ² = 1 + μ²/σ², against n·ε·κ for the updating formulas used here).
 *
 * <pre>
 * one record (West 1979):   W' = W + w,  δ = z − μ,  μ' = μ + (w/W') δ,  C' = C + (w W / W') δ δᵀ
 * merge A, B (Chan, Golub &amp; LeVeque 1979):
 *                           W = W_a + W_b,  δ = μ_b − μ_a,  μ = μ_a + (W_b/W) δ,
 *                           C = C_a + C_b + (W_a W_b / W) δ δᵀ
 * block of rows:            μ_b by a corrected two-pass mean, C_b = Xᵀ X with rows √w_i (z_i − μ_b)
 *                           (a symmetric rank-k update, {@link RankUpdate}), then merged as above.
 * </pre>
 *
 * <p>The mean is held as an unevaluated sum of two doubles, μ = μ_hi + μ_lo with μ_hi = fl(μ_hi + μ_lo),
 * updated with the error-free TwoSum (O. Møller, "Quasi double-precision in floating point addition", BIT
 * 5, 1965, 37–50; T. J. Dekker, "A floating-point technique for extending the available precision",
 * Numerische Mathematik 18, 1971, 224–242). Then δ = (z − μ_hi) − μ_lo is accurate to the spread of the
 * data rather than to the last place of |μ|, which the co-moment update needs when |μ| is large next to
 * the spread: with a plain double mean, each rounding of μ to a unit in the last place of |μ| enters C to
 * first order. {@link #mean(int)} returns μ_hi.
 *
 * <p>Sources: D. H. D. West, "Updating mean and variance estimates: an improved method", Communications
 * of the ACM 22(9), 1979, 532–535. T. F. Chan, G. H. Golub, R. J. LeVeque, "Updating formulae and a
 * pairwise algorithm for computing sample variances", Stanford report STAN-CS-79-773, 1979; and
 * "Algorithms for computing the sample variance: analysis and recommendations", The American
 * Statistician 37(3), 1983, 242–247.
 *
 * <p>Only the upper triangle of C is computed and stored; {@link #comoment(int, int)} and
 * {@link #comomentMatrix()} read C_ij for i &gt; j from C_ji, so C is exactly symmetric. A state whose weight
 * underflows to zero under {@link #scale(double)} becomes empty in weight (W = Σ w² = 0, μ = 0, C = 0) and
 * keeps its record count and event-time range. Every mutating method checks its input, and that the
 * result stays finite, before it modifies anything; on failure it throws {@link IllegalArgumentException}
 * and the state is unchanged. Updates allocate nothing except workspaces sized on first use.
 *
 * <p>The rank-k update of a wide block (width above {@value #SERIAL_MAX_WIDTH}) may be split between
 * {@link #threads()} threads, the caller and shared daemon workers, by rows of C; blocks of moderate width
 * gathered by a {@link MomentStream} are summarized side by side, one block per thread, and merged in order
 * ({@link #mergeBlocks}). Each entry is computed by the same arithmetic whichever thread computes it, so the
 * bytes do not depend on the thread count.
 *
 * <p>Canonical bytes ({@link #toBytes()}), big-endian: format version (1 byte, {@value #FORMAT_VERSION}),
 * width d (int), count (long), W (double), Σ w² (double), min event time (long), max event time (long),
 * μ_hi (d doubles), μ_lo (d doubles), the upper triangle of C row by row (d(d+1)/2 doubles). Signed zeros
 * are written as +0.0.
 * Equality and hash code are those of the canonical bytes. Not thread-safe.
 */
public final class Moments {

    /** Format version written as the first byte of {@link #toBytes()}. */
    public static final byte FORMAT_VERSION = 1;

    /** Largest supported width: the canonical bytes of wider moments would not fit one Java array. */
    public static final int MAX_WIDTH = 20_000;

    private static final int HEADER_BYTES = 1 + 4 + 8 + 8 + 8 + 8 + 8;
    /** Block rows centered and transposed at a time for {@link RankUpdate}: 2 KiB per column. */
    private static final int PANEL_ROWS = 256;
    private static final int MIN_PANEL_ROWS = 16;
    /** Bound on the panel workspace, 4 MiB, which lowers the panel rows for very wide moments. */
    private static final int PANEL_VALUES = 1 << 19;
    /** System property giving the default {@link #threads()} of new moments. */
    public static final String THREADS_PROPERTY = "lariat.moments.threads";
    /**
     * Widths up to this never split one block's update between threads (measured on 2 processors, a second
     * thread made widths 101 and 201 slower and broke even near 300); from {@value #GROUP_MIN_WIDTH} a
     * {@link MomentStream} may instead summarize several blocks at once ({@link #blockGroup};
     * DEVELOPERS.md, "Moments: threads").
     */
    static final int SERIAL_MAX_WIDTH = 256;
    /** Multiply-adds of one panel below which the block update stays on the calling thread. */
    private static final long SERIAL_MAX_WORK = 1L << 19;
    /** Block values (rows · width) below which the mean and centering passes stay on the calling thread. */
    private static final long SERIAL_MAX_PASS = 1L << 14;
    /** Parts per thread of a parallel mean or centering pass. */
    private static final int PASS_PARTS_PER_THREAD = 2;
    /** Upper entries below which a merge of co-moments stays on the calling thread. */
    private static final long SERIAL_MAX_MERGE = 1L << 16;
    /** Parts per thread of a parallel panel update (more parts balance load on a busy machine). */
    private static final int PARTS_PER_THREAD = 4;
    /** Narrowest width whose blocks are summarized several at a time ({@link #blockGroup}). */
    static final int GROUP_MIN_WIDTH = 48;
    /** Multiply-adds of one block's rank-k update below which blocks are not worth a thread. */
    private static final long GROUP_MIN_WORK = 1L << 20;
    /** Most blocks gathered for {@link #mergeBlocks}. */
    static final int MAX_GROUP = 4;
    /** Values and weights up to this magnitude may wait in a gathered block ({@link #farFromOverflow}). */
    static final double GROUP_SAFE_ABS = 1e60;

    private final int d;
    private final int panelRows;
    private long count;
    private double totalWeight;
    private double sumSquaredWeights;
    private final double[] mean;
    private final double[] meanLow;
    private final double[] comoment;
    private long minTime = Long.MAX_VALUE;
    private long maxTime = Long.MIN_VALUE;

    private final double[] delta;
    /** Block workspaces: 0 for {@link #mergeBlock}, 0..b−1 for a group of b blocks. */
    private BlockWork[] works;
    private final GroupJob group = new GroupJob();
    private int threads;
    private int[] rowBounds;
    private final BlockJob job = new BlockJob();
    /** Per thread slot: two rows of width d for {@link #mergeRowRange}. */
    private double[][] mergeRows;
    /** The row-major block of {@link #addBlock}, read through rowCopy. */
    private double[] blockFlat;
    private double[] rowCopy;

    /**
     * Creates empty moments of width {@code width}.
     *
     * @throws IllegalArgumentException unless 1 &lt;= width &lt;= {@link #MAX_WIDTH}
     */
    public Moments(int width) {
        if (width < 1 || width > MAX_WIDTH) {
            throw new IllegalArgumentException("width must be in [1, " + MAX_WIDTH + "], was " + width);
        }
        this.d = width;
        this.mean = new double[width];
        this.meanLow = new double[width];
        this.comoment = new double[width * width];
        this.panelRows = Math.max(MIN_PANEL_ROWS, Math.min(PANEL_ROWS, PANEL_VALUES / width));
        this.delta = new double[width];
        this.threads = threadsOrProcessors();
    }

    /**
     * {@link #defaultThreads()}, or the available processors if the property is malformed: the thread count
     * never changes a result, and a construction (also inside {@link #fromBytes}) must not fail over it.
     */
    private static int threadsOrProcessors() {
        try {
            return defaultThreads();
        } catch (IllegalArgumentException e) {
            return Math.min(Crew.MAX_THREADS, Runtime.getRuntime().availableProcessors());
        }
    }

    /**
     * The default thread count of new moments: the system property {@value #THREADS_PROPERTY} if set, else
     * the available processors (at most {@link Crew#MAX_THREADS}). New moments ignore a malformed property
     * (they use the available processors); this method reports it.
     *
     * @throws IllegalArgumentException if the property is set to anything but an integer in [1, 64]
     */
    public static int defaultThreads() {
        String v = System.getProperty(THREADS_PROPERTY);
        if (v == null) {
            return Math.min(Crew.MAX_THREADS, Runtime.getRuntime().availableProcessors());
        }
        try {
            return checkThreads(Integer.parseInt(v.trim()));
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(THREADS_PROPERTY + " must be an integer in [1, " + Crew.MAX_THREADS
                    + "], was \"" + v + "\"", e);
        }
    }

    private static int checkThreads(int n) {
        if (n < 1 || n > Crew.MAX_THREADS) {
            throw new IllegalArgumentException("threads must be in [1, " + Crew.MAX_THREADS + "], was " + n);
        }
        return n;
    }

    /** Threads a block update may use (the calling thread counts as one). */
    public int threads() {
        return threads;
    }

    /**
     * Threads that the block work of a {@link MomentStream} of {@code width} columns and blocks of
     * {@code blockSize} rows, allowed {@code threads} threads, splits between: for widths up to
     * {@value #SERIAL_MAX_WIDTH}, the blocks gathered per merge ({@link #blockGroup}); above, {@code threads}.
     *
     * @throws IllegalArgumentException unless 1 &lt;= width &lt;= {@link #MAX_WIDTH}, blockSize &gt;= 1 and
     *     1 &lt;= threads &lt;= 64
     */
    public static int threadsUsed(int width, int blockSize, int threads) {
        if (blockSize < 1) {
            throw new IllegalArgumentException("blockSize must be >= 1, was " + blockSize);
        }
        if (width > SERIAL_MAX_WIDTH) {
            return checkThreads(threads);
        }
        Moments m = new Moments(width);
        m.setThreads(threads);
        return m.blockGroup(blockSize);
    }

    /**
     * Sets the threads a block update of a wide block may use, the calling thread included; the others come
     * from a shared set of daemon threads. Blocks of widths up to {@value #SERIAL_MAX_WIDTH} and small blocks
     * are never split (a {@link MomentStream} may summarize several of them at once instead). The result is the same bits for every thread count. Modifies this object only.
     *
     * @throws IllegalArgumentException unless 1 &lt;= threads &lt;= 64
     */
    public void setThreads(int threads) {
        this.threads = checkThreads(threads);
        this.rowBounds = null;
        this.mergeRows = null;
    }

    /** Number of columns d. */
    public int width() {
        return d;
    }

    /**
     * Adds one record with West's (1979) update. Modifies this object only.
     *
     * @throws IllegalArgumentException if {@code z} is null, its length is not {@link #width()}, a value is not
     *     finite (the message names the column and value), the weight is not finite and positive, or the
     *     update would overflow; the state is then unchanged
     */
    public void add(double[] z, double weight, long eventTimeMs) {
        RowCheck.row(z, d);
        RowCheck.weight(weight);
        double newWeight = totalWeight + weight;
        double newSquares = sumSquaredWeights + weight * weight;
        double ratio = weight / newWeight;
        double k = totalWeight * ratio;
        for (int i = 0; i < d; i++) {
            delta[i] = (z[i] - mean[i]) - meanLow[i];
        }
        requireFiniteUpdate(newWeight, newSquares, 1.0, ratio, k, "record");
        moveMean(ratio);
        for (int i = 0; i < d; i++) {
            double kd = k * delta[i];
            int row = i * d;
            for (int j = i; j < d; j++) {
                comoment[row + j] += kd * delta[j];
            }
        }
        totalWeight = newWeight;
        sumSquaredWeights = newSquares;
        count++;
        minTime = Math.min(minTime, eventTimeMs);
        maxTime = Math.max(maxTime, eventTimeMs);
    }

    /**
     * Adds rows {@code 0..n-1} of the row-major block {@code rows} (at least n·d values) with their weights
     * and event times: the block's own mean and centered co-moment (a symmetric rank-k update) are computed first,
     * then merged (Chan, Golub &amp; LeVeque 1979). Reads the arrays, modifies this object only. The result
     * equals the record-by-record result up to rounding, not bit for bit.
     *
     * @throws IllegalArgumentException on a null or short array, a non-finite value (the message names the
     *     row, column and value), a weight that is not finite and positive, or an overflowing result; the
     *     state is then unchanged
     */
    public void addBlock(double[] rows, double[] weights, long[] eventTimesMs, int n) {
        RowCheck.block(rows, weights, eventTimesMs, n, d);
        if (n > 0) {
            if (rowCopy == null) {
                rowCopy = new double[d];
            }
            blockFlat = rows;
            try {
                mergeBlock(null, 0, weights, eventTimesMs, n, 1.0);
            } finally {
                blockFlat = null;
            }
        }
    }

    /**
     * Merges {@code other} into this (Chan, Golub &amp; LeVeque 1979). Modifies this object only; {@code other}
     * may be this object.
     *
     * @throws IllegalArgumentException if the widths differ or the result would overflow; the state is then
     *     unchanged
     */
    public void merge(Moments other) {
        if (other == null) {
            throw new IllegalArgumentException("other is null");
        }
        if (other.d != d) {
            throw new IllegalArgumentException("other has width " + other.d + ", expected width " + d);
        }
        mergeStats(other.count, other.totalWeight, other.sumSquaredWeights, other.mean, other.meanLow,
                other.comoment, null, other.minTime, other.maxTime, 1.0);
    }

    /** An independent deep copy (workspaces are not shared). */
    public Moments copy() {
        Moments c = new Moments(d);
        c.copyFrom(this);
        c.threads = threads;
        return c;
    }

    /**
     * Multiplies W and C by {@code factor} and Σ w² by factor², leaving μ unchanged: every record's weight
     * is multiplied by {@code factor}. If the weight or Σ w² underflows to zero the state becomes empty in
     * weight (count and event-time range are kept).
     *
     * @throws IllegalArgumentException if factor is negative or not finite, or the result would overflow
     */
    public void scale(double factor) {
        if (!(factor >= 0.0 && Double.isFinite(factor))) {
            throw new IllegalArgumentException("factor must be finite and >= 0, was " + factor);
        }
        if (factor == 1.0 || totalWeight == 0.0) {
            return;
        }
        double newWeight = totalWeight * factor;
        double newSquares = sumSquaredWeights * factor * factor;
        if (newWeight == 0.0 || newSquares == 0.0) {
            clearWeights();
            return;
        }
        if (!Double.isFinite(newWeight) || !Double.isFinite(newSquares)) {
            throw new IllegalArgumentException("scaling by " + factor + " overflows the total weight");
        }
        for (int i = 0; i < d; i++) {
            if (!Double.isFinite(comoment[i * d + i] * factor)) {
                throw new IllegalArgumentException("scaling by " + factor + " overflows column " + i);
            }
        }
        for (int i = 0; i < d; i++) {
            int row = i * d;
            for (int j = i; j < d; j++) {
                comoment[row + j] *= factor;
            }
        }
        totalWeight = newWeight;
        sumSquaredWeights = newSquares;
    }

    /** Number of records merged so far (including records whose weight has decayed to zero). */
    public long count() {
        return count;
    }

    /** Total weight W = Σ w. */
    public double totalWeight() {
        return totalWeight;
    }

    /** Σ w². */
    public double sumSquaredWeights() {
        return sumSquaredWeights;
    }

    /** Kish's effective sample size W² / Σ w², or 0 when W = 0. */
    public double effectiveSize() {
        return totalWeight == 0.0 ? 0.0 : totalWeight / sumSquaredWeights * totalWeight;
    }

    /** Weighted mean μ_hi of column {@code i} (0 when W = 0). */
    public double mean(int i) {
        checkIndex(i, "i");
        return mean[i];
    }

    /** A copy of the mean vector (μ_hi). */
    public double[] means() {
        return mean.clone();
    }

    /** C_ij = Σ w (z_i − μ_i)(z_j − μ_j). */
    public double comoment(int i, int j) {
        checkIndex(i, "i");
        checkIndex(j, "j");
        return i <= j ? comoment[i * d + j] : comoment[j * d + i];
    }

    /** A copy of C, row-major d × d, exactly symmetric. */
    public double[] comomentMatrix() {
        double[] c = comoment.clone();
        mirror(c, d);
        return c;
    }

    /** Smallest event time merged, or {@link Long#MAX_VALUE} when no record has been merged. */
    public long minEventTimeMs() {
        return minTime;
    }

    /** Largest event time merged, or {@link Long#MIN_VALUE} when no record has been merged. */
    public long maxEventTimeMs() {
        return maxTime;
    }

    /** Length of the canonical bytes of moments of width {@code width}. */
    static int byteLength(int width) {
        return HEADER_BYTES + 16 * width + 4 * width * (width + 1);
    }

    /** The canonical bytes described in the class comment; equal states give equal bytes. */
    public byte[] toBytes() {
        ByteBuffer buf = ByteBuffer.allocate(byteLength(d));
        write(buf);
        return buf.array();
    }

    /** Writes the canonical bytes into {@code buf} at its position, advancing it. */
    void write(ByteBuffer buf) {
        buf.put(FORMAT_VERSION).putInt(d).putLong(count)
                .putDouble(positiveZero(totalWeight)).putDouble(positiveZero(sumSquaredWeights))
                .putLong(minTime).putLong(maxTime);
        for (int i = 0; i < d; i++) {
            buf.putDouble(positiveZero(mean[i]));
        }
        for (int i = 0; i < d; i++) {
            buf.putDouble(positiveZero(meanLow[i]));
        }
        for (int i = 0; i < d; i++) {
            for (int j = i; j < d; j++) {
                buf.putDouble(positiveZero(comoment[i * d + j]));
            }
        }
    }

    /**
     * Reads canonical bytes written by {@link #toBytes()}.
     *
     * @throws IllegalArgumentException if the bytes are null, of the wrong length or version, hold a
     *     non-finite or negative-zero value, or describe an impossible state (negative weight or diagonal,
     *     weight without records, means or co-moments without weight, an inverted time range)
     */
    public static Moments fromBytes(byte[] bytes) {
        if (bytes == null) {
            throw new IllegalArgumentException("bytes is null");
        }
        if (bytes.length < 5) {
            throw new IllegalArgumentException("bytes has length " + bytes.length + ", too short for a header");
        }
        ByteBuffer buf = ByteBuffer.wrap(bytes);
        Moments m = read(buf);
        if (buf.hasRemaining()) {
            throw new IllegalArgumentException("bytes has " + buf.remaining() + " trailing bytes");
        }
        return m;
    }

    /** Reads one canonical encoding from {@code buf} at its position, advancing it. */
    static Moments read(ByteBuffer buf) {
        try {
            return readUnchecked(buf);
        } catch (BufferUnderflowException e) {
            throw new IllegalArgumentException("moments bytes are truncated", e);
        }
    }

    private static Moments readUnchecked(ByteBuffer buf) {
        byte version = buf.get();
        if (version != FORMAT_VERSION) {
            throw new IllegalArgumentException("unsupported moments format version " + version);
        }
        int width = buf.getInt();
        if (width < 1 || width > MAX_WIDTH) {
            throw new IllegalArgumentException("width must be in [1, " + MAX_WIDTH + "], was " + width);
        }
        if (buf.remaining() < byteLength(width) - 5) {
            throw new IllegalArgumentException("moments bytes are truncated: width " + width + " needs "
                    + byteLength(width) + " bytes");
        }
        Moments m = new Moments(width);
        m.count = buf.getLong();
        m.totalWeight = readValue(buf, "totalWeight");
        m.sumSquaredWeights = readValue(buf, "sumSquaredWeights");
        m.minTime = buf.getLong();
        m.maxTime = buf.getLong();
        for (int i = 0; i < width; i++) {
            m.mean[i] = readValue(buf, "mean");
        }
        for (int i = 0; i < width; i++) {
            m.meanLow[i] = readValue(buf, "meanLow");
            if (m.mean[i] + m.meanLow[i] != m.mean[i]) {
                throw new IllegalArgumentException("meanLow " + i + " is not below half a unit in the last place of mean: "
                        + m.meanLow[i]);
            }
        }
        for (int i = 0; i < width; i++) {
            for (int j = i; j < width; j++) {
                m.comoment[i * width + j] = readValue(buf, "comoment");
            }
        }
        m.checkConsistent();
        return m;
    }

    private static double readValue(ByteBuffer buf, String field) {
        double v = buf.getDouble();
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(field + " has non-finite value " + v);
        }
        if (Double.doubleToRawLongBits(v) == Long.MIN_VALUE) {
            throw new IllegalArgumentException(field + " has a non-canonical negative zero");
        }
        return v;
    }

    private void checkConsistent() {
        if (count < 0) {
            throw new IllegalArgumentException("count must be >= 0, was " + count);
        }
        if (totalWeight < 0.0 || sumSquaredWeights < 0.0) {
            throw new IllegalArgumentException("totalWeight and sumSquaredWeights must be >= 0, were "
                    + totalWeight + " and " + sumSquaredWeights);
        }
        if ((totalWeight == 0.0) != (sumSquaredWeights == 0.0)) {
            throw new IllegalArgumentException("totalWeight " + totalWeight + " and sumSquaredWeights "
                    + sumSquaredWeights + " must be zero together");
        }
        if (count == 0 && (totalWeight != 0.0 || minTime != Long.MAX_VALUE || maxTime != Long.MIN_VALUE)) {
            throw new IllegalArgumentException("empty moments must have zero weight and an empty time range");
        }
        if (count > 0 && minTime > maxTime) {
            throw new IllegalArgumentException("minEventTimeMs " + minTime + " exceeds maxEventTimeMs " + maxTime);
        }
        for (int i = 0; i < d; i++) {
            if (comoment[i * d + i] < 0.0) {
                throw new IllegalArgumentException("comoment diagonal " + i + " is negative: " + comoment[i * d + i]);
            }
        }
        if (totalWeight == 0.0) {
            for (int i = 0; i < d; i++) {
                if (mean[i] != 0.0 || meanLow[i] != 0.0) {
                    throw new IllegalArgumentException("moments without weight must have zero means");
                }
            }
            for (double v : comoment) {
                if (v != 0.0) {
                    throw new IllegalArgumentException("moments without weight must have zero co-moments");
                }
            }
        }
    }

    /** Lowercase hexadecimal SHA-256 of {@link #toBytes()}. */
    public String fingerprint() {
        return Sha256.hex(toBytes());
    }

    @Override
    public boolean equals(Object o) {
        return this == o || (o instanceof Moments && Arrays.equals(toBytes(), ((Moments) o).toBytes()));
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(toBytes());
    }

    @Override
    public String toString() {
        return "Moments[width=" + d + ", count=" + count + ", totalWeight=" + totalWeight + "]";
    }

    /** Makes this an exact copy of {@code other}'s state (same width). */
    void copyFrom(Moments other) {
        count = other.count;
        totalWeight = other.totalWeight;
        sumSquaredWeights = other.sumSquaredWeights;
        System.arraycopy(other.mean, 0, mean, 0, d);
        System.arraycopy(other.meanLow, 0, meanLow, 0, d);
        System.arraycopy(other.comoment, 0, comoment, 0, comoment.length);
        minTime = other.minTime;
        maxTime = other.maxTime;
    }

    /** Returns this to the state of a new instance. */
    void reset() {
        clearWeights();
        count = 0;
        minTime = Long.MAX_VALUE;
        maxTime = Long.MIN_VALUE;
    }

    /**
     * Scales the current state's weights by {@code stateFactor} (as {@link #scale(double)}), then merges the
     * block of rows {@code base..base+n-1} (n &gt;= 1) with the weights and event times at the same indices, all
     * atomically. Weights must be finite and &gt;= 0 (a row whose weight has decayed to zero is counted but
     * carries no weight); the caller has validated the values. Used directly by {@link MomentStream};
     * {@code rows} null means the row-major {@code blockFlat} set by {@link #addBlock} (then base is 0).
     * Reads the arrays, modifies this object only.
     */
    void mergeBlock(double[][] rows, int base, double[] weights, long[] eventTimesMs, int n, double stateFactor) {
        BlockWork w = work(0);
        w.rows = rows;
        w.base = base;
        try {
            summarize(w, weights, eventTimesMs, n, true);
            mergeSummary(w, stateFactor);
        } finally {
            w.rows = null;
        }
    }

    /**
     * Blocks that {@link MomentStream} should gather before merging them with {@link #mergeBlocks}, so that
     * their summaries are computed on several threads at once: 1 (merge each block as it completes) unless
     * this may use two or more threads, the width is in [{@value #GROUP_MIN_WIDTH}, {@value #SERIAL_MAX_WIDTH}]
     * (wider blocks split their own rank-k update between threads instead) and a block of {@code blockSize}
     * rows is worth a thread.
     */
    int blockGroup(int blockSize) {
        if (threads < 2 || d < GROUP_MIN_WIDTH || d > SERIAL_MAX_WIDTH
                || (long) blockSize * d * d / 2 < GROUP_MIN_WORK) {
            return 1;
        }
        return Math.min(threads, MAX_GROUP);
    }

    /**
     * True when merging blocks whose values and weights are all at most {@link #GROUP_SAFE_ABS} in magnitude
     * (at most {@value #MAX_GROUP} blocks of at most 2^20 rows) cannot overflow: W &lt;= 1e100, |μ_i| &lt;= 1e100
     * and C_ii &lt;= 1e200. Then a block W_b &lt;= 2^20·1e60, C_b,ii &lt;= W_b (2·1e60)², and each merge adds at most
     * C_b,ii + min(W_a, W_b)·δ_i² &lt;= 1e187 + 1e67·(2e100)², far below the largest double.
     */
    boolean farFromOverflow() {
        if (!(totalWeight <= 1e100)) {
            return false;
        }
        for (int i = 0; i < d; i++) {
            if (!(Math.abs(mean[i]) <= 1e100 && comoment[i * d + i] <= 1e200)) {
                return false;
            }
        }
        return true;
    }

    /**
     * Merges {@code blocks} consecutive blocks of {@code size} rows each (block b is rows b·size..(b+1)·size−1
     * of {@code rows}, with the weights and event times at the same indices) in order, block b after scaling
     * the state by {@code stateFactors[b]}: the same bits as {@code blocks} calls of {@link #mergeBlock}, but
     * the blocks' own means and co-moments (which depend on each block's rows alone) are computed first, on
     * up to {@code blocks} threads. Reads the arrays, modifies this object only.
     *
     * @return the blocks merged, {@code blocks} unless a merge failed
     * @throws MergeStopped if merging block b would overflow: blocks 0..b−1 are merged, the state is otherwise
     *     unchanged, and {@link MergeStopped#merged} is b
     */
    int mergeBlocks(double[][] rows, double[] weights, long[] eventTimesMs, int size, int blocks,
            double[] stateFactors) {
        for (int b = 0; b < blocks; b++) {
            BlockWork w = work(b);
            w.rows = rows;
            w.base = b * size;
        }
        try {
            group.weights = weights;
            group.times = eventTimesMs;
            group.size = size;
            if (blocks > 1 && threads > 1) {
                Crew.shared(Math.min(threads, blocks)).run(group, blocks);
            } else {
                for (int b = 0; b < blocks; b++) {
                    group.runPart(b, 0);
                }
            }
            for (int b = 0; b < blocks; b++) {
                try {
                    mergeSummary(works[b], stateFactors[b]);
                } catch (IllegalArgumentException e) {
                    throw new MergeStopped(b, e);
                }
            }
            return blocks;
        } finally {
            group.weights = null;
            group.times = null;
            for (int b = 0; b < blocks; b++) {
                works[b].rows = null;
            }
        }
    }

    /** A merge of {@link #mergeBlocks} that failed after merging {@link #merged} blocks; the cause's message. */
    static final class MergeStopped extends IllegalArgumentException {
        private static final long serialVersionUID = 1L;
        /** Blocks merged before the one that failed. */
        final int merged;

        MergeStopped(int merged, IllegalArgumentException cause) {
            super(cause.getMessage(), cause);
            this.merged = merged;
        }
    }

    /** Part b of a {@link #mergeBlocks} call: the summary of block b, in workspace b, on one thread. */
    private final class GroupJob implements Crew.Job {
        double[] weights;
        long[] times;
        int size;

        @Override
        public void runPart(int part, int slot) {
            summarize(works[part], weights, times, size, false);
        }
    }

    /**
     * The workspace of one block's summary: where its rows are, its weight, Σ w², event-time range, its mean
     * as a TwoSum pair, the centered panel and the upper triangle of its co-moment.
     */
    private static final class BlockWork {
        double[][] rows;
        int base;
        int n;
        double weight;
        double squares;
        long min;
        long max;
        final double[] mean;
        final double[] meanLow;
        final double[] sums;
        /** Centered rows, as many as the largest panel so far needed. */
        double[][] panel = new double[0][];
        final double[][] comoment;

        BlockWork(int d) {
            mean = new double[d];
            meanLow = new double[d];
            sums = new double[d];
            comoment = new double[d][d];
        }
    }

    /** Workspace {@code b}, allocated on first use. */
    private BlockWork work(int b) {
        if (works == null || works.length <= b) {
            works = works == null ? new BlockWork[b + 1] : Arrays.copyOf(works, b + 1);
        }
        if (works[b] == null) {
            works[b] = new BlockWork(d);
        }
        return works[b];
    }

    /**
     * Row r of the block in {@code w}: the caller's array, or a copy in {@code rowCopy} (valid until the next
     * call; only for workspace 0 on the calling thread), so that the loops over a row index every array alike
     * and compile to SIMD instructions.
     */
    private double[] blockRow(BlockWork w, int r) {
        if (w.rows != null) {
            return w.rows[w.base + r];
        }
        System.arraycopy(blockFlat, r * d, rowCopy, 0, d);
        return rowCopy;
    }

    /**
     * Fills {@code w} with the summary of its block of n rows: weight, Σ w², event-time range, mean and
     * co-moment (zero weight when the rows carry none). Threads are used for a wide block only if
     * {@code mayThread}. Reads the rows and the weights and times at indices w.base.., writes {@code w} only.
     */
    private void summarize(BlockWork w, double[] weights, long[] eventTimesMs, int n, boolean mayThread) {
        int base = w.base;
        double blockWeight = 0.0;
        double blockSquares = 0.0;
        long blockMin = Long.MAX_VALUE;
        long blockMax = Long.MIN_VALUE;
        for (int r = base; r < base + n; r++) {
            blockWeight += weights[r];
            blockSquares += weights[r] * weights[r];
            blockMin = Math.min(blockMin, eventTimesMs[r]);
            blockMax = Math.max(blockMax, eventTimesMs[r]);
        }
        Arrays.fill(w.mean, 0.0);
        Arrays.fill(w.meanLow, 0.0);
        int panelNeeded = Math.min(n, panelRows);
        if (w.panel.length < panelNeeded) {
            w.panel = new double[panelNeeded][d];
        }
        if (blockWeight > 0.0 && blockSquares > 0.0) {
            blockMoments(w, weights, n, blockWeight, mayThread);
        } else {
            blockWeight = 0.0;
            blockSquares = 0.0;
        }
        w.n = n;
        w.weight = blockWeight;
        w.squares = blockSquares;
        w.min = blockMin;
        w.max = blockMax;
    }

    /** Merges the summary in {@code w} after scaling the state by {@code stateFactor}. */
    private void mergeSummary(BlockWork w, double stateFactor) {
        mergeStats(w.n, w.weight, w.squares, w.mean, w.meanLow, null, w.comoment, w.min, w.max, stateFactor);
    }

    /**
     * Fills w.mean + w.meanLow with the corrected two-pass mean m + Σ w (z − m) / W (Chan, Golub &amp;
     * LeVeque 1983) as a TwoSum pair, and the upper triangle of w.comoment with the centered co-moment,
     * accumulated over panels of at most {@code panelRows} rows (the split does not change the result). Without
     * {@code mayThread} everything runs on the calling thread and touches {@code w} alone (not {@link #job}),
     * so summaries of different workspaces may run at once.
     */
    private void blockMoments(BlockWork w, double[] weights, int n, double blockWeight, boolean mayThread) {
        if (!mayThread) {
            meanColumns(w, weights, n, blockWeight, 0, d);
            for (int start = 0; start < n; start += panelRows) {
                int k = Math.min(panelRows, n - start);
                centerPanel(w, weights, start, 0, k);
                updateRows(w, k, start == 0, 0, d);
            }
            return;
        }
        boolean split = mayThread && threads > 1 && d > SERIAL_MAX_WIDTH && w.rows != null
                && (long) n * d >= SERIAL_MAX_PASS;
        job.work = w;
        job.weights = weights;
        job.n = n;
        job.blockWeight = blockWeight;
        try {
            runPasses(split, BlockJob.MEAN);
            for (int start = 0; start < n; start += panelRows) {
                job.start = start;
                job.k = Math.min(panelRows, n - start);
                runPasses(split, BlockJob.CENTER);
                updatePanel(w, job.k, start == 0, mayThread);
            }
        } finally {
            job.weights = null;
            job.work = null;
        }
    }

    /** Runs one pass of {@link #job} over the block: in parts on the crew if {@code split}, else whole. */
    private void runPasses(boolean split, int phase) {
        job.phase = phase;
        if (split) {
            Crew.shared(threads).run(job, threads * PASS_PARTS_PER_THREAD);
        } else {
            job.pass(0, 1);
        }
    }

    /**
     * Columns from..to−1 of the corrected two-pass mean: m = Σ w z / W, then m + Σ w (z − m) / W as the TwoSum
     * pair w.mean + w.meanLow (w.sums holds the correction sums). Each column depends on itself alone.
     */
    private void meanColumns(BlockWork w, double[] weights, int n, double blockWeight, int from, int to) {
        double[] m = w.mean;
        double[] sum = w.sums;
        int base = w.base;
        for (int r = 0; r < n; r++) {
            double wr = weights[base + r];
            double[] z = blockRow(w, r);
            for (int c = from; c < to; c++) {
                m[c] += wr * z[c];
            }
        }
        for (int c = from; c < to; c++) {
            m[c] /= blockWeight;
            sum[c] = 0.0;
        }
        for (int r = 0; r < n; r++) {
            double wr = weights[base + r];
            double[] z = blockRow(w, r);
            for (int c = from; c < to; c++) {
                sum[c] += wr * (z[c] - m[c]);
            }
        }
        double[] low = w.meanLow;
        for (int c = from; c < to; c++) {
            double correction = sum[c] / blockWeight;
            double hi = m[c] + correction;
            low[c] = twoSumError(m[c], correction, hi);
            m[c] = hi;
        }
    }

    /**
     * w.comoment += panelᵀ panel for the first k panel rows (after zeroing it if {@code clear}), on several
     * threads if {@code mayThread} and the panel is wide and large enough.
     */
    private void updatePanel(BlockWork w, int k, boolean clear, boolean mayThread) {
        if (!mayThread || threads == 1 || d <= SERIAL_MAX_WIDTH || (long) d * d * k / 2 < SERIAL_MAX_WORK) {
            updateRows(w, k, clear, 0, d);
            return;
        }
        job.phase = BlockJob.UPDATE;
        job.k = k;
        job.clear = clear;
        runParts();
    }

    private void updateRows(BlockWork w, int k, boolean clear, int from, int to) {
        if (clear) {
            for (int i = from; i < to; i++) {
                Arrays.fill(w.comoment[i], RankUpdate.firstColumn(i), d, 0.0);
            }
        }
        RankUpdate.addUpper(w.panel, k, d, w.comoment, from, to);
    }

    /** Runs {@link #job} on the shared crew, one part per range of rows of C. */
    private void runParts() {
        int parts = Math.min(PARTS_PER_THREAD * threads, d / 8);
        if (rowBounds == null) {
            rowBounds = new int[parts + 1];
            RankUpdate.splitRows(d, parts, rowBounds);
        }
        Crew.shared(threads).run(job, parts);
    }

    /**
     * One step of a block, whole or in parts: the mean (both passes) by ranges of columns, the centering by
     * ranges of panel rows, the panel update and the merge by ranges of rows of C ({@code rowBounds}). Each
     * value is computed the same way whatever part it falls in, so the split never changes a bit.
     */
    private final class BlockJob implements Crew.Job {
        static final int MEAN = 0;
        static final int CENTER = 1;
        static final int UPDATE = 2;
        static final int MERGE = 3;
        int phase;
        BlockWork work;
        double[] weights;
        int n;
        double blockWeight;
        int start;
        int k;
        boolean clear;
        double stateFactor;
        double weightProduct;
        double[] flat;
        double[][] rows;

        @Override
        public void runPart(int part, int slot) {
            if (phase == UPDATE) {
                updateRows(work, k, clear, rowBounds[part], rowBounds[part + 1]);
            } else if (phase == MERGE) {
                mergeRowRange(stateFactor, weightProduct, flat, rows, rowBounds[part], rowBounds[part + 1], slot);
            } else {
                pass(part, threads * PASS_PARTS_PER_THREAD);
            }
        }

        /** Part {@code part} of {@code parts} equal ranges of a mean or centering pass. */
        void pass(int part, int parts) {
            if (phase == CENTER) {
                centerPanel(work, weights, start, k * part / parts, k * (part + 1) / parts);
                return;
            }
            int from = (int) ((long) d * part / parts);
            meanColumns(work, weights, n, blockWeight, from, (int) ((long) d * (part + 1) / parts));
        }
    }

    /** Writes √w_r ((z_rc − μ_hi,c) − μ_lo,c) for block rows start + r into panel rows r = from..to−1. */
    private void centerPanel(BlockWork w, double[] weights, int start, int from, int to) {
        double[] m = w.mean;
        double[] lo = w.meanLow;
        int base = w.base;
        for (int r = from; r < to; r++) {
            double s = Math.sqrt(weights[base + start + r]);
            double[] z = blockRow(w, start + r);
            double[] x = w.panel[r];
            for (int c = 0; c < d; c++) {
                x[c] = s * ((z[c] - m[c]) - lo[c]);
            }
        }
    }

    /**
     * Merges summary statistics B into this after scaling this state's weights by {@code stateFactor}.
     * Checks finiteness of the result before writing anything. The arrays of B may alias this object's own.
     * C_b is either the row-major {@code cb} or the rows {@code cbRows} (the other is null); only its upper
     * triangle is read.
     */
    private void mergeStats(long n, double wb, double s2b, double[] mub, double[] mubLow, double[] cb,
            double[][] cbRows, long minB, long maxB, double stateFactor) {
        double wa = totalWeight * stateFactor;
        double s2a = sumSquaredWeights * stateFactor * stateFactor;
        boolean aEmpty = wa == 0.0 || s2a == 0.0;
        if (wb == 0.0) {
            if (aEmpty) {
                clearWeights();
            } else if (stateFactor != 1.0) {
                scale(stateFactor);
            }
        } else if (aEmpty) {
            requireFiniteSummary(wb, s2b, mub, cb, cbRows);
            System.arraycopy(mub, 0, mean, 0, d);
            System.arraycopy(mubLow, 0, meanLow, 0, d);
            if (cbRows == null) {
                System.arraycopy(cb, 0, comoment, 0, comoment.length);
            } else {
                for (int i = 0; i < d; i++) {
                    System.arraycopy(cbRows[i], i, comoment, i * d + i, d - i);
                }
            }
            totalWeight = wb;
            sumSquaredWeights = s2b;
        } else {
            mergeWeighted(wa, s2a, wb, s2b, mub, mubLow, cb, cbRows, stateFactor);
        }
        count += n;
        minTime = Math.min(minTime, minB);
        maxTime = Math.max(maxTime, maxB);
    }

    private void mergeWeighted(double wa, double s2a, double wb, double s2b, double[] mub, double[] mubLow,
            double[] cb, double[][] cbRows, double stateFactor) {
        double newWeight = wa + wb;
        double newSquares = s2a + s2b;
        double ratio = wb / newWeight;
        double k = wa * ratio;
        for (int i = 0; i < d; i++) {
            delta[i] = (mub[i] - mean[i]) + (mubLow[i] - meanLow[i]);
        }
        for (int i = 0; i < d; i++) {
            if (!Double.isFinite(stateFactor * comoment[i * d + i] + entry(cb, cbRows, i, i))) {
                throw new IllegalArgumentException("merge overflows the co-moment of column " + i);
            }
        }
        requireFiniteUpdate(newWeight, newSquares, stateFactor, ratio, k, "merge");
        moveMean(ratio);
        boolean split = threads > 1 && d > SERIAL_MAX_WIDTH && (long) d * (d + 1) / 2 >= SERIAL_MAX_MERGE;
        ensureMergeRows(split ? threads : 1);
        if (!split) {
            mergeRowRange(stateFactor, k, cb, cbRows, 0, d, 0);
        } else {
            job.phase = BlockJob.MERGE;
            job.stateFactor = stateFactor;
            job.weightProduct = k;
            job.flat = cb;
            job.rows = cbRows;
            try {
                runParts();
            } finally {
                job.flat = null;
                job.rows = null;
            }
        }
        totalWeight = newWeight;
        sumSquaredWeights = newSquares;
    }

    /** Allocates the merge workspace rows of thread slots 0..slots−1 (on the calling thread, before a split). */
    private void ensureMergeRows(int slots) {
        if (mergeRows == null) {
            mergeRows = new double[2 * threads][];
        }
        for (int r = 0; r < 2 * slots; r++) {
            if (mergeRows[r] == null) {
                mergeRows[r] = new double[d];
            }
        }
    }

    /**
     * C_ij ← f·C_ij + B_ij + k·δ_i·δ_j for rows i in from..to−1, j &gt;= i (δ in {@code delta}; B row-major
     * in {@code cb} or as rows {@code cbRows}). Each row goes through the workspace rows of {@code slot}, so
     * that the loop indexes every array alike and compiles to SIMD instructions; the arithmetic per entry is
     * the formula as written. Rows of B may alias rows of C: each row is read in full before it is written.
     */
    private void mergeRowRange(double f, double k, double[] cb, double[][] cbRows, int from, int to, int slot) {
        double[] c = mergeRows[2 * slot];
        double[] dv = delta;
        for (int i = from; i < to; i++) {
            int row = i * d;
            int len = d - i;
            double[] b = cbRows == null ? mergeRows[2 * slot + 1] : cbRows[i];
            if (cbRows == null) {
                System.arraycopy(cb, row + i, b, i, len);
            }
            System.arraycopy(comoment, row + i, c, i, len);
            double kd = k * dv[i];
            for (int j = i; j < d; j++) {
                c[j] = f * c[j] + b[j] + kd * dv[j];
            }
            System.arraycopy(c, i, comoment, row + i, len);
        }
    }

    /**
     * Throws unless the prospective weights, means μ + ratio·δ and diagonal f·C_ii + k·δ_i² are finite
     * (δ in {@code delta}). Off-diagonal entries are bounded by the diagonal (C is positive semi-definite).
     */
    private void requireFiniteUpdate(double newWeight, double newSquares, double stateFactor, double ratio,
            double k, String what) {
        if (!Double.isFinite(newWeight) || !Double.isFinite(newSquares)) {
            throw new IllegalArgumentException(what + " overflows the total weight");
        }
        for (int i = 0; i < d; i++) {
            double di = delta[i];
            if (!Double.isFinite(di) || !Double.isFinite(mean[i] + ratio * di)
                    || !Double.isFinite(stateFactor * comoment[i * d + i] + k * di * di)) {
                throw new IllegalArgumentException(what + " overflows the moments of column " + i);
            }
        }
    }

    /** μ ← μ + ratio·δ (δ in {@code delta}), keeping μ_hi + μ_lo an exact TwoSum pair. */
    private void moveMean(double ratio) {
        for (int i = 0; i < d; i++) {
            double step = meanLow[i] + ratio * delta[i];
            double hi = mean[i] + step;
            meanLow[i] = twoSumError(mean[i], step, hi);
            mean[i] = hi;
        }
    }

    /** The rounding error a + b − s of s = fl(a + b), exactly (Møller 1965). */
    private static double twoSumError(double a, double b, double s) {
        double bVirtual = s - a;
        double aVirtual = s - bVirtual;
        return (a - aVirtual) + (b - bVirtual);
    }

    /** Entry (i, j) of C_b held row-major in {@code flat} or as rows {@code rows} (the other is null). */
    private double entry(double[] flat, double[][] rows, int i, int j) {
        return rows == null ? flat[i * d + j] : rows[i][j];
    }

    private void requireFiniteSummary(double w, double s2, double[] mu, double[] c, double[][] cRows) {
        if (!Double.isFinite(w) || !Double.isFinite(s2)) {
            throw new IllegalArgumentException("merge overflows the total weight");
        }
        for (int i = 0; i < d; i++) {
            if (!Double.isFinite(mu[i]) || !Double.isFinite(entry(c, cRows, i, i))) {
                throw new IllegalArgumentException("merge overflows the moments of column " + i);
            }
        }
    }

    private void clearWeights() {
        totalWeight = 0.0;
        sumSquaredWeights = 0.0;
        Arrays.fill(mean, 0.0);
        Arrays.fill(meanLow, 0.0);
        Arrays.fill(comoment, 0.0);
    }

    private void checkIndex(int i, String name) {
        if (i < 0 || i >= d) {
            throw new IllegalArgumentException(name + " must be in [0, " + d + "), was " + i);
        }
    }

    /** Copies the upper triangle of the d × d row-major matrix {@code m} onto its lower triangle. */
    private static void mirror(double[] m, int d) {
        for (int i = 1; i < d; i++) {
            int row = i * d;
            for (int j = 0; j < i; j++) {
                m[row + j] = m[j * d + i];
            }
        }
    }

    private static double positiveZero(double v) {
        return v == 0.0 ? 0.0 : v;
    }
}
