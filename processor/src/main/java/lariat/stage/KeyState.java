package lariat.stage;

import lariat.moments.Accumulator;
import lariat.moments.MomentStream;
import lariat.moments.Moments;
import lariat.select.FoldMoments;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Everything the stage keeps for one model key: its moments (and fold moments when
 * cross-validation is on), the next version number, the active set of the last published
 * version, the alert persistence state and the refit schedule's anchors. Mutable; owned by the
 * loop thread. {@link #toBytes()} is the snapshot payload and {@link #fromBytes} its inverse,
 * so a restarted stage continues exactly where the last committed transaction left it.
 *
 * <p>Fold assignment: the record with 0-based accepted index {@code n} of this key goes to the fold
 * {@link lariat.select.FoldAssignment} gives {@code n}, a stable hash; no random state. The folds are
 * accumulators of the main accumulator's kind and parameters (same block size and half-life, or same
 * sliding window), so the merge of the folds equals the main moments.
 *
 * <p>Payload format {@value #FORMAT} (big-endian, {@link DataOutputStream}): format (int), model key,
 * partition, channels, the seven scalars (count, next version, count and event time at refit, event-time
 * range, last offset), published active set, alert tracker, then the main {@link Accumulator#toBytes()}
 * as a length-prefixed blob, the fold count and each fold's {@link Accumulator#toBytes()} blob. Format 1
 * (read, no longer written) held a {@link MomentStream} blob and plain {@link Moments} folds in those two
 * places; a format 1 state restores with plain folds and continues exactly as it would have.
 */
final class KeyState {

    private static final int FORMAT = 2;
    private static final int FORMAT_STREAM_AND_PLAIN_FOLDS = 1;

    private final String modelKey;
    private final int partition;
    private final String[] channels;
    private final Accumulator all;
    private final FoldMoments folds;
    private long count;
    private long nextVersion;
    private long countAtRefit;
    private long eventTimeAtRefit;
    private long minEventTime;
    private long maxEventTime;
    private long lastOffset;
    private long firstOffset = -1;
    private ActiveSet published;
    private final AlertTracker alerts;
    private int chunkCount;
    private boolean dirty;

    private KeyState(String modelKey, int partition, String[] channels, Accumulator all, FoldMoments folds,
                     AlertTracker alerts) {
        this.modelKey = modelKey;
        this.partition = partition;
        this.channels = channels;
        this.all = all;
        this.folds = folds;
        this.alerts = alerts;
        this.nextVersion = 1;
        this.eventTimeAtRefit = Long.MIN_VALUE;
        this.minEventTime = Long.MAX_VALUE;
        this.maxEventTime = Long.MIN_VALUE;
        this.lastOffset = -1;
        this.published = ActiveSet.empty();
    }

    /**
     * A fresh state for a key first seen on {@code partition} with these channel names (target
     * last); {@code folds} is 0 for none or the cross-validation fold count.
     */
    static KeyState create(String modelKey, int partition, String[] channels, int blockSize, double halfLifeMs,
                           int folds) {
        return create(modelKey, partition, channels, Accumulator.stream(channels.length, blockSize, halfLifeMs),
                folds);
    }

    /**
     * A fresh state whose main accumulator (and each fold, when {@code folds} is not 0) is an empty
     * accumulator of the kind and parameters of {@code prototype}, which must be empty and as wide as
     * {@code channels}.
     */
    static KeyState create(String modelKey, int partition, String[] channels, Accumulator prototype, int folds) {
        if (prototype.width() != channels.length || prototype.count() != 0) {
            throw new IllegalArgumentException("prototype must be empty with width " + channels.length + ", was "
                    + prototype);
        }
        FoldMoments f = folds == 0 ? null : new FoldMoments(prototype, folds);
        return new KeyState(modelKey, partition, channels.clone(), prototype.emptyLike(), f, new AlertTracker());
    }

    /**
     * Adds one record; {@code z} is features then target.
     *
     * @return false, with nothing changed, when the key keeps a sliding window and the record is older
     *     than the window
     * @throws IllegalArgumentException on a non-finite value or weight; nothing changed then
     */
    boolean add(double[] z, double weight, long eventTimeMs, long offset) {
        if (!all.accepts(eventTimeMs)) {
            return false;
        }
        all.add(z, weight, eventTimeMs);
        if (folds != null) {
            folds.add(z, weight, eventTimeMs, count);
        }
        if (count == 0) {
            firstOffset = offset;
        }
        count++;
        minEventTime = Math.min(minEventTime, eventTimeMs);
        maxEventTime = Math.max(maxEventTime, eventTimeMs);
        lastOffset = offset;
        dirty = true;
        return true;
    }

    /**
     * Whether a refit is due: the key has records since its last refit and either
     * {@code everyRecords > 0} of them arrived, or event time advanced by {@code everyEventMs > 0}.
     */
    boolean refitDue(long everyRecords, long everyEventMs) {
        long fresh = count - countAtRefit;
        if (fresh <= 0) {
            return false;
        }
        if (everyRecords > 0 && fresh >= everyRecords) {
            return true;
        }
        if (everyEventMs > 0) {
            return eventTimeAtRefit == Long.MIN_VALUE ? maxEventTime - minEventTime >= everyEventMs
                    : maxEventTime - eventTimeAtRefit >= everyEventMs;
        }
        return false;
    }

    /** Marks a refit done at the current record count and event time. */
    void refitted() {
        countAtRefit = count;
        eventTimeAtRefit = maxEventTime;
        dirty = true;
    }

    /** Takes the next version number. */
    long takeVersion() {
        dirty = true;
        return nextVersion++;
    }

    String modelKey() {
        return modelKey;
    }

    int partition() {
        return partition;
    }

    String[] channels() {
        return channels.clone();
    }

    int width() {
        return channels.length;
    }

    /** The main accumulator (live). */
    Accumulator moments() {
        return all;
    }

    /** The fold moments (live), or null when cross-validation is off. */
    FoldMoments folds() {
        return folds;
    }

    long count() {
        return count;
    }

    long nextVersion() {
        return nextVersion;
    }

    long minEventTime() {
        return minEventTime;
    }

    long maxEventTime() {
        return maxEventTime;
    }

    long lastOffset() {
        return lastOffset;
    }

    /**
     * Offset of the first record this state accepted, or -1 when that happened before it was restored
     * from a snapshot (the snapshot does not carry it).
     */
    long firstOffset() {
        return firstOffset;
    }

    ActiveSet published() {
        return published;
    }

    void published(ActiveSet set) {
        published = set;
        dirty = true;
    }

    AlertTracker alerts() {
        return alerts;
    }

    int chunkCount() {
        return chunkCount;
    }

    void chunkCount(int chunks) {
        chunkCount = chunks;
    }

    boolean dirty() {
        return dirty;
    }

    void clean() {
        dirty = false;
    }

    /** Canonical bytes of the state, the snapshot payload. */
    byte[] toBytes() {
        ByteArrayOutputStream buf = new ByteArrayOutputStream(1024);
        try (DataOutputStream out = new DataOutputStream(buf)) {
            out.writeInt(FORMAT);
            out.writeUTF(modelKey);
            out.writeInt(partition);
            out.writeInt(channels.length);
            for (String c : channels) {
                out.writeUTF(c);
            }
            out.writeLong(count);
            out.writeLong(nextVersion);
            out.writeLong(countAtRefit);
            out.writeLong(eventTimeAtRefit);
            out.writeLong(minEventTime);
            out.writeLong(maxEventTime);
            out.writeLong(lastOffset);
            published.write(out);
            alerts.write(out);
            writeBlob(out, all.toBytes());
            List<byte[]> fl = folds == null ? List.of() : folds.accumulators();
            out.writeInt(fl.size());
            for (byte[] f : fl) {
                writeBlob(out, f);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return buf.toByteArray();
    }

    /**
     * The state encoded by {@link #toBytes()}.
     *
     * @throws IOException when the bytes are not a state of this format
     */
    static KeyState fromBytes(byte[] bytes, int chunkCount) throws IOException {
        try (DataInputStream in = new DataInputStream(new ByteArrayInputStream(bytes))) {
            int format = in.readInt();
            if (format != FORMAT && format != FORMAT_STREAM_AND_PLAIN_FOLDS) {
                throw new IOException("unknown key state format " + format);
            }
            String key = in.readUTF();
            int partition = in.readInt();
            int width = in.readInt();
            if (width < 1 || width > 1 << 20) {
                throw new IOException("width out of range: " + width);
            }
            String[] channels = new String[width];
            for (int i = 0; i < width; i++) {
                channels[i] = in.readUTF();
            }
            long[] scalars = new long[7];
            for (int i = 0; i < scalars.length; i++) {
                scalars[i] = in.readLong();
            }
            ActiveSet published = ActiveSet.read(in);
            AlertTracker alerts = AlertTracker.read(in);
            boolean legacy = format == FORMAT_STREAM_AND_PLAIN_FOLDS;
            Accumulator all = legacy ? Accumulator.ofStream(MomentStream.fromBytes(readBlob(in)))
                    : Accumulator.fromBytes(readBlob(in));
            int nf = in.readInt();
            if (nf < 0 || nf == 1 || nf > 1000) {
                throw new IOException("fold count out of range: " + nf);
            }
            List<Accumulator> fl = new ArrayList<>(nf);
            for (int i = 0; i < nf; i++) {
                byte[] blob = readBlob(in);
                fl.add(legacy ? Accumulator.plainOf(Moments.fromBytes(blob)) : Accumulator.fromBytes(blob));
            }
            if (all.width() != width || (nf > 0 && fl.get(0).width() != width)) {
                throw new IOException("moments width differs from the " + width + " channels");
            }
            FoldMoments folds = nf == 0 ? null : FoldMoments.ofAccumulators(fl);
            KeyState s = new KeyState(key, partition, channels, all, folds, alerts);
            s.count = scalars[0];
            s.nextVersion = scalars[1];
            s.countAtRefit = scalars[2];
            s.eventTimeAtRefit = scalars[3];
            s.minEventTime = scalars[4];
            s.maxEventTime = scalars[5];
            s.lastOffset = scalars[6];
            s.published = published;
            s.chunkCount = chunkCount;
            return s;
        } catch (IllegalArgumentException e) {
            throw new IOException("corrupt key state", e);
        }
    }

    private static void writeBlob(DataOutputStream out, byte[] b) throws IOException {
        out.writeInt(b.length);
        out.write(b);
    }

    private static byte[] readBlob(DataInputStream in) throws IOException {
        int n = in.readInt();
        if (n < 0 || n > in.available()) {
            throw new IOException("blob length out of range: " + n);
        }
        byte[] b = new byte[n];
        in.readFully(b);
        return b;
    }

    @Override
    public String toString() {
        return "KeyState{" + modelKey + "@" + partition + ", count=" + count + ", next=" + nextVersion
                + ", channels=" + Arrays.toString(channels) + "}";
    }
}
