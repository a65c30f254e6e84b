package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

import org.junit.jupiter.api.Test;

/**
 * Wide blocks, whose panel updates are split between threads ({@link Moments#setThreads}): the bytes do not
 * depend on the thread count or on other callers sharing the worker threads, and the values match the
 * two-pass computation on the raw rows (oracle: {@link TwoPass}, an independent naive computation).
 */
class ThreadCountTest {

    private static final long SEED = 20261202L;
    private static final int[] THREADS = {1, 2, 3};

    @Test
    void addBlock_wideBlocksOnOneTwoOrThreeThreads_sameBytesAndEqualTwoPass() {
        Random rnd = new Random(SEED);
        for (int d : new int[] {257, 300, 386}) {
            assertTrue(d > Moments.SERIAL_MAX_WIDTH, "width " + d + " must take the threaded path");
            int n = 600;
            RandomRows data = RandomRows.of(rnd, n, d);
            byte[] first = null;
            for (int threads : THREADS) {
                Moments m = new Moments(d);
                m.setThreads(threads);
                m.addBlock(data.flat(0, 520), data.weights(0, 520), data.times(0, 520), 520);
                m.addBlock(data.flat(520, n), data.weights(520, n), data.times(520, n), n - 520);
                data.twoPass().assertMatches(m);
                if (first == null) {
                    first = m.toBytes();
                } else {
                    assertArrayEquals(first, m.toBytes(), "d=" + d + " threads=" + threads);
                }
            }
        }
    }

    @Test
    void momentStream_wideRows_sameFingerprintOnEveryThreadCountAndEqualTwoPass() {
        Random rnd = new Random(SEED + 1);
        int d = 257;
        assertTrue(d > Moments.SERIAL_MAX_WIDTH, "width " + d + " must take the threaded path");
        RandomRows data = RandomRows.of(rnd, 900, d);
        for (double halfLife : new double[] {Double.POSITIVE_INFINITY, 2_000.0}) {
            String first = null;
            for (int threads : THREADS) {
                MomentStream s = new MomentStream(d, 256, halfLife);
                s.setThreads(threads);
                assertEquals(threads, s.threads());
                for (int r = 0; r < data.size(); r++) {
                    s.add(data.rows[r], data.weights[r], data.times[r]);
                }
                if (halfLife == Double.POSITIVE_INFINITY) {
                    data.twoPass().assertMatches(s.snapshot());
                }
                String f = s.fingerprint();
                if (first == null) {
                    first = f;
                } else {
                    assertEquals(first, f, "halfLife=" + halfLife + " threads=" + threads);
                }
                assertEquals(threads, s.copy().threads());
            }
        }
    }

    @Test
    void addBlock_twoCallersSharingTheWorkers_sameBytesAsOneThread() throws Exception {
        Random rnd = new Random(SEED + 2);
        int d = 260;
        assertTrue(d > Moments.SERIAL_MAX_WIDTH, "width " + d + " must take the threaded path");
        int n = 512;
        RandomRows data = RandomRows.of(rnd, n, d);
        double[] rows = data.flat(0, n);
        Moments serial = new Moments(d);
        serial.setThreads(1);
        for (int rep = 0; rep < 6; rep++) {
            serial.addBlock(rows, data.weights, data.times, n);
        }
        byte[] expected = serial.toBytes();
        ExecutorService callers = Executors.newFixedThreadPool(2);
        try {
            List<Future<byte[]>> results = new ArrayList<>();
            for (int c = 0; c < 4; c++) {
                results.add(callers.submit(() -> {
                    Moments m = new Moments(d);
                    m.setThreads(2);
                    for (int rep = 0; rep < 6; rep++) {
                        m.addBlock(rows, data.weights, data.times, n);
                    }
                    return m.toBytes();
                }));
            }
            for (Future<byte[]> f : results) {
                assertArrayEquals(expected, f.get());
            }
        } finally {
            callers.shutdownNow();
        }
    }

    @Test
    void setThreads_outOfRange_rejected() {
        Moments m = new Moments(3);
        assertThrows(IllegalArgumentException.class, () -> m.setThreads(0));
        assertThrows(IllegalArgumentException.class, () -> m.setThreads(Crew.MAX_THREADS + 1));
        MomentStream s = new MomentStream(3, 4, Double.POSITIVE_INFINITY);
        assertThrows(IllegalArgumentException.class, () -> s.setThreads(-1));
    }
}
