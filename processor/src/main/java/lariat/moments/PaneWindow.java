package lariat.moments;

import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;

/**
 * Sliding window of event time: a ring of pane moments merged on demand.
 *
 * <p>Event time t falls in pane ⌊t / paneMs⌋. The window holds the {@code panes} most recent panes, ending
 * at the pane of the largest event time accepted so far; a record whose pane lies before the window is
 * dropped ({@link #add} returns false), and panes that fall out of the window are cleared. Each pane accumulates its
 * records with West's (1979) one-record update; {@link #merged()} merges the live panes oldest first
 * (Chan, Golub &amp; LeVeque 1979), so the result is a deterministic function of the ordered records.
 *
 * <p>Canonical bytes ({@link #toBytes()}), big-endian: format version (1 byte, {@value #FORMAT_VERSION}),
 * width (int), pane length in ms (long), panes (int), started flag (byte), latest pane index (long), then
 * per ring slot: live flag (byte), pane index (long, 0 when not live), pane {@link Moments#toBytes()}
 * (empty when not live). Not thread-safe.
 */
public final class PaneWindow {

    /** Format version written as the first byte of {@link #toBytes()}. */
    public static final byte FORMAT_VERSION = 1;

    private static final int HEADER_BYTES = 1 + 4 + 8 + 4 + 1 + 8;
    private static final int SLOT_HEADER_BYTES = 1 + 8;

    private final int d;
    private final long paneMs;
    private final int panes;
    private final Moments[] ring;
    private final long[] paneIndex;
    private final boolean[] live;
    private Moments spare;
    private boolean started;
    private long latest;

    /**
     * Creates an empty window.
     *
     * @param width number of columns d
     * @param paneMs pane length in event-time milliseconds, &gt;= 1
     * @param panes number of panes in the window, &gt;= 1
     * @throws IllegalArgumentException on an invalid argument (the message names it)
     */
    public PaneWindow(int width, long paneMs, int panes) {
        this.spare = new Moments(width);
        if (paneMs < 1) {
            throw new IllegalArgumentException("paneMs must be >= 1, was " + paneMs);
        }
        if (panes < 1 || (long) panes * (SLOT_HEADER_BYTES + Moments.byteLength(width)) > Integer.MAX_VALUE - 64) {
            throw new IllegalArgumentException("panes must be >= 1 and small enough to serialize, was " + panes
                    + " for width " + width);
        }
        this.d = width;
        this.paneMs = paneMs;
        this.panes = panes;
        this.ring = new Moments[panes];
        for (int s = 0; s < panes; s++) {
            ring[s] = new Moments(width);
        }
        this.paneIndex = new long[panes];
        this.live = new boolean[panes];
    }

    /**
     * Adds one record to the pane of its event time.
     *
     * @return false if the pane lies before the window (the record is dropped and nothing changes)
     * @throws IllegalArgumentException on a null or wrong-width row, a non-finite value (the message names
     *     the column and value), a weight that is not finite and positive, or an overflowing update; nothing
     *     is modified then
     */
    public boolean add(double[] z, double weight, long eventTimeMs) {
        RowCheck.row(z, d);
        RowCheck.weight(weight);
        long index = Math.floorDiv(eventTimeMs, paneMs);
        if (started && index < latest && !inWindow(latest, index)) {
            return false;
        }
        int slot = (int) Math.floorMod(index, (long) panes);
        if (live[slot] && paneIndex[slot] == index) {
            ring[slot].add(z, weight, eventTimeMs);
            return true;
        }
        spare.reset();
        spare.add(z, weight, eventTimeMs);
        if (!started || index > latest) {
            advance(index);
        }
        Moments old = ring[slot];
        ring[slot] = spare;
        spare = old;
        live[slot] = true;
        paneIndex[slot] = index;
        return true;
    }

    /**
     * Whether {@link #add} would accept a record at this event time: its pane is not before the window.
     * Reads nothing but the window's position and modifies nothing.
     */
    public boolean accepts(long eventTimeMs) {
        long index = Math.floorDiv(eventTimeMs, paneMs);
        return !started || index >= latest || inWindow(latest, index);
    }

    /** New moments: the live panes merged oldest first. */
    public Moments merged() {
        return started ? mergedEndingAt(latest) : new Moments(d);
    }

    /**
     * New moments of the window as it will stand once event time reaches {@code eventTimeMs}: the live panes
     * inside the window ending at the later of the latest pane and the pane of {@code eventTimeMs}, merged
     * oldest first. Equals {@link #merged()} when that pane is not after the latest; modifies nothing. Used
     * to align several windows (one per cross-validation fold) on one common event time.
     */
    public Moments mergedAsOf(long eventTimeMs) {
        return started ? mergedEndingAt(Math.max(latest, Math.floorDiv(eventTimeMs, paneMs))) : new Moments(d);
    }

    private Moments mergedEndingAt(long newest) {
        Moments m = new Moments(d);
        for (int k = panes - 1; k >= 0; k--) {
            long index = newest - k;
            int slot = (int) Math.floorMod(index, (long) panes);
            if (live[slot] && paneIndex[slot] == index) {
                m.merge(ring[slot]);
            }
        }
        return m;
    }

