package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;

class MomentStreamTest {

    private static final double NO_FORGETTING = Double.POSITIVE_INFINITY;
    private static final int[] BLOCK_SIZES = {1, 7, 64};

    @Test
    void snapshot_noForgetting_equalsTwoPassOnRawRows() {
        Random rnd = new Random(31L);
        for (int trial = 0; trial < 40; trial++) {
            int d = 1 + rnd.nextInt(10);
            int n = 1 + rnd.nextInt(400);
            int blockSize = 1 + rnd.nextInt(80);
            RandomRows data = RandomRows.of(rnd, n, d);
            MomentStream s = feed(new MomentStream(d, blockSize, NO_FORGETTING), data, 0, n);
            Moments snap = s.snapshot();
            data.twoPass().assertMatches(snap);
            assertEquals(n, s.count());
            assertEquals(n, snap.count());
            assertEquals(n % blockSize, s.pendingRows());
        }
    }

    /**
     * The forgetting model: the final state equals the batch in which record i has weight
     * w_i · 2^(−(T − t_i)/h), T the largest event time. The event times include late records (about one in
     * ten arrives up to 500 ms, i.e. one half-life, behind), so rows get scaled both as part of the state and
     * as late block rows.
     */
    @Test
    void snapshot_withHalfLife_equalsExplicitlyWeightedBatch() {
        Random rnd = new Random(32L);
        double halfLife = 500.0;
        for (int blockSize : BLOCK_SIZES) {
            for (int trial = 0; trial < 10; trial++) {
                int d = 1 + rnd.nextInt(6);
                int n = 1 + rnd.nextInt(500);
                RandomRows data = RandomRows.of(rnd, n, d);
                MomentStream s = feed(new MomentStream(d, blockSize, halfLife), data, 0, n);
                long t = Arrays.stream(data.times).max().getAsLong();
                double[] decayed = new double[n];
                for (int r = 0; r < n; r++) {
                    decayed[r] = data.weights[r] * Math.pow(2.0, -(t - data.times[r]) / halfLife);
                }
                Moments snap = s.snapshot();
                TwoPass.of(data.rows, decayed, n).assertMatches(snap);
                assertEquals(t, snap.maxEventTimeMs());
                assertEquals(Arrays.stream(data.times).min().getAsLong(), snap.minEventTimeMs());
                assertEquals(n, snap.count());
            }
        }
    }

    @Test
    void snapshot_stateWeightUnderflows_becomesLaterRecordsOnlyWithoutNaN() {
        RandomRows data = RandomRows.of(new Random(33L), 40, 3);
        MomentStream s = new MomentStream(3, 8, 1.0);
        for (int r = 0; r < 20; r++) {
            s.add(data.rows[r], data.weights[r], 0L);
        }
        long later = 10_000_000L;
        for (int r = 20; r < 40; r++) {
            s.add(data.rows[r], data.weights[r], later);
        }
        double[][] laterRows = Arrays.copyOfRange(data.rows, 20, 40);
        Moments snap = s.snapshot();
        TwoPass.of(laterRows, data.weights(20, 40), 20).assertMatches(snap);
        assertEquals(40, snap.count());
        s.add(data.rows[0], data.weights[0], 0L);
        assertEquals(41, s.count());
        TwoPass.of(laterRows, data.weights(20, 40), 20).assertMatches(s.snapshot());
    }

