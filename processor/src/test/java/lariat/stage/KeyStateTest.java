package lariat.stage;

import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
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
        assertEquals(a.moments().snapshot().fingerprint(), b.moments().snapshot().fingerprint());
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
}
