package lariat.moments;

import java.nio.ByteBuffer;
import java.util.Arrays;

/**
 * One key's (or one fold's) moments accumulator of a chosen kind, behind one small surface, so that the
 * main moments and the fold moments of a key follow the same forgetting, blocking and windowing:
 * <ul>
 *   <li>{@link #plain}: {@link Moments} updated record by record (West 1979), no forgetting;</li>
 *   <li>{@link #stream}: a {@link MomentStream} (blocks aligned to the record count, event-time
 *       forgetting with a half-life);</li>
 *   <li>{@link #window}: a {@link PaneWindow} (sliding event-time window of panes).</li>
 * </ul>
 *
 * <p>Alignment ({@link #momentsAsOf}): accumulators that each saw part of one ordered record sequence (the
 * folds of a key) are compared at one common event time T, the largest event time of the whole sequence.
 * A stream whose own largest event time is t_s &lt;= T is scaled by 2^(−(T − t_s)/h) (W and C by the
 * factor, Σ w² by its square; μ unchanged), so every record carries weight w · 2^(−(T − t)/h); a window
 * keeps only its panes inside the window ending at the pane of T. The merge of the aligned parts then
 * equals, up to rounding, the accumulator that saw the whole sequence.
 *
 * <p>Canonical bytes ({@link #toBytes()}): format version (1 byte, {@value #FORMAT_VERSION}), kind
 * (1 byte: 'P', 'S' or 'W'), then the kind's own canonical bytes ({@link Moments#toBytes()},
 * {@link MomentStream#toBytes()}, {@link PaneWindow#toBytes()}). Mutable, not thread-safe.
 */
public final class Accumulator {

    /** Format version written as the first byte of {@link #toBytes()}. */
    public static final byte FORMAT_VERSION = 1;

    private static final byte PLAIN = 'P';
    private static final byte STREAM = 'S';
    private static final byte WINDOW = 'W';

    private final Moments plain;
    private final MomentStream stream;
    private final PaneWindow window;

    private Accumulator(Moments plain, MomentStream stream, PaneWindow window) {
        this.plain = plain;
        this.stream = stream;
        this.window = window;
    }

    /** An empty plain accumulator of width {@code width} (record-by-record moments, no forgetting). */
    public static Accumulator plain(int width) {
        return new Accumulator(new Moments(width), null, null);
    }

    /** A plain accumulator holding a copy of {@code moments}, e.g. restored from older bytes. */
    public static Accumulator plainOf(Moments moments) {
        if (moments == null) {
            throw new IllegalArgumentException("moments is null");
        }
        return new Accumulator(moments.copy(), null, null);
    }

    /** An empty stream; arguments as in {@link MomentStream#MomentStream(int, int, double)}. */
    public static Accumulator stream(int width, int blockSize, double halfLifeMs) {
        return new Accumulator(null, new MomentStream(width, blockSize, halfLifeMs), null);
    }

    /** An accumulator around {@code stream} (not copied; the accumulator owns it from now on). */
    public static Accumulator ofStream(MomentStream stream) {
        if (stream == null) {
            throw new IllegalArgumentException("stream is null");
        }
        return new Accumulator(null, stream, null);
    }

    /** An empty window; arguments as in {@link PaneWindow#PaneWindow(int, long, int)}. */
    public static Accumulator window(int width, long paneMs, int panes) {
        return new Accumulator(null, null, new PaneWindow(width, paneMs, panes));
    }

    /** An empty accumulator of the same kind and parameters. */
    public Accumulator emptyLike() {
        if (stream != null) {
            return stream(stream.width(), stream.blockSize(), stream.halfLifeMs());
        }
        if (window != null) {
            return window(window.width(), window.paneMs(), window.panes());
        }
        return plain(plain.width());
    }

    /** Whether this is a sliding window. */
    public boolean isWindow() {
        return window != null;
    }

    /** Whether {@link #add} would accept a record at this event time (false only for a window's too-old record). */
    public boolean accepts(long eventTimeMs) {
        return window == null || window.accepts(eventTimeMs);
    }

    /**
     * Adds one record.
     *
     * @return false when a window refused the record as older than the window (nothing changed)
     * @throws IllegalArgumentException on a bad row or weight (see {@link Moments#add}); nothing changes then
     */
    public boolean add(double[] z, double weight, long eventTimeMs) {
        if (window != null) {
            return window.add(z, weight, eventTimeMs);
        }
        if (stream != null) {
            stream.add(z, weight, eventTimeMs);
        } else {
            plain.add(z, weight, eventTimeMs);
        }
        return true;
    }

    /** New moments of everything accumulated (a stream's snapshot, a window's merged panes, a plain copy). */
    public Moments moments() {
        if (window != null) {
            return window.merged();
        }
        return stream != null ? stream.snapshot() : plain.copy();
    }

    /**
     * New moments aligned on event time {@code eventTimeMs}, normally the largest event time of the record
     * sequence this accumulator saw part of (formula in the class comment). A time before the accumulator's
     * own largest event time aligns nothing.
     */
    public Moments momentsAsOf(long eventTimeMs) {
        if (window != null) {
            return window.mergedAsOf(eventTimeMs);
        }
        Moments m = moments();
        if (stream != null && m.count() > 0 && eventTimeMs > m.maxEventTimeMs()
                && stream.halfLifeMs() != Double.POSITIVE_INFINITY) {
            m.scale(Decay.factor(eventTimeMs, m.maxEventTimeMs(), stream.halfLifeMs()));
        }
        return m;
    }

    /** Records held: accepted so far, or for a window those still inside it. */
    public long count() {
        if (window != null) {
            return window.count();
        }
        return stream != null ? stream.count() : plain.count();
    }

    /** Number of columns d. */
    public int width() {
        if (window != null) {
            return window.width();
        }
        return stream != null ? stream.width() : plain.width();
    }

    /** Canonical bytes (layout in the class comment). */
    public byte[] toBytes() {
        byte kind = window != null ? WINDOW : stream != null ? STREAM : PLAIN;
        byte[] body = window != null ? window.toBytes() : stream != null ? stream.toBytes() : plain.toBytes();
        return ByteBuffer.allocate(2 + body.length).put(FORMAT_VERSION).put(kind).put(body).array();
    }

    /**
     * Reads bytes written by {@link #toBytes()}.
     *
     * @throws IllegalArgumentException if the bytes are null, too short, of another version or kind, or the
     *     kind's own bytes are invalid
     */
    public static Accumulator fromBytes(byte[] b) {
        if (b == null || b.length < 2) {
            throw new IllegalArgumentException("accumulator bytes are null or shorter than 2 bytes");
        }
        if (b[0] != FORMAT_VERSION) {
            throw new IllegalArgumentException("unsupported accumulator format version " + b[0]);
        }
        byte[] body = Arrays.copyOfRange(b, 2, b.length);
        switch (b[1]) {
            case PLAIN:
                return new Accumulator(Moments.fromBytes(body), null, null);
            case STREAM:
                return new Accumulator(null, MomentStream.fromBytes(body), null);
            case WINDOW:
                return new Accumulator(null, null, PaneWindow.fromBytes(body));
            default:
                throw new IllegalArgumentException("unknown accumulator kind " + b[1]);
        }
    }

    @Override
    public String toString() {
        return "Accumulator[" + (window != null ? "window" : stream != null ? stream : "plain") + ", count="
                + count() + "]";
    }
}