    /**
     * Blocks are aligned to the record count, so where a caller pauses (poll batches, snapshots, a restore
     * from bytes, working on a copy) must not change a single bit.
     */
    @Test
    void fingerprint_differentCallGroupings_bitIdentical() {
        Random rnd = new Random(34L);
        for (double halfLife : new double[] {NO_FORGETTING, 300.0}) {
            for (int blockSize : BLOCK_SIZES) {
                int d = 4;
                int n = 300 + rnd.nextInt(100);
                RandomRows data = RandomRows.of(rnd, n, d);
                MomentStream straight = feed(new MomentStream(d, blockSize, halfLife), data, 0, n);
                byte[] expected = straight.toBytes();
                String fingerprint = straight.fingerprint();

                MomentStream snapshotting = new MomentStream(d, blockSize, halfLife);
                for (int r = 0; r < n; r++) {
                    snapshotting.add(data.rows[r], data.weights[r], data.times[r]);
                    snapshotting.snapshot();
                    snapshotting.fingerprint();
                }
                assertArrayEquals(expected, snapshotting.toBytes());

                MomentStream restored = new MomentStream(d, blockSize, halfLife);
                for (int from = 0; from < n; ) {
                    int to = Math.min(n, from + 1 + rnd.nextInt(50));
                    restored = MomentStream.fromBytes(feed(restored, data, from, to).toBytes());
                    from = to;
                }
                assertArrayEquals(expected, restored.toBytes());
                assertEquals(fingerprint, restored.fingerprint());

                MomentStream copied = new MomentStream(d, blockSize, halfLife);
                for (int from = 0; from < n; ) {
                    int to = Math.min(n, from + 1 + rnd.nextInt(50));
                    copied = feed(copied, data, from, to).copy();
                    from = to;
                }
                assertArrayEquals(expected, copied.toBytes());
                assertEquals(fingerprint, copied.fingerprint());
            }
        }
    }

    @Test
    void fingerprint_isFingerprintOfSnapshot() {
        RandomRows data = RandomRows.of(new Random(35L), 30, 3);
        MomentStream s = feed(new MomentStream(3, 7, 1000.0), data, 0, 30);
        assertEquals(s.snapshot().fingerprint(), s.fingerprint());
        assertEquals(2, s.pendingRows());
    }

    @Test
    void snapshot_pendingRows_doesNotChangeStream() {
        RandomRows data = RandomRows.of(new Random(36L), 10, 2);
        MomentStream s = feed(new MomentStream(2, 64, 100.0), data, 0, 10);
        byte[] before = s.toBytes();
        Moments first = s.snapshot();
        assertArrayEquals(before, s.toBytes());
        assertEquals(first, s.snapshot());
        assertEquals(10, s.pendingRows());
    }

    @Test
    void copy_thenAddToEither_othersBytesUnchanged() {
        RandomRows data = RandomRows.of(new Random(37L), 40, 3);
        MomentStream s = feed(new MomentStream(3, 7, NO_FORGETTING), data, 0, 20);
        MomentStream c = s.copy();
        byte[] before = c.toBytes();
        feed(s, data, 20, 40);
        assertArrayEquals(before, c.toBytes());
        byte[] grown = s.toBytes();
        feed(c, data, 20, 30);
        assertArrayEquals(grown, s.toBytes());
        assertNotEquals(s.fingerprint(), c.fingerprint());
    }

    @Test
    void toBytes_withPendingRows_roundTripsAndContinuesBitIdentically() {
        Random rnd = new Random(38L);
        for (int blockSize : BLOCK_SIZES) {
            RandomRows data = RandomRows.of(rnd, 200, 5);
            MomentStream s = feed(new MomentStream(5, blockSize, 750.0), data, 0, 100);
            byte[] bytes = s.toBytes();
            MomentStream back = MomentStream.fromBytes(bytes);
            assertArrayEquals(bytes, back.toBytes());
            assertEquals(s.pendingRows(), back.pendingRows());
            assertEquals(100 % blockSize, back.pendingRows());
            assertEquals(s.count(), back.count());
            assertEquals(blockSize, back.blockSize());
            assertEquals(750.0, back.halfLifeMs());
            assertEquals(s.fingerprint(), back.fingerprint());
            feed(s, data, 100, 200);
            feed(back, data, 100, 200);
            assertArrayEquals(s.toBytes(), back.toBytes());
        }
        MomentStream empty = new MomentStream(2, 3, NO_FORGETTING);
        assertArrayEquals(empty.toBytes(), MomentStream.fromBytes(empty.toBytes()).toBytes());
    }

