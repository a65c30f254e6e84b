package lariat.stage;

import lariat.config.StageConfig;
import lariat.moments.Accumulator;
import lariat.moments.MomentStream;
import lariat.moments.Moments;
import lariat.select.FoldMoments;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.util.List;
import java.util.Properties;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class KeyStateTest {

    private static final String[] CHANNELS = {"flow", "suction", "current"};

    private static KeyState filled(int folds, int records) {
        KeyState s = KeyState.create("north-01", 2, CHANNELS, 8, Double.POSITIVE_INFINITY, folds);
        Random rnd = new Random(11);
        for (int i = 0; i < records; i++) {
            double x0 = rnd.nextGaussian();
            double x1 = rnd.nextGaussian();
            s.add(new double[] {x0, x1, 3 * x0 - x1 + 0.1 * rnd.nextGaussian()}, 1.0, 1000L * i, 10L + i);
        }
        return s;
    }

    @Test
    void toBytes_afterRestore_continuesBitIdentically() throws IOException {
        KeyState a = filled(5, 37);
        a.takeVersion();
        a.refitted();
        a.published(ActiveSet.of(new int[] {0}, new int[] {1}));
        KeyState b = KeyState.fromBytes(a.toBytes(), 1);
        assertArrayEquals(a.toBytes(), b.toBytes(), "restored state has the same bytes");
        Random rnd = new Random(3);
        for (int i = 0; i < 20; i++) {
            double[] z = {rnd.nextGaussian(), rnd.nextGaussian(), rnd.nextGaussian()};
            a.add(z, 1.0, 50_000L + i, 100L + i);
            b.add(z, 1.0, 50_000L + i, 100L + i);
        }
        assertEquals(a.moments().moments().fingerprint(), b.moments().moments().fingerprint());
        assertArrayEquals(a.toBytes(), b.toBytes(), "same records after restore give the same state");
        assertEquals(2, b.nextVersion(), "next version survives the snapshot");
    }

    @Test
    void refitDue_byRecordCount_onlyWithNewRecords() {
        KeyState s = filled(0, 10);
        assertTrue(s.refitDue(10, 0));
        s.refitted();
        assertFalse(s.refitDue(10, 0), "no new records since the refit");
        assertFalse(s.refitDue(1, 0), "no new records since the refit");
    }

    @Test
    void refitDue_byEventTime_afterInterval() {
        KeyState s = filled(0, 4);
        assertTrue(s.refitDue(0, 3000), "event time spans 3000 ms");
        assertFalse(s.refitDue(0, 3001));
    }

    @Test
    void add_nonFiniteValue_rejectedAndStateUnchanged() {
        KeyState s = filled(3, 5);
        byte[] before = s.toBytes();
        assertThrows(IllegalArgumentException.class, () -> s.add(new double[] {1, Double.NaN, 2}, 1, 0, 99));
        assertArrayEquals(before, s.toBytes());
    }

    @Test
    void fromBytes_truncated_isIoException() {
        byte[] b = filled(0, 5).toBytes();
        assertThrows(IOException.class, () -> KeyState.fromBytes(java.util.Arrays.copyOf(b, b.length / 2), 1));
    }

    private static final long PANE_MS = 1000L;
    private static final int PANES = 5;

    private static KeyState windowed(int folds, int records, long seed) {
        KeyState s = KeyState.create("south-07", 1, CHANNELS, Accumulator.window(3, PANE_MS, PANES), folds);
        Random rnd = new Random(seed);
        for (int i = 0; i < records; i++) {
            double x0 = rnd.nextGaussian();
            double x1 = rnd.nextGaussian();
            assertTrue(s.add(new double[] {x0, x1, 2 * x0 + x1 + 0.1 * rnd.nextGaussian()}, 1.0, 250L * i, i),
                    "in-order record " + i + " is inside the window");
        }
        return s;
    }

    @Test
    void toBytes_windowAfterRestore_continuesBitIdentically() throws IOException {
        KeyState a = windowed(3, 60, 5);
        KeyState b = KeyState.fromBytes(a.toBytes(), 1);
        assertArrayEquals(a.toBytes(), b.toBytes(), "restored window state has the same bytes");
        Random rnd = new Random(8);
        for (int i = 0; i < 30; i++) {
            double[] z = {rnd.nextGaussian(), rnd.nextGaussian(), rnd.nextGaussian()};
            assertEquals(a.add(z, 1.0, 15_000L + 100L * i, 100L + i), b.add(z, 1.0, 15_000L + 100L * i, 100L + i));
        }
        assertEquals(a.moments().moments().fingerprint(), b.moments().moments().fingerprint());
        assertArrayEquals(a.toBytes(), b.toBytes(), "same records after restore give the same window state");
        assertTrue(b.moments().isWindow(), "the restored key still keeps a window");
    }

    @Test
    void add_windowRecordOlderThanWindow_refusedAndStateUnchanged() {
        KeyState s = windowed(3, 60, 5);
        byte[] before = s.toBytes();
        long latestPane = (250L * 59) / PANE_MS;
        long tooOld = (latestPane - PANES) * PANE_MS + PANE_MS - 1;
        assertFalse(s.add(new double[] {1, 2, 3}, 1.0, tooOld, 500), "pane before the window");
        assertArrayEquals(before, s.toBytes(), "a refused record touches nothing");
        assertEquals(60, s.count());
        assertTrue(s.add(new double[] {1, 2, 3}, 1.0, tooOld + 1, 501), "oldest pane of the window is accepted");
    }

    @Test
    void moments_window_holdsOnlyTheLastPanes() {
        KeyState s = windowed(0, 60, 5);
        long latestPane = (250L * 59) / PANE_MS;
        long expected = 0;
        for (int i = 0; i < 60; i++) {
            if ((250L * i) / PANE_MS > latestPane - PANES) {
                expected++;
            }
        }
        assertEquals(expected, s.moments().moments().count(), "records of the last " + PANES + " panes");
        assertNotEquals(s.count(), s.moments().moments().count(), "older panes slid out");
    }

    @Test
    void folds_windowedKey_mergeToTheMainMoments() {
        KeyState s = windowed(4, 90, 6);
        Moments main = s.moments().moments();
        Moments merged = s.folds().all();
        assertEquals(main.count(), merged.count());
        assertEquals(main.totalWeight(), merged.totalWeight(), 1e-12 * main.totalWeight());
    }

    @Test
    void folds_forgettingKey_forgetLikeTheMainMoments() {
        KeyState s = KeyState.create("east-03", 0, CHANNELS, 8, 1000.0, 3);
        Random rnd = new Random(12);
        for (int i = 0; i < 50; i++) {
            s.add(new double[] {rnd.nextGaussian(), rnd.nextGaussian(), rnd.nextGaussian()}, 1.0, 100L * i, i);
        }
        double w = s.moments().moments().totalWeight();
        assertTrue(w < 0.5 * 50, "the main moments forget");
        assertEquals(w, s.folds().all().totalWeight(), 1e-12 * w, "the merged folds forget by the same weights");
    }

    /** Writes a state in payload format 1 (MomentStream blob, plain fold Moments), as the first release did. */
    private static byte[] formatOne(MomentStream stream, List<Moments> folds, long count) throws IOException {
        ByteArrayOutputStream buf = new ByteArrayOutputStream();
        try (DataOutputStream out = new DataOutputStream(buf)) {
            out.writeInt(1);
            out.writeUTF("north-01");
            out.writeInt(2);
            out.writeInt(CHANNELS.length);
            for (String c : CHANNELS) {
                out.writeUTF(c);
            }
            long[] scalars = {count, 4, count, 1000L * (count - 1), 0, 1000L * (count - 1), 9 + count};
            for (long v : scalars) {
                out.writeLong(v);
            }
            ActiveSet.empty().write(out);
            new AlertTracker().write(out);
            byte[] m = stream.toBytes();
            out.writeInt(m.length);
            out.write(m);
            out.writeInt(folds.size());
            for (Moments f : folds) {
                byte[] b = f.toBytes();
                out.writeInt(b.length);
                out.write(b);
            }
        }
        return buf.toByteArray();
    }

    @Test
    void fromBytes_formatOneSnapshot_restoresMomentsAndFoldsBitExactly() throws IOException {
        MomentStream stream = new MomentStream(3, 8, Double.POSITIVE_INFINITY);
        FoldMoments plainFolds = new FoldMoments(3, 3);
        Random rnd = new Random(21);
        for (int i = 0; i < 29; i++) {
            double[] z = {rnd.nextGaussian(), rnd.nextGaussian(), rnd.nextGaussian()};
            stream.add(z, 1.0, 1000L * i);
            plainFolds.add(z, 1.0, 1000L * i, i);
        }
        KeyState s = KeyState.fromBytes(formatOne(stream, plainFolds.foldList(), 29), 1);
        assertArrayEquals(stream.snapshot().toBytes(), s.moments().moments().toBytes(), "main moments");
        for (int k = 0; k < 3; k++) {
            assertArrayEquals(plainFolds.heldOut(k).toBytes(), s.folds().heldOut(k).toBytes(), "fold " + k);
        }
        assertEquals(4, s.nextVersion());
        double[] z = {0.5, -0.25, 1.0};
        stream.add(z, 1.0, 40_000L);
        assertTrue(s.add(z, 1.0, 40_000L, 100));
        assertArrayEquals(stream.snapshot().toBytes(), s.moments().moments().toBytes(), "continues as before");
        KeyState again = KeyState.fromBytes(s.toBytes(), 1);
        assertArrayEquals(s.toBytes(), again.toBytes(), "rewritten in the current format, round trip exact");
    }

    @Test
    void settings_windowConfigured_keysKeepAWindow() throws IOException {
        Properties p = new Properties();
        try (java.io.InputStream in = KeyStateTest.class.getResourceAsStream("/examples/stage.properties")) {
            p.load(in);
        }
        p.setProperty("window.pane.ms", "60000");
        p.setProperty("window.panes", "10");
        Accumulator a = StageAssembly.settings(StageConfig.of(p)).emptyMoments(3);
        assertTrue(a.isWindow(), "window.pane.ms > 0 gives a sliding window");
        assertTrue(a.accepts(0L));
    }
}
