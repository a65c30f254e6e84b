package lariat.stage;

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
 * {@link lariat.select.FoldAssignment} gives {@code n}, a stable hash; no random state.
 */
final class KeyState {

    private static final int FORMAT = 1;

    private final String modelKey;
    private final int partition;
    private final String[] channels;
    private final MomentStream all;
    private final FoldMoments folds;
    private long count;
    private long nextVersion;
    private long countAtRefit;
    private long eventTimeAtRefit;
    private long minEventTime;
    private long maxEventTime;
    private long lastOffset;
    private ActiveSet published;
    private final AlertTracker alerts;
    private int chunkCount;
    private boolean dirty;

    private KeyState(String modelKey, int partition, String[] channels, MomentStream all, FoldMoments folds,
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
        FoldMoments f = folds == 0 ? null : new FoldMoments(channels.length, folds);
        return new KeyState(modelKey, partition, channels.clone(),
                new MomentStream(channels.length, blockSize, halfLifeMs), f, new AlertTracker());
    }

    /** Adds one accepted record; {@code z} is features then target, already validated. */
    void add(double[] z, double weight, long eventTimeMs, long offset) {
        all.add(z, weight, eventTimeMs);
        if (folds != null) {
            folds.add(z, weight, eventTimeMs, count);
        }
        count++;
        minEventTime = Math.min(minEventTime, eventTimeMs);
        maxEventTime = Math.max(maxEventTime, eventTimeMs);
        lastOffset = offset;
        dirty = true;
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

    MomentStream moments() {
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
            List<Moments> fl = folds == null ? List.of() : folds.foldList();
            out.writeInt(fl.size());
            for (Moments f : fl) {
                writeBlob(out, f.toBytes());
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
            if (format != FORMAT) {
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
            MomentStream all = MomentStream.fromBytes(readBlob(in));
            int nf = in.readInt();
            if (nf < 0 || nf == 1 || nf > 1000) {
                throw new IOException("fold count out of range: " + nf);
            }
            List<Moments> fl = new ArrayList<>(nf);
            for (int i = 0; i < nf; i++) {
                fl.add(Moments.fromBytes(readBlob(in)));
            }
            FoldMoments folds = nf == 0 ? null : FoldMoments.of(fl);
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
