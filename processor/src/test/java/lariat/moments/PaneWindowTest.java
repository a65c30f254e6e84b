package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

class PaneWindowTest {

    private static final long PANE_MS = 1000L;
    private static final int PANES = 4;

    /**
     * Reference by definition: a record is accepted if its pane is no older than the window at its arrival
     * (pane ≥ newest pane so far − (panes − 1)); the window at the end holds the accepted records whose pane
     * is ≥ final newest pane − (panes − 1).
     */
    @Test
    void merged_randomTimesWithLateRecords_equalsTwoPassOverRecordsInWindow() {
        Random rnd = new Random(51L);
        for (int trial = 0; trial < 20; trial++) {
            int d = 1 + rnd.nextInt(5);
            int n = 50 + rnd.nextInt(400);
            double[][] rows = RandomRows.of(rnd, n, d).rows;
            PaneWindow window = new PaneWindow(d, PANE_MS, PANES);
            List<Integer> accepted = new ArrayList<>();
            long[] times = new long[n];
            long clock = -3000L;
            long newestPane = Long.MIN_VALUE;
            for (int r = 0; r < n; r++) {
                clock += rnd.nextInt(150);
                times[r] = rnd.nextInt(8) == 0 ? clock - rnd.nextInt(6000) : clock;
                long pane = Math.floorDiv(times[r], PANE_MS);
                boolean expected = newestPane == Long.MIN_VALUE || pane > newestPane - PANES;
                assertEquals(expected, window.add(rows[r], 1.0 + (r % 3), times[r]), "record " + r);
                if (expected) {
                    accepted.add(r);
                    newestPane = Math.max(newestPane, pane);
                }
            }
            List<double[]> inWindow = new ArrayList<>();
            List<Double> weights = new ArrayList<>();
            for (int r : accepted) {
                if (Math.floorDiv(times[r], PANE_MS) > newestPane - PANES) {
                    inWindow.add(rows[r]);
                    weights.add(1.0 + (r % 3));
                }
            }
            Moments merged = window.merged();
            assertEquals(inWindow.size(), window.count());
            assertEquals(inWindow.size(), merged.count());
            double[] w = weights.stream().mapToDouble(Double::doubleValue).toArray();
            TwoPass.of(inWindow.toArray(new double[0][]), w, w.length).assertMatches(merged);
        }
    }

    @Test
    void add_recordOlderThanWindow_droppedAndNothingChanges() {
        PaneWindow window = new PaneWindow(2, PANE_MS, PANES);
        assertTrue(window.add(new double[] {1, 2}, 1.0, 10_500L));
        byte[] before = window.toBytes();
        assertFalse(window.add(new double[] {3, 4}, 1.0, 6_999L));
        assertArrayEquals(before, window.toBytes());
        assertTrue(window.add(new double[] {3, 4}, 1.0, 7_000L));
        assertEquals(2, window.count());
    }

    @Test
    void add_timeJumpsPastWindow_oldPanesExpire() {
        PaneWindow window = new PaneWindow(1, PANE_MS, PANES);
        window.add(new double[] {1}, 1.0, 0L);
        window.add(new double[] {2}, 1.0, 1_500L);
        window.add(new double[] {10}, 1.0, 4_200L);
        Moments m = window.merged();
        assertEquals(2, m.count());
        assertEquals(6.0, m.mean(0), 1e-15);
        window.add(new double[] {7}, 3.0, 1_000_000L);
        assertEquals(1, window.count());
        assertEquals(7.0, window.merged().mean(0));
    }

    @Test
    void merged_emptyWindow_isEmptyMoments() {
        assertEquals(new Moments(3), new PaneWindow(3, 10L, 5).merged());
        assertEquals(0, new PaneWindow(3, 10L, 5).count());
    }

    @Test
    void add_badInput_rejectedNamingColumnAndWindowUnchanged() {
        PaneWindow window = new PaneWindow(4, PANE_MS, PANES);
        window.add(new double[] {1, 2, 3, 4}, 1.0, 0L);
        byte[] before = window.toBytes();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> window.add(new double[] {1, 2, 3, Double.NaN}, 1.0, 50_000L));
        assertEquals("column 3 has non-finite value NaN", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> window.add(new double[] {1, 2, 3}, 1.0, 50_000L));
        assertThrows(IllegalArgumentException.class, () -> window.add(new double[] {1, 2, 3, 4}, -1.0, 50_000L));
        assertThrows(IllegalArgumentException.class,
                () -> window.add(new double[] {1e300, 0, 0, 0}, 1e300, 50_000L));
        assertArrayEquals(before, window.toBytes());
    }

    @Test
    void constructor_invalidArguments_rejected() {
        assertThrows(IllegalArgumentException.class, () -> new PaneWindow(0, 10L, 3));
        assertThrows(IllegalArgumentException.class, () -> new PaneWindow(2, 0L, 3));
        assertThrows(IllegalArgumentException.class, () -> new PaneWindow(2, 10L, 0));
    }

    @Test
    void toBytes_roundTrip_isBitExactAndContinuesIdentically() {
        Random rnd = new Random(52L);
        RandomRows data = RandomRows.of(rnd, 200, 3);
        PaneWindow window = new PaneWindow(3, 250L, 6);
        for (int r = 0; r < 100; r++) {
            window.add(data.rows[r], data.weights[r], data.times[r] - 1_700_000_000_000L);
        }
        byte[] bytes = window.toBytes();
        PaneWindow back = PaneWindow.fromBytes(bytes);
        assertArrayEquals(bytes, back.toBytes());
        assertEquals(window.merged(), back.merged());
        assertEquals(window.count(), back.count());
        for (int r = 100; r < 200; r++) {
            long t = data.times[r] - 1_700_000_000_000L;
            assertEquals(window.add(data.rows[r], data.weights[r], t), back.add(data.rows[r], data.weights[r], t));
        }
        assertArrayEquals(window.toBytes(), back.toBytes());
        PaneWindow empty = new PaneWindow(2, 5L, 3);
        assertArrayEquals(empty.toBytes(), PaneWindow.fromBytes(empty.toBytes()).toBytes());
    }

    @Test
    void fromBytes_malformed_rejected() {
        int d = 1;
        PaneWindow window = new PaneWindow(d, PANE_MS, 2);
        window.add(new double[] {1}, 1.0, 0L);
        window.add(new double[] {2}, 1.0, 1_500L);
        byte[] good = window.toBytes();
        int slotBytes = 9 + Moments.byteLength(d);
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(null));
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(new byte[5]));
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(Arrays.copyOf(good, good.length - 1)));
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(Arrays.copyOf(good, good.length + 1)));
        byte[] version = good.clone();
        version[0] = 0;
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(version));
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(patch(good, b -> b.putLong(5, 0L))));
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(patch(good, b -> b.put(17, (byte) 2))));
        assertThrows(IllegalArgumentException.class, () -> PaneWindow.fromBytes(patch(good, b -> b.putLong(18, 5L))));
        assertThrows(IllegalArgumentException.class,
                () -> PaneWindow.fromBytes(patch(good, b -> b.putLong(26 + 1, 2L))));
        assertThrows(IllegalArgumentException.class,
                () -> PaneWindow.fromBytes(patch(good, b -> b.put(26 + slotBytes, (byte) 0))));
    }

    private static byte[] patch(byte[] bytes, java.util.function.Consumer<ByteBuffer> edit) {
        byte[] out = bytes.clone();
        edit.accept(ByteBuffer.wrap(out));
        return out;
    }
}
