package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.lang.management.ManagementFactory;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The hot paths allocate nothing once their workspaces are sized: per-thread allocation counters of the
 * HotSpot management interface (com.sun.management.ThreadMXBean) must stay near zero over many updates.
 */
class AllocationTest {

    /** Bytes the measurement itself may allocate (counter reads, boxing inside the management bean). */
    private static final long ALLOWANCE_BYTES = 16 * 1024;
    private static final int RECORDS = 20_000;

    @Test
    void updates_afterWarmUp_allocateNoPerRecordMemory() {
        int d = 8;
        RandomRows data = RandomRows.of(new Random(61L), 512, d);
        Moments moments = new Moments(d);
        MomentStream stream = new MomentStream(d, 64, 1000.0);
        PaneWindow window = new PaneWindow(d, 50L, 8);
        double[] block = data.flat(0, 64);
        double[] blockWeights = data.weights(0, 64);
        long[] blockTimes = data.times(0, 64);
        for (int r = 0; r < 512; r++) {
            update(data, r, moments, stream, window);
        }
        moments.addBlock(block, blockWeights, blockTimes, 64);

        com.sun.management.ThreadMXBean bean = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        long thread = Thread.currentThread().getId();
        long before = bean.getThreadAllocatedBytes(thread);
        for (int i = 0; i < RECORDS; i++) {
            update(data, i % 512, moments, stream, window);
            if (i % 64 == 0) {
                moments.addBlock(block, blockWeights, blockTimes, 64);
            }
        }
        long allocated = bean.getThreadAllocatedBytes(thread) - before;
        assertTrue(allocated < ALLOWANCE_BYTES, "allocated " + allocated + " bytes over " + RECORDS + " records");
    }

    private static void update(RandomRows data, int r, Moments moments, MomentStream stream, PaneWindow window) {
        moments.add(data.rows[r], data.weights[r], data.times[r]);
        stream.add(data.rows[r], data.weights[r], data.times[r]);
        window.add(data.rows[r], data.weights[r], data.times[r]);
    }
}
