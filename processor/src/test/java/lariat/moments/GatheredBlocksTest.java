package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.Random;

import org.junit.jupiter.api.Test;

/**
 * Streams of moderate width on several threads gather completed blocks and compute their summaries side by
 * side ({@link Moments#blockGroup}). Certified against the same stream on one thread, which merges each
 * block as it completes (bytes, fingerprints and pending rows equal after every record checked), and against
 * the two-pass computation on the raw rows ({@link TwoPass}, an independent naive computation).
 */
class GatheredBlocksTest {

    private static final long SEED = 20261203L;

    @Test
    void add_gatheredBlocksOnTwoThreeOrFourThreads_sameBytesAsOneThreadAfterEveryRecordAndEqualTwoPass() {
        Random rnd = new Random(SEED);
        int[][] shapes = {{96, 256}, {101, 256}, {200, 64}, {256, 32}};
        for (int[] shape : shapes) {
            int d = shape[0];
            int blockSize = shape[1];
            int n = 5 * blockSize + 37;
            RandomRows data = RandomRows.of(rnd, n, d);
            for (double halfLife : new double[] {Double.POSITIVE_INFINITY, 1_500.0}) {
                MomentStream serial = stream(d, blockSize, halfLife, 1);
                MomentStream[] gathered = {stream(d, blockSize, halfLife, 2), stream(d, blockSize, halfLife, 3),
                        stream(d, blockSize, halfLife, 4)};
                for (int threads = 2; threads <= 4; threads++) {
                    assertEquals(Math.min(threads, Moments.MAX_GROUP), Moments.threadsUsed(d, blockSize, threads),
                            "d=" + d + " block=" + blockSize + " must gather blocks on " + threads + " threads");
                }
                for (int r = 0; r < n; r++) {
                    serial.add(data.rows[r], data.weights[r], data.times[r]);
                    for (MomentStream g : gathered) {
                        g.add(data.rows[r], data.weights[r], data.times[r]);
                    }
                    if (r % 97 == 0 || r % blockSize == blockSize - 1 || r == n - 1) {
                        String where = "d=" + d + " block=" + blockSize + " halfLife=" + halfLife + " after row " + r;
                        for (MomentStream g : gathered) {
                            assertEquals(serial.pendingRows(), g.pendingRows(), where);
                            assertEquals(serial.count(), g.count(), where);
                            assertEquals(serial.fingerprint(), g.fingerprint(), where);
                        }
                    }
                }
                byte[] expected = serial.toBytes();
                for (MomentStream g : gathered) {
                    assertArrayEquals(expected, g.toBytes(), "d=" + d + " halfLife=" + halfLife);
                }
                if (halfLife == Double.POSITIVE_INFINITY) {
                    data.twoPass().assertMatches(gathered[0].snapshot());
                }
            }
        }
    }

    @Test
    void toBytesAndCopy_whileBlocksWait_streamGoesOnAsIfNothingHappened() {
        Random rnd = new Random(SEED + 1);
        int d = 150;
        int blockSize = 128;
        assertEquals(2, Moments.threadsUsed(d, blockSize, 2), "the shape must gather blocks");
        RandomRows data = RandomRows.of(rnd, 6 * blockSize, d);
        MomentStream serial = stream(d, blockSize, 900.0, 1);
        MomentStream gathered = stream(d, blockSize, 900.0, 2);
        MomentStream copy = null;
        for (int r = 0; r < data.size(); r++) {
            serial.add(data.rows[r], data.weights[r], data.times[r]);
            gathered.add(data.rows[r], data.weights[r], data.times[r]);
            if (copy != null) {
                copy.add(data.rows[r], data.weights[r], data.times[r]);
            }
            if (r == blockSize + 5) {
                assertArrayEquals(serial.toBytes(), gathered.toBytes(), "bytes while a block waits");
                copy = gathered.copy();
            }
        }
        assertArrayEquals(serial.toBytes(), gathered.toBytes());
        assertArrayEquals(serial.toBytes(), copy.toBytes());
        MomentStream read = MomentStream.fromBytes(gathered.toBytes());
        read.setThreads(2);
        assertEquals(serial.fingerprint(), read.fingerprint());
    }