    @Test
    void fromBytes_malformed_rejected() {
        int d = 2;
        RandomRows data = RandomRows.of(new Random(39L), 10, d);
        MomentStream s = feed(new MomentStream(d, 4, NO_FORGETTING), data, 0, 10);
        byte[] good = s.toBytes();
        int rowsStart = 29 + Moments.byteLength(d);
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(null));
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(new byte[3]));
        assertThrows(IllegalArgumentException.class,
                () -> MomentStream.fromBytes(Arrays.copyOf(good, good.length - 1)));
        assertThrows(IllegalArgumentException.class,
                () -> MomentStream.fromBytes(Arrays.copyOf(good, good.length + 8)));
        byte[] version = good.clone();
        version[0] = 9;
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(version));
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(patch(good, b -> b.putInt(5, 0))));
        assertThrows(IllegalArgumentException.class,
                () -> MomentStream.fromBytes(patch(good, b -> b.putDouble(9, Double.NaN))));
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(patch(good, b -> b.putDouble(9, -1))));
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(patch(good, b -> b.putLong(17, 11L))));
        assertThrows(IllegalArgumentException.class, () -> MomentStream.fromBytes(patch(good, b -> b.putInt(25, 4))));
        assertThrows(IllegalArgumentException.class,
                () -> MomentStream.fromBytes(patch(good, b -> b.putDouble(rowsStart + 8, Double.NaN))));
        assertThrows(IllegalArgumentException.class,
                () -> MomentStream.fromBytes(patch(good, b -> b.putDouble(rowsStart + 8 * d, 0.0))));
    }

    @Test
    void add_badInput_rejectedNamingColumnAndFingerprintUnchanged() {
        RandomRows data = RandomRows.of(new Random(40L), 13, 5);
        MomentStream s = feed(new MomentStream(5, 7, 200.0), data, 0, 13);
        byte[] before = s.toBytes();
        String fingerprint = s.fingerprint();
        IllegalArgumentException nan = assertThrows(IllegalArgumentException.class,
                () -> s.add(new double[] {1, 2, 3, Double.NaN, 5}, 1.0, 0L));
        assertEquals("column 3 has non-finite value NaN", nan.getMessage());
        IllegalArgumentException inf = assertThrows(IllegalArgumentException.class,
                () -> s.add(new double[] {1, Double.POSITIVE_INFINITY, 3, 4, 5}, 1.0, 0L));
        assertEquals("column 1 has non-finite value Infinity", inf.getMessage());
        assertThrows(IllegalArgumentException.class, () -> s.add(new double[] {1, 2, 3, 4}, 1.0, 0L));
        assertThrows(IllegalArgumentException.class, () -> s.add(null, 1.0, 0L));
        for (double bad : new double[] {0.0, -2.0, Double.NaN, Double.POSITIVE_INFINITY}) {
            assertThrows(IllegalArgumentException.class, () -> s.add(new double[] {1, 2, 3, 4, 5}, bad, 0L));
        }
        assertArrayEquals(before, s.toBytes());
        assertEquals(fingerprint, s.fingerprint());
        assertEquals(13, s.count());
    }

    @Test
    void add_overflowingBlockMerge_rejectedAndStreamUnchanged() {
        MomentStream s = new MomentStream(1, 2, NO_FORGETTING);
        s.add(new double[] {1e300}, 1.0, 0L);
        s.add(new double[] {1e300}, 1.0, 1L);
        s.add(new double[] {-1e300}, 1.0, 2L);
        byte[] before = s.toBytes();
        assertThrows(IllegalArgumentException.class, () -> s.add(new double[] {-1e300}, 1.0, 3L));
        assertArrayEquals(before, s.toBytes());
        assertEquals(3, s.count());
        assertEquals(1, s.pendingRows());
    }

    @Test
    void constructor_invalidArguments_rejected() {
        assertThrows(IllegalArgumentException.class, () -> new MomentStream(0, 4, NO_FORGETTING));
        assertThrows(IllegalArgumentException.class, () -> new MomentStream(2, 0, NO_FORGETTING));
        assertThrows(IllegalArgumentException.class, () -> new MomentStream(2, 4, 0.0));
        assertThrows(IllegalArgumentException.class, () -> new MomentStream(2, 4, -5.0));
        assertThrows(IllegalArgumentException.class, () -> new MomentStream(2, 4, Double.NaN));
        assertTrue(new MomentStream(2, 4, NO_FORGETTING).snapshot().count() == 0);
    }

    private static MomentStream feed(MomentStream s, RandomRows data, int from, int to) {
        for (int r = from; r < to; r++) {
            s.add(data.rows[r], data.weights[r], data.times[r]);
        }
        return s;
    }

    private static byte[] patch(byte[] bytes, java.util.function.Consumer<ByteBuffer> edit) {
        byte[] out = bytes.clone();
        edit.accept(ByteBuffer.wrap(out));
        return out;
    }
}