    /** Records currently in the window (dropped and expired records are not counted). */
    public long count() {
        long n = 0;
        for (int s = 0; s < panes; s++) {
            if (live[s]) {
                n += ring[s].count();
            }
        }
        return n;
    }

    /** Number of columns d. */
    public int width() {
        return d;
    }

    /** Pane length in event-time milliseconds. */
    public long paneMs() {
        return paneMs;
    }

    /** Number of panes in the window. */
    public int panes() {
        return panes;
    }

    /** Canonical bytes (layout in the class comment). */
    public byte[] toBytes() {
        int length = HEADER_BYTES + panes * (SLOT_HEADER_BYTES + Moments.byteLength(d));
        ByteBuffer buf = ByteBuffer.allocate(length);
        buf.put(FORMAT_VERSION).putInt(d).putLong(paneMs).putInt(panes).put((byte) (started ? 1 : 0))
                .putLong(started ? latest : 0L);
        for (int s = 0; s < panes; s++) {
            buf.put((byte) (live[s] ? 1 : 0)).putLong(live[s] ? paneIndex[s] : 0L);
            ring[s].write(buf);
        }
        return buf.array();
    }

    /**
     * Reads bytes written by {@link #toBytes()}.
     *
     * @throws IllegalArgumentException if the bytes are null, truncated, of another version, carry trailing
     *     bytes, or describe an invalid window (bad parameters, a pane in the wrong slot or outside the
     *     window, records outside their pane, a non-live slot that is not empty)
     */
    public static PaneWindow fromBytes(byte[] b) {
        if (b == null) {
            throw new IllegalArgumentException("bytes is null");
        }
        ByteBuffer buf = ByteBuffer.wrap(b);
        try {
            PaneWindow w = readUnchecked(buf);
            if (buf.hasRemaining()) {
                throw new IllegalArgumentException("bytes has " + buf.remaining() + " trailing bytes");
            }
            return w;
        } catch (BufferUnderflowException e) {
            throw new IllegalArgumentException("window bytes are truncated", e);
        }
    }

    private static PaneWindow readUnchecked(ByteBuffer buf) {
        byte version = buf.get();
        if (version != FORMAT_VERSION) {
            throw new IllegalArgumentException("unsupported window format version " + version);
        }
        int width = buf.getInt();
        long paneMs = buf.getLong();
        int panes = buf.getInt();
        PaneWindow w = new PaneWindow(width, paneMs, panes);
        if (buf.remaining() < (long) panes * (SLOT_HEADER_BYTES + Moments.byteLength(width)) + 9) {
            throw new IllegalArgumentException("window bytes are truncated: " + panes + " panes expected");
        }
        w.started = readFlag(buf, "started");
        w.latest = buf.getLong();
        if (!w.started && w.latest != 0L) {
            throw new IllegalArgumentException("an empty window must have latest pane 0, was " + w.latest);
        }
        for (int s = 0; s < panes; s++) {
            boolean isLive = readFlag(buf, "live");
            long index = buf.getLong();
            Moments pane = Moments.read(buf);
            if (pane.width() != width) {
                throw new IllegalArgumentException("pane " + s + " has width " + pane.width() + ", expected " + width);
            }
            if (isLive) {
                w.checkLivePane(s, index, pane);
            } else if (index != 0L || pane.count() != 0) {
                throw new IllegalArgumentException("slot " + s + " is not live but not empty");
            }
            w.ring[s] = pane;
            w.live[s] = isLive;
            w.paneIndex[s] = isLive ? index : 0L;
        }
        if (w.started) {
            int latestSlot = (int) Math.floorMod(w.latest, (long) panes);
            if (!w.live[latestSlot] || w.paneIndex[latestSlot] != w.latest) {
                throw new IllegalArgumentException("the latest pane " + w.latest + " is not live");
            }
        }
        return w;
    }

    private void checkLivePane(int slot, long index, Moments pane) {
        if (!started || index > latest || !inWindow(latest, index) || Math.floorMod(index, (long) panes) != slot) {
            throw new IllegalArgumentException("pane " + index + " does not belong in slot " + slot);
        }
        if (pane.count() == 0 || Math.floorDiv(pane.minEventTimeMs(), paneMs) != index
                || Math.floorDiv(pane.maxEventTimeMs(), paneMs) != index) {
            throw new IllegalArgumentException("pane " + index + " holds no records or records of another pane");
        }
    }

    private static boolean readFlag(ByteBuffer buf, String name) {
        byte b = buf.get();
        if (b != 0 && b != 1) {
            throw new IllegalArgumentException(name + " flag must be 0 or 1, was " + b);
        }
        return b == 1;
    }

    /** Sets the latest pane to {@code index} (&gt; latest) and clears the panes that leave the window. */
    private void advance(long index) {
        for (int s = 0; s < panes; s++) {
            if (live[s] && !inWindow(index, paneIndex[s])) {
                live[s] = false;
                paneIndex[s] = 0L;
                ring[s].reset();
            }
        }
        latest = index;
        started = true;
    }

    /** Whether pane {@code index} (&lt;= newest) lies in the window ending at pane {@code newest}. */
    private boolean inWindow(long newest, long index) {
        return Long.compareUnsigned(newest - index, panes) < 0;
    }
}