    @Test
    void add_overflowInTheSecondBlockOfAGroup_reportedByTheRecordThatCompletesItAsOnOneThread() {
        Random rnd = new Random(SEED + 2);
        int d = 100;
        int blockSize = 256;
        assertEquals(2, Moments.threadsUsed(d, blockSize, 2), "the shape must gather blocks");
        RandomRows data = RandomRows.of(rnd, 2 * blockSize, d);
        double[] huge = data.rows[blockSize + 10].clone();
        huge[3] = 1e200;
        double[] hugeNegative = data.rows[blockSize + 11].clone();
        hugeNegative[3] = -1e200;
        MomentStream serial = stream(d, blockSize, Double.POSITIVE_INFINITY, 1);
        MomentStream gathered = stream(d, blockSize, Double.POSITIVE_INFINITY, 2);
        for (MomentStream s : new MomentStream[] {serial, gathered}) {
            for (int r = 0; r < 2 * blockSize - 1; r++) {
                double[] z = r == blockSize + 10 ? huge : r == blockSize + 11 ? hugeNegative : data.rows[r];
                s.add(z, 1.0, data.times[r]);
            }
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> s.add(data.rows[2 * blockSize - 1], 1.0, data.times[2 * blockSize - 1]));
            assertTrue(e.getMessage().contains("overflows"), e.getMessage());
            assertEquals(2 * blockSize - 1, s.count());
            assertEquals(blockSize - 1, s.pendingRows());
        }
        assertArrayEquals(serial.toBytes(), gathered.toBytes(), "the earlier block merged, the failing one raw");
    }

    @Test
    void add_largeValueWhileABlockWouldWait_blockMergesAtOnce() {
        Random rnd = new Random(SEED + 3);
        int d = 150;
        int blockSize = 128;
        assertEquals(2, Moments.threadsUsed(d, blockSize, 2), "the shape must gather blocks");
        RandomRows data = RandomRows.of(rnd, 2 * blockSize, d);
        double[] large = data.rows[5].clone();
        large[0] = 1e70;
        MomentStream gathered = stream(d, blockSize, Double.POSITIVE_INFINITY, 2);
        MomentStream serial = stream(d, blockSize, Double.POSITIVE_INFINITY, 1);
        for (MomentStream s : new MomentStream[] {serial, gathered}) {
            for (int r = 0; r < blockSize; r++) {
                s.add(r == 5 ? large : data.rows[r], 1.0, data.times[r]);
            }
        }
        assertEquals(0, gathered.pendingRows());
        assertArrayEquals(serial.toBytes(), gathered.toBytes());
        assertEquals(1e70 / blockSize, gathered.snapshot().mean(0), 1e70 / blockSize * 1e-12);
    }

    @Test
    void threadsUsed_narrowOrSmallBlocksOrOneThread_isOne() {
        assertEquals(1, Moments.threadsUsed(Moments.GROUP_MIN_WIDTH - 1, 100_000, 2));
        assertEquals(1, Moments.threadsUsed(51, 256, 2), "measured slower gathered at width 51");
        assertEquals(1, Moments.threadsUsed(101, 256, 1));
        assertEquals(1, Moments.threadsUsed(101, 4, 2), "4-row blocks are not worth a thread");
        assertEquals(2, Moments.threadsUsed(Moments.SERIAL_MAX_WIDTH + 1, 256, 2), "wide blocks split their rows");
        assertThrows(IllegalArgumentException.class, () -> Moments.threadsUsed(101, 0, 2));
        int[] widths = {96, 101, Moments.SERIAL_MAX_WIDTH};
        assertEquals("[2, 2, 2]", Arrays.toString(Arrays.stream(widths)
                .map(w -> Moments.threadsUsed(w, 256, 2)).toArray()));
    }

    private static MomentStream stream(int d, int blockSize, double halfLife, int threads) {
        MomentStream s = new MomentStream(d, blockSize, halfLife);
        s.setThreads(threads);
        return s;
    }
}
